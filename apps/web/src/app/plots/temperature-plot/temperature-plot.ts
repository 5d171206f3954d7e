import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  computed,
  effect,
  input,
  output,
  viewChild,
} from '@angular/core';
import { KCAL_PER_MOL_PER_EV, KJ_PER_MOL_PER_EV, type CalcRequest } from '@gapwise/calc';
import { temperatureCurve, type TemperatureGeometry } from '@gapwise/plots';
import { line } from 'd3';
import { formatFixed, formatSignificant } from '../../units/number-format';
import { PlotExport } from '../plot-export/plot-export';
import { attachHover, drawFrame } from '../plot-frame';

const W = 600;
const H = 340;
const MARGIN = { top: 16, right: 24, bottom: 48, left: 62 };

/** Arrhenius plot of the pair's rate model, with the apparent activation energy at its T. */
@Component({
  selector: 'gw-temperature-plot',
  imports: [PlotExport],
  template: `
    <figure class="plot">
      <figcaption>
        <span class="title">Rate against temperature (Arrhenius form)</span>
        <span class="spacer"></span>
        <gw-plot-export [svg]="svgEl()" [filename]="filename()" what="the Arrhenius plot" />
      </figcaption>
      <svg #svg width="100%" preserveAspectRatio="xMidYMid meet"></svg>
      @if (geometry(); as g) {
        <p class="legend">
          <span class="key marcus">━━ log₁₀ k of the chosen model</span>
          <span class="key">◆ this pair at {{ temperatureText() }}</span>
          @if (eaText(); as ea) {
            <span class="key"
              ><strong>Apparent E<sub>a</sub> = {{ ea }}</strong></span
            >
          }
        </p>
        <p class="note">
          E<sub>a</sub> = −k<sub>B</sub> d ln k / d(1/T) at the pair's temperature; with λ and ΔG°
          held fixed the classical value is ΔG‡ − k<sub>B</sub>T/2.
        </p>
      } @else {
        <p class="empty">A rate is needed to draw its temperature dependence.</p>
      }
    </figure>
  `,
  styleUrl: '../plot.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class TemperaturePlot {
  readonly request = input.required<CalcRequest | null>();
  readonly temperature = input.required<number | null>();
  readonly filename = input('gapwise-rate-vs-temperature');
  readonly redrawn = output<void>();

  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  protected readonly svgEl = computed(() => this.svgRef().nativeElement);
  protected readonly geometry = computed(() => {
    const r = this.request();
    const t = this.temperature();
    if (!r || !t || !(t > 0)) return null;
    const g = temperatureCurve(r, t);
    return g.points.some((p) => p.log10k !== null) ? g : null;
  });
  protected readonly temperatureText = computed(
    () => `${formatSignificant(this.temperature(), 5)} K`,
  );
  protected readonly eaText = computed(() => {
    const ea = this.geometry()?.apparentEa;
    if (ea === null || ea === undefined) return null;
    return `${formatSignificant(ea, 3)} eV = ${formatSignificant(ea * KJ_PER_MOL_PER_EV, 3)} kJ/mol = ${formatSignificant(ea * KCAL_PER_MOL_PER_EV, 3)} kcal/mol`;
  });

  constructor() {
    effect(() => {
      const g = this.geometry();
      const svg = this.svgRef().nativeElement;
      if (g) this.draw(svg, g);
      else svg.replaceChildren();
      this.redrawn.emit();
    });
  }

  private draw(svgEl: SVGSVGElement, g: TemperatureGeometry): void {
    const f = drawFrame(svgEl, 'arrhenius', {
      width: W,
      height: H,
      margin: MARGIN,
      xDomain: g.inverseTDomain,
      yDomain: g.log10kDomain,
      xLabel: '1000 / T / K⁻¹',
      yLabel: 'log₁₀(k / s⁻¹)',
      title: `Arrhenius plot; apparent activation energy ${this.eaText() ?? 'not available'}`,
    });
    const { plot, overlay, x, y } = f;
    type P = TemperatureGeometry['points'][number];
    plot
      .append('path')
      .attr('class', 'curve arrhenius')
      .attr(
        'd',
        line<P>()
          .defined((p) => p.log10k !== null)
          .x((p) => x(p.inverseT))
          .y((p) => y(p.log10k as number))(g.points as P[]),
      )
      .attr('fill', 'none')
      .attr('stroke', '#006a6a')
      .attr('stroke-width', 2.4);
    if (g.pair) {
      const px = x(g.pair.x);
      const py = y(g.pair.y);
      overlay
        .append('path')
        .attr('d', `M${px},${py - 7}L${px + 7},${py}L${px},${py + 7}L${px - 7},${py}Z`)
        .attr('fill', '#e0a020')
        .attr('stroke', '#1f2b2b')
        .attr('stroke-width', 1.2);
      overlay
        .append('text')
        .attr('x', px + 10)
        .attr('y', py - 10)
        .attr('font-weight', 600)
        .attr('fill', '#1f2b2b')
        .text(`${formatSignificant(this.temperature(), 5)} K`);
    }
    attachHover(f, (xv) => {
      let best = g.points[0];
      for (const p of g.points)
        if (Math.abs(p.inverseT - xv) < Math.abs(best.inverseT - xv)) best = p;
      return {
        x: best.inverseT,
        lines: [
          `T = ${formatSignificant(best.temperature, 4)} K`,
          `log₁₀ k = ${formatFixed(best.log10k, 2)}`,
        ],
      };
    });
  }
}
