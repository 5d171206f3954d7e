import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  computed,
  effect,
  input,
  viewChild,
} from '@angular/core';
import { line } from 'd3';
import { PlotExport } from '../../plots/plot-export/plot-export';
import { drawFrame } from '../../plots/plot-frame';
import { mergedReactant, tiltedReactant, type GapOutputs } from '../gap-outputs';

/**
 * Diabatic free-energy curves G_R(ΔE) and G_P(ΔE) from the histograms, with G_R(ΔE) + ΔE drawn
 * over G_P: the exact linear free-energy relation says they coincide where both are sampled.
 * The merged G_R (both histograms combined through that relation) is drawn as a solid line.
 */
@Component({
  selector: 'gw-free-energy-plot',
  imports: [PlotExport],
  template: `
    <figure class="plot">
      <figcaption>
        <span class="title"
          >Diabatic free-energy curves and the check G<sub>P</sub> − G<sub>R</sub> = ΔE</span
        >
        <span class="spacer"></span>
        <gw-plot-export
          [svg]="svgEl()"
          filename="gapwise-free-energy-curves"
          what="the free-energy curves"
        />
      </figcaption>
      <svg #svg class="free-energy-svg" width="100%" preserveAspectRatio="xMidYMid meet"></svg>
      <p class="legend">
        <span class="key reactant">● G<sub>R</sub>(ΔE) = −k<sub>B</sub>T ln P<sub>R</sub></span>
        <span class="key product">■ G<sub>P</sub>(ΔE), from the product-state samples</span>
        <span class="key"
          >- - - G<sub>R</sub>(ΔE) + ΔE (the relation; should lie on G<sub>P</sub>)</span
        >
        @if (merged().length > 0) {
          <span class="key merged" style="color: #17705b"
            >── G<sub>R</sub>(ΔE) merged from both states (shift
            {{ outputs().mergedCurve!.shiftEv.toFixed(3) }} eV on
            {{ outputs().mergedCurve!.overlapBins }} shared bins)</span
          >
        }
      </p>
    </figure>
  `,
  styleUrl: '../../plots/plot.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class FreeEnergyPlot {
  readonly outputs = input.required<GapOutputs>();
  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  protected readonly svgEl = computed(() => this.svgRef().nativeElement);
  protected readonly merged = computed(() => mergedReactant(this.outputs().mergedCurve));

  constructor() {
    effect(() => this.draw(this.svgRef().nativeElement, this.outputs()));
  }

  private draw(svgEl: SVGSVGElement, o: GapOutputs): void {
    const c = o.freeEnergyCurves;
    const points = (key: 'reactant' | 'product') =>
      c.x
        .map((x, i) => ({ x, g: c[key][i] }))
        .filter((p): p is { x: number; g: number } => p.g !== null);
    const r = points('reactant');
    const p = points('product');
    const tilted = tiltedReactant(c);
    const merged = mergedReactant(o.mergedCurve);
    const all = [...r, ...p, ...merged];
    const xs = [...all.map((q) => q.x), 0];
    const gs = all.map((q) => q.g);
    const gMax = Math.min(Math.max(...gs), Math.min(...gs) + 1.5);
    const f = drawFrame(svgEl, 'free-energy', {
      width: 640,
      height: 360,
      margin: { top: 14, right: 20, bottom: 48, left: 62 },
      xDomain: [Math.min(...xs), Math.max(...xs)],
      yDomain: [Math.min(...gs) - 0.03, gMax + 0.03],
      xLabel: 'Energy gap ΔE / eV',
      yLabel: 'Free energy G / eV',
      title: `Free-energy curves: ΔG‡ = ${o.activationFreeEnergy.toFixed(3)} eV at ΔE = 0`,
    });
    f.plot
      .append('line')
      .attr('class', 'crossing')
      .attr('x1', f.x(0))
      .attr('x2', f.x(0))
      .attr('y1', 0)
      .attr('y2', f.innerHeight)
      .attr('stroke', '#9aabab')
      .attr('stroke-dasharray', '4 4');
    f.plot
      .append('path')
      .attr('class', 'relation')
      .attr(
        'd',
        line<{ x: number; g: number }>()
          .x((q) => f.x(q.x))
          .y((q) => f.y(q.g))(tilted),
      )
      .attr('fill', 'none')
      .attr('stroke', '#3a3a3a')
      .attr('stroke-width', 1.4)
      .attr('stroke-dasharray', '5 4');
    if (merged.length > 0) {
      f.plot
        .append('path')
        .attr('class', 'merged')
        .attr(
          'd',
          line<{ x: number; g: number }>()
            .x((q) => f.x(q.x))
            .y((q) => f.y(q.g))(merged),
        )
        .attr('fill', 'none')
        .attr('stroke', '#17705b')
        .attr('stroke-width', 2.2);
    }
    const dots = (
      data: Array<{ x: number; g: number }>,
      cls: string,
      colour: string,
      square: boolean,
    ) => {
      const g = f.plot.append('g').attr('class', `points ${cls}`);
      if (square) {
        g.selectAll('rect')
          .data(data)
          .join('rect')
          .attr('x', (q) => f.x(q.x) - 2.5)
          .attr('y', (q) => f.y(q.g) - 2.5)
          .attr('width', 5)
          .attr('height', 5)
          .attr('fill', colour);
      } else {
        g.selectAll('circle')
          .data(data)
          .join('circle')
          .attr('cx', (q) => f.x(q.x))
          .attr('cy', (q) => f.y(q.g))
          .attr('r', 2.8)
          .attr('fill', colour);
      }
    };
    dots(r, 'reactant', '#2f6fb3', false);
    dots(p, 'product', '#c0581b', true);
    f.overlay
      .append('text')
      .attr('x', f.x(0) + 6)
      .attr('y', 14)
      .attr('fill', '#3c4747')
      // A white halo: the dashed relation curve passes under the label without crossing its text.
      .attr('stroke', '#fff')
      .attr('stroke-width', 4)
      .attr('paint-order', 'stroke')
      .text(`ΔE = 0: ΔG‡ = ${o.activationFreeEnergy.toFixed(3)} eV`);
  }
}
