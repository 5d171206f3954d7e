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
import { LabelSpace, parabolaGeometry, type Box, type ParabolaGeometry } from '@gapwise/plots';
import { textRuns } from '@gapwise/contracts';
import { line } from 'd3';
import { formatSignificant } from '../../units/number-format';
import { PlotExport } from '../plot-export/plot-export';
import { attachHover, drawFrame } from '../plot-frame';
import { SUB_SCALE, setSvgRichText, svgRichTextWidth } from '../svg-rich-text';

const W = 600;
const H = 380;
const MARGIN = { top: 16, right: 24, bottom: 48, left: 62 };
const CURVES = ['reactant', 'product'] as const;
/** Clearance kept between a label and a curve, and an arrow, in plot units. */
const CURVE_MARGIN = 4;
const ARROW_MARGIN = 3;
/** An arrow label's box: 12-unit text with a subscript below the baseline. */
const LABEL_HEIGHT = 17;
const LABEL_BASELINE = 12;

/**
 * Reactant and product free-energy parabolas along the energy gap ΔE, crossing at ΔE = 0,
 * with ΔG°, λ and ΔG‡ as labelled arrows; optionally the adiabatic surfaces and their 2|H_AB| gap.
 * Labels carry true subscripts (SVG tspans) and keep clear of every curve and arrow.
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

    // Room for labels: every curve drawn, the arrows and the crossing mark are obstacles, so
    // no label is written over a line (see LabelSpace in @gapwise/plots).
    const space = new LabelSpace({ x: 0, y: 0, width: f.innerWidth, height: f.innerHeight });
    const keys = adiabatic ? (['reactant', 'product', 'lower', 'upper'] as const) : CURVES;
    for (const key of keys) {
      space.addPolyline(
        g.points.map((p) => ({ x: x(p.gap), y: y(p[key]) })),
        CURVE_MARGIN,
      );
    }

    // Arrows: ΔG°, λ, ΔG‡, and the 2|H_AB| splitting (nudged right of ΔE = 0, only with the
    // adiabatic surfaces). All are drawn before any label so that no label covers one.
    const nudge = (g.gapDomain[1] - g.gapDomain[0]) * 0.035;
    const shown = g.arrows
      .filter((a) => a.id !== 'splitting' || adiabatic)
      .map((a) => ({ ...a, px: x(a.id === 'splitting' ? a.gap + nudge : a.gap) }));
    for (const a of shown) {
      const accent = a.id === 'splitting';
      if (Math.abs(y(a.from) - y(a.to)) >= 2) {
        overlay
          .append('line')
          .attr('class', `arrow ${a.id}`)
          .attr('x1', a.px)
          .attr('x2', a.px)
          .attr('y1', y(a.from))
          .attr('y2', y(a.to))
          .attr('stroke', accent ? '#9a6400' : '#1f2b2b')
          .attr('stroke-width', 1.4)
          .attr('marker-end', `url(#parabola-${accent ? 'arrow-accent' : 'arrow'})`);
      }
      space.addPolyline(
        [
          { x: a.px, y: y(a.from) },
          { x: a.px, y: y(a.to) },
        ],
        ARROW_MARGIN,
      );
    }
    overlay
      .append('circle')
      .attr('cx', x(0))
      .attr('cy', y(g.crossing.energy))
      .attr('r', 3.5)
      .attr('fill', '#1f2b2b');
    space.addBox({ x: x(0) - 4, y: y(g.crossing.energy) - 4, width: 8, height: 8 }, 2);

    // Curve labels (colour is never the only carrier): at the curve's upper end, or the nearest
    // free spot when another curve runs there (the upper adiabatic surface, for a large |H_AB|).
    const labelAt = (gap: number, energy: number, text: string, colour: string, end: boolean) => {
      const label = overlay
        .append('text')
        .attr('class', 'curve-label')
        .attr('fill', colour)
        .attr('font-weight', 600)
        .text(text);
      const width = textWidth(text);
      const at = { x: x(gap), y: Math.max(12, y(energy)) };
      const preferred = {
        x: end ? at.x - 6 - width : at.x + 6,
        y: at.y - LABEL_BASELINE,
        width,
        height: LABEL_HEIGHT,
      };
      const placed = space.place(at, width, LABEL_HEIGHT, {
        preferred: [preferred],
        leaderFrom: Infinity,
      });
      setInBox(label.node()!, placed?.box ?? preferred, at.x);
    };
    const top = g.energyDomain[1];
    const rEdge = g.points.find((p) => p.reactant <= top * 0.92)!;
    const pEdge = [...g.points].reverse().find((p) => p.product <= top * 0.92)!;
    labelAt(rEdge.gap, rEdge.reactant, 'reactant (D–A) ——', '#2f6fb3', false);
    labelAt(pEdge.gap, pEdge.product, '— · product (D⁺–A⁻)', '#c0581b', true);

    // Arrow labels beside the arrow's middle when that is free of lines (ΔG° and λ usually);
    // otherwise at the nearest free spot with a thin leader line to the arrow (ΔG‡ and
    // 2|H_AB| meet the curves at the crossing, and their arrows may be only pixels long).
    for (const a of shown) {
      const accent = a.id === 'splitting';
      const value = `${a.label} = ${fmt(a.to - a.from)} eV`;
      const label = overlay
        .append('text')
        .attr('class', `arrow-label ${a.id}`)
        .attr('font-size', 12)
        .attr('font-weight', 600)
        .attr('fill', accent ? '#7a4f00' : '#1f2b2b');
      setSvgRichText(label.node()!, value);
      const width = textWidth(value);
      const arrow = [
        { x: a.px, y: y(a.from) },
        { x: a.px, y: y(a.to) },
      ] as const;
      const middle = (arrow[0].y + arrow[1].y) / 2;
      const right = { x: a.px + 6, y: middle - LABEL_HEIGHT / 2, width, height: LABEL_HEIGHT };
      const left = { ...right, x: a.px - 6 - width };
      const placed = space.place(arrow, width, LABEL_HEIGHT, {
        preferred: a.id === 'activation' ? [left, right] : [right, left],
      });
      setInBox(label.node()!, placed?.box ?? (a.id === 'activation' ? left : right), a.px);
      if (placed?.leader) {
        const [from, to] = placed.leader;
        overlay
          .insert('line', '.arrow-label')
          .attr('class', `leader ${a.id}`)
          .attr('x1', from.x)
          .attr('y1', from.y)
          .attr('x2', to.x)
          .attr('y2', to.y)
          .attr('stroke', accent ? '#9a6400' : '#5d6b6b')
          .attr('stroke-width', 0.9);
      }
    }

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

/** Writes a label into its box, flush with the side facing what it names (`towardX`). */
function setInBox(el: SVGTextElement, box: Box, towardX: number): void {
  const end = towardX >= box.x + box.width / 2;
  el.setAttribute('x', String(end ? box.x + box.width : box.x));
  el.setAttribute('y', String(box.y + LABEL_BASELINE));
  el.setAttribute('text-anchor', end ? 'end' : 'start');
}

/**
 * The room a 12-unit semibold label needs: its width in Inter plus 12 % for the wider fallback
 * font an exported SVG or PNG may be shown in (an SVG image cannot reach the page's Inter); where
 * nothing can be measured (unit tests), an estimate from its characters, subscripts smaller.
 */
function textWidth(text: string): number {
  const measured = svgRichTextWidth(text, 12, 600);
  if (measured !== null && measured > 0) return Math.ceil(measured * 1.12) + 1;
  const chars = textRuns(text).reduce((n, r) => n + r.text.length * (r.sub ? SUB_SCALE : 1), 0);
  return Math.ceil(chars * 7.2);
}

function fmt(v: number): string {
  return formatSignificant(v, 3);
}

function nearest<T extends { gap: number }>(points: readonly T[], gap: number): T {
  let best = points[0];
  for (const p of points) if (Math.abs(p.gap - gap) < Math.abs(best.gap - gap)) best = p;
  return best;
}
