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
import { binDensities, gaussianOverlay, type GapOutputs } from '../gap-outputs';

const COLOURS = { reactant: '#2f6fb3', product: '#c0581b' } as const;

/** Freedman–Diaconis histograms of ΔE in both states (bin densities) with Gaussian overlays. */
@Component({
  selector: 'gw-gap-histogram-plot',
  imports: [PlotExport],
  template: `
    <figure class="plot">
      <figcaption>
        <span class="title"
          >Distributions of ΔE in each state, with Gaussians of the same mean and variance</span
        >
        <span class="spacer"></span>
        <gw-plot-export [svg]="svgEl()" filename="gapwise-gap-histograms" what="the histograms" />
      </figcaption>
      <svg #svg class="histogram-svg" width="100%" preserveAspectRatio="xMidYMid meet"></svg>
      <p class="legend">
        <span class="key reactant">▮ reactant-state samples</span>
        <span class="key product">▮ product-state samples</span>
        <span class="key">— Gaussian overlays</span>
      </p>
    </figure>
  `,
  styleUrl: '../../plots/plot.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class GapHistogramPlot {
  readonly outputs = input.required<GapOutputs>();
  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  protected readonly svgEl = computed(() => this.svgRef().nativeElement);

  constructor() {
    effect(() => this.draw(this.svgRef().nativeElement, this.outputs()));
  }

  private draw(svgEl: SVGSVGElement, o: GapOutputs): void {
    const states = ['reactant', 'product'] as const;
    const bars = {
      reactant: binDensities(o.histograms.reactant),
      product: binDensities(o.histograms.product),
    };
    const moments = {
      reactant: { mean: o.meanReactant, variance: o.varianceReactant },
      product: { mean: o.meanProduct, variance: o.varianceProduct },
    };
    const low = Math.min(o.histograms.reactant.edges[0], o.histograms.product.edges[0]);
    const high = Math.max(o.histograms.reactant.edges.at(-1)!, o.histograms.product.edges.at(-1)!);
    const overlays = Object.fromEntries(
      states.map((s) => [s, gaussianOverlay(moments[s].mean, moments[s].variance, low, high, 240)]),
    ) as Record<(typeof states)[number], Array<{ x: number; y: number }>>;
    const top = Math.max(
      ...states.flatMap((s) => [...bars[s].map((b) => b.density), ...overlays[s].map((p) => p.y)]),
    );
    const f = drawFrame(svgEl, 'gap-histogram', {
      width: 640,
      height: 340,
      margin: { top: 14, right: 20, bottom: 48, left: 62 },
      xDomain: [low, high],
      yDomain: [0, top * 1.08],
      xLabel: 'Energy gap ΔE / eV',
      yLabel: 'Probability density / eV⁻¹',
      title: `Histograms of ΔE: reactant mean ${o.meanReactant.toFixed(3)} eV, product mean ${o.meanProduct.toFixed(3)} eV`,
    });
    for (const s of states) {
      f.plot
        .append('g')
        .attr('class', `bars ${s}`)
        .selectAll('rect')
        .data(bars[s])
        .join('rect')
        .attr('x', (b) => f.x(b.x0))
        .attr('width', (b) => Math.max(0.5, f.x(b.x1) - f.x(b.x0)))
        .attr('y', (b) => f.y(b.density))
        .attr('height', (b) => f.y(0) - f.y(b.density))
        .attr('fill', COLOURS[s])
        .attr('fill-opacity', 0.35);
      f.plot
        .append('path')
        .attr('class', `gaussian ${s}`)
        .attr(
          'd',
          line<{ x: number; y: number }>()
            .x((p) => f.x(p.x))
            .y((p) => f.y(p.y))(overlays[s]),
        )
        .attr('fill', 'none')
        .attr('stroke', COLOURS[s])
        .attr('stroke-width', 2);
    }
  }
}
