import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  computed,
  effect,
  input,
  output,
  signal,
  viewChild,
} from '@angular/core';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { parabolaGeometry, type ParabolaGeometry } from '@gapwise/plots';
import { line } from 'd3';
import { formatSignificant } from '../../units/number-format';
import { PlotExport } from '../plot-export/plot-export';
import { attachHover, drawFrame } from '../plot-frame';

const W = 600;
const H = 380;
const MARGIN = { top: 16, right: 24, bottom: 48, left: 62 };

/**
 * Reactant and product free-energy parabolas along the energy gap ΔE, crossing at ΔE = 0,
 * with ΔG°, λ and ΔG‡ as labelled arrows; optionally the adiabatic surfaces and their 2|H_AB| gap.
 */
@Component({
  selector: 'gw-parabola-plot',
  imports: [MatSlideToggleModule, PlotExport],
  templateUrl: './parabola-plot.html',
  styleUrl: '../plot.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ParabolaPlot {
  /** eV */
  readonly deltaG0 = input.required<number | null>();
  readonly lambda = input.required<number | null>();
  readonly coupling = input<number | null>(null);
  readonly filename = input('gapwise-parabolas');
  readonly redrawn = output<void>();

  protected readonly showAdiabatic = signal(true);
  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  protected readonly svgEl = computed(() => this.svgRef().nativeElement);

  protected readonly geometry = computed<ParabolaGeometry | null>(() => {
    const dg = this.deltaG0();
    const l = this.lambda();
    if (dg === null || l === null || !(l > 0) || !Number.isFinite(dg)) return null;
    return parabolaGeometry({ deltaG0: dg, lambda: l, coupling: Math.abs(this.coupling() ?? 0) });
  });

  constructor() {
    effect(() => {
      const g = this.geometry();
      const adiabatic = this.showAdiabatic();
      const svg = this.svgRef().nativeElement;
      if (g) {
        const start = performance.now();
        this.draw(svg, g, adiabatic);
        performance.measure('gw-draw-parabolas', { start, end: performance.now() });
      }
      if (!g) svg.replaceChildren();
      this.redrawn.emit();
    });
  }

  private draw(svgEl: SVGSVGElement, g: ParabolaGeometry, adiabatic: boolean): void {
    const f = drawFrame(svgEl, 'parabola', {
      width: W,
      height: H,
      margin: MARGIN,
      xDomain: g.gapDomain,
      yDomain: g.energyDomain,
      xLabel: 'Energy gap ΔE = E(product) − E(reactant) / eV',
      yLabel: 'Free energy G / eV',
      title: `Diabatic free-energy curves: ΔG° = ${fmt(g.productMinimum.energy)} eV, λ = ${fmt(g.reactantMinimum.gap - g.productMinimum.energy)} eV, ΔG‡ = ${fmt(g.crossing.energy)} eV`,
    });
    const { plot, overlay, x, y } = f;
    const path = (key: 'reactant' | 'product' | 'lower' | 'upper') =>
      line<ParabolaGeometry['points'][number]>()
        .x((p) => x(p.gap))
        .y((p) => y(p[key]))
        .defined((p) => p[key] <= g.energyDomain[1] * 1.5 + 1)(
        g.points as ParabolaGeometry['points'][number][],
      );

    // Reference levels: reactant minimum (0) and product minimum (ΔG°).
    for (const level of [0, g.productMinimum.energy]) {
      plot
        .append('line')
        .attr('x1', 0)
        .attr('x2', f.innerWidth)
        .attr('y1', y(level))
        .attr('y2', y(level))
        .attr('stroke', '#8a9a9a')
        .attr('stroke-dasharray', '1 4');
    }
    // ΔE = 0, where the diabats cross.
    plot
      .append('line')
      .attr('x1', x(0))
      .attr('x2', x(0))
      .attr('y1', 0)
      .attr('y2', f.innerHeight)
      .attr('stroke', '#b4c2c2')
      .attr('stroke-dasharray', '4 4');

    plot
      .append('path')
      .attr('class', 'curve reactant')
      .attr('d', path('reactant'))
      .attr('fill', 'none')
      .attr('stroke', '#2f6fb3')
      .attr('stroke-width', 2.5);
    plot
      .append('path')
      .attr('class', 'curve product')
      .attr('d', path('product'))
      .attr('fill', 'none')
      .attr('stroke', '#c0581b')
      .attr('stroke-width', 2.5)
      .attr('stroke-dasharray', '12 3 2 3');
    if (adiabatic) {
      for (const key of ['lower', 'upper'] as const) {
        plot
          .append('path')
          .attr('class', `curve adiabatic ${key}`)
          .attr('d', path(key))
          .attr('fill', 'none')
          .attr('stroke', '#3a3a3a')
          .attr('stroke-width', 1.6)
          .attr('stroke-dasharray', '5 4');
      }
    }

    // Curve labels (colour is never the only carrier).
    const labelAt = (gap: number, energy: number, text: string, colour: string, anchor: string) =>
      overlay
        .append('text')
        .attr('x', x(gap))
        .attr('y', Math.max(12, y(energy)))
        .attr('fill', colour)
        .attr('font-weight', 600)
        .attr('text-anchor', anchor)
        .text(text);
    const top = g.energyDomain[1];
    const rEdge = g.points.find((p) => p.reactant <= top * 0.92)!;
    const pEdge = [...g.points].reverse().find((p) => p.product <= top * 0.92)!;
    labelAt(rEdge.gap, rEdge.reactant, 'reactant (D–A) ——', '#2f6fb3', 'start').attr('dx', 6);
    labelAt(pEdge.gap, pEdge.product, '— · product (D⁺–A⁻)', '#c0581b', 'end').attr('dx', -6);

    // Labelled arrows: ΔG°, λ, ΔG‡, and the 2|H_AB| splitting. Short arrows get their label
    // beside the tip (ΔG‡ above on the left, 2|H_AB| below on the right) so labels never meet.
    const arrow = (
      gap: number,
      from: number,
      to: number,
      label: string,
      side: 'left' | 'right',
      accent = false,
    ) => {
      const length = Math.abs(y(from) - y(to));
      if (length >= 2) {
        overlay
          .append('line')
          .attr('x1', x(gap))
          .attr('x2', x(gap))
          .attr('y1', y(from))
          .attr('y2', y(to))
          .attr('stroke', accent ? '#9a6400' : '#1f2b2b')
          .attr('stroke-width', 1.4)
          .attr('marker-end', `url(#parabola-${accent ? 'arrow-accent' : 'arrow'})`);
      }
      const short = length < 28;
      const top = Math.min(y(from), y(to));
      const bottom = Math.max(y(from), y(to));
      const ly = !short
        ? (top + bottom) / 2 + 4
        : side === 'left' && !accent
          ? top - 8
          : bottom + 14;
      overlay
        .append('text')
        .attr('class', 'arrow-label')
        .attr('x', x(gap) + (side === 'left' ? -6 : 6))
        .attr('y', ly)
        .attr('text-anchor', side === 'left' ? 'end' : 'start')
        .attr('font-size', 12)
        .attr('font-weight', 600)
        .attr('fill', accent ? '#7a4f00' : '#1f2b2b')
        .text(label);
    };
    const nudge = (g.gapDomain[1] - g.gapDomain[0]) * 0.035;
    for (const a of g.arrows) {
      const value = `${a.label} = ${fmt(a.to - a.from)} eV`;
      if (a.id === 'splitting') {
        if (adiabatic) {
          // Near the right edge the label goes left, below the lower tip (ΔG‡ sits above).
          const roomRight = x(a.gap + nudge) + 130 < f.innerWidth;
          arrow(a.gap + nudge, a.from, a.to, value, roomRight ? 'right' : 'left', true);
        }
      } else if (a.id === 'activation') {
        arrow(a.gap, a.from, a.to, value, 'left');
      } else {
        arrow(a.gap, a.from, a.to, value, 'right');
      }
    }
    overlay
      .append('circle')
      .attr('cx', x(0))
      .attr('cy', y(g.crossing.energy))
      .attr('r', 3.5)
      .attr('fill', '#1f2b2b');

    attachHover(f, (gapValue) => {
      const p = nearest(g.points, gapValue);
      const lines = [
        `ΔE = ${fmt(p.gap)} eV`,
        `G(reactant) = ${fmt(p.reactant)} eV`,
        `G(product) = ${fmt(p.product)} eV`,
      ];
      if (adiabatic) lines.push(`lower = ${fmt(p.lower)} eV`, `upper = ${fmt(p.upper)} eV`);
      return { x: p.gap, lines };
    });
  }
}

function fmt(v: number): string {
  return formatSignificant(v, 3);
}

function nearest<T extends { gap: number }>(points: readonly T[], gap: number): T {
  let best = points[0];
  for (const p of points) if (Math.abs(p.gap - gap) < Math.abs(best.gap - gap)) best = p;
  return best;
}
