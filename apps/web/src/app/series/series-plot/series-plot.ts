import {
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  computed,
  effect,
  input,
  viewChild,
} from '@angular/core';
import type { SeriesFit, SeriesModel, SeriesPoint } from '@gapwise/contracts';
import { area, line } from 'd3';
import { formatFixed } from '../../units/number-format';
import { PlotExport } from '../../plots/plot-export/plot-export';
import { drawFrame } from '../../plots/plot-frame';

const W = 720;
const H = 400;
const MARGIN = { top: 16, right: 24, bottom: 48, left: 62 };

export const MODEL_NAMES: Record<SeriesModel, string> = {
  marcus: 'classical Marcus',
  mlj: 'Marcus–Levich–Jortner (fixed mode)',
};

const STYLE: Record<SeriesModel, { colour: string; dash: string | null; band: string }> = {
  marcus: { colour: '#006a6a', dash: null, band: 'rgba(0,106,106,0.16)' },
  mlj: { colour: '#9a6400', dash: '7 4', band: 'rgba(224,160,32,0.18)' },
};

/** Domains covering the points (with error bars) and the fitted curves. */
export function seriesDomains(
  points: readonly SeriesPoint[],
  fit: SeriesFit | null,
): { x: [number, number]; y: [number, number] } {
  const xs = points.map((p) => -p.deltaG0);
  const ys = points.flatMap((p) => [
    p.log10k - (p.sigmaLog10k ?? 0),
    p.log10k + (p.sigmaLog10k ?? 0),
  ]);
  for (const f of Object.values(fit?.fits ?? {})) {
    if (!f) continue;
    xs.push(...f.band.deltaG0.map((d) => -d));
    const ymin = Math.min(...points.map((p) => p.log10k)) - 3;
    ys.push(...f.band.log10k.filter((v) => Number.isFinite(v) && v > ymin));
  }
  if (!xs.length) return { x: [0, 1.5], y: [0, 12] };
  const pad = (lo: number, hi: number, min: number): [number, number] => {
    const span = Math.max(hi - lo, min);
    return [lo - span * 0.05, hi + span * 0.05];
  };
  return {
    x: pad(Math.min(...xs), Math.max(...xs), 0.3),
    y: pad(Math.min(...ys), Math.max(...ys), 1),
  };
}

/**
 * A measured driving-force series: points with ±σ error bars, the fitted classical Marcus and
 * MLJ curves, the 95 % band of the chosen model, and the inverted region (−ΔG° > λ) shaded.
 */
@Component({
  selector: 'gw-series-plot',
  imports: [PlotExport],
  template: `
    <figure class="plot">
      <figcaption>
        <span class="title">Measured rates and fitted curves</span>
        <span class="spacer"></span>
        <gw-plot-export [svg]="svgEl()" [filename]="filename()" what="the series plot" />
      </figcaption>
      <svg #svg width="100%" preserveAspectRatio="xMidYMid meet"></svg>
      <p class="legend">
        <span class="key">● measured (bars: ±σ of log₁₀ k)</span>
        @if (fit()?.fits?.marcus) {
          <span class="key marcus">━━ {{ names.marcus }}</span>
        }
        @if (fit()?.fits?.mlj) {
          <span class="key mlj">- - - {{ names.mlj }}</span>
        }
        @if (fit(); as f) {
          <span class="key">band: 95 % confidence, {{ names[f.model] }}</span>
          <span class="key">shaded: inverted region (−ΔG° &gt; λ)</span>
        }
      </p>
    </figure>
  `,
  styleUrl: '../../plots/plot.scss',
  styles: '.marcus { color: #006a6a; } .mlj { color: #9a6400; }',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SeriesPlot {
  readonly points = input.required<readonly SeriesPoint[]>();
  readonly fit = input<SeriesFit | null>(null);
  readonly filename = input('gapwise-series');

  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  protected readonly svgEl = computed(() => this.svgRef().nativeElement);
  protected readonly names = MODEL_NAMES;

  constructor() {
    effect(() => this.draw(this.svgRef().nativeElement, this.points(), this.fit()));
  }

  private draw(svgEl: SVGSVGElement, points: readonly SeriesPoint[], fit: SeriesFit | null): void {
    const d = seriesDomains(points, fit);
    const f = drawFrame(svgEl, 'series', {
      width: W,
      height: H,
      margin: MARGIN,
      xDomain: d.x,
      yDomain: d.y,
      xLabel: 'Driving force −ΔG° / eV',
      yLabel: 'log₁₀(k / s⁻¹)',
      title: `Series of ${points.length} measured rates against driving force${fit ? ' with fitted curves' : ''}`,
    });
    const { plot, overlay, x, y } = f;
    const main = fit?.fits[fit.model];
    if (main) {
      const x0 = Math.max(0, Math.min(f.innerWidth, x(main.lambda)));
      plot
        .append('rect')
        .attr('class', 'inverted')
        .attr('x', x0)
        .attr('width', Math.max(0, f.innerWidth - x0))
        .attr('height', f.innerHeight)
        .attr('fill', 'rgba(224,160,32,0.10)');
      plot
        .append('line')
        .attr('x1', x0)
        .attr('x2', x0)
        .attr('y2', f.innerHeight)
        .attr('stroke', '#9a6400')
        .attr('stroke-dasharray', '2 3');
      overlay
        .append('text')
        .attr('x', Math.min(x0 + 6, f.innerWidth - 110))
        .attr('y', 14)
        .attr('fill', '#7a4f00')
        .attr('font-weight', 600)
        .text(`inverted (λ = ${formatFixed(main.lambda, 2)} eV)`);
      const b = main.band;
      const idx = b.deltaG0
        .map((_, i) => i)
        .filter((i) => Number.isFinite(b.lower[i]) && Number.isFinite(b.upper[i]));
      plot
        .append('path')
        .attr('class', 'band')
        .attr(
          'd',
          area<number>()
            .x((i) => x(-b.deltaG0[i]))
            .y0((i) => y(b.lower[i]))
            .y1((i) => y(b.upper[i]))(idx),
        )
        .attr('fill', STYLE[fit!.model].band);
    }
    for (const model of ['marcus', 'mlj'] as const) {
      const m = fit?.fits[model];
      if (!m) continue;
      const idx = m.band.deltaG0.map((_, i) => i).filter((i) => Number.isFinite(m.band.log10k[i]));
      plot
        .append('path')
        .attr('class', `curve ${model}`)
        .attr(
          'd',
          line<number>()
            .x((i) => x(-m.band.deltaG0[i]))
            .y((i) => y(m.band.log10k[i]))(idx),
        )
        .attr('fill', 'none')
        .attr('stroke', STYLE[model].colour)
        .attr('stroke-width', 2.2)
        .attr('stroke-dasharray', STYLE[model].dash);
    }
    const g = plot.append('g').attr('class', 'points');
    for (const p of points) {
      const px = x(-p.deltaG0);
      const s = p.sigmaLog10k ?? 0;
      const point = g.append('g').attr('class', 'point');
      if (s > 0) {
        point
          .append('line')
          .attr('class', 'error-bar')
          .attr('x1', px)
          .attr('x2', px)
          .attr('y1', y(p.log10k - s))
          .attr('y2', y(p.log10k + s))
          .attr('stroke', '#1f2b2b')
          .attr('stroke-width', 1.2);
        for (const end of [p.log10k - s, p.log10k + s]) {
          point
            .append('line')
            .attr('x1', px - 4)
            .attr('x2', px + 4)
            .attr('y1', y(end))
            .attr('y2', y(end))
            .attr('stroke', '#1f2b2b')
            .attr('stroke-width', 1.2);
        }
      }
      point
        .append('circle')
        .attr('cx', px)
        .attr('cy', y(p.log10k))
        .attr('r', 4.5)
        .attr('fill', '#1f2b2b')
        .attr('stroke', '#ffffff')
        .attr('stroke-width', 1)
        .append('title')
        .text(
          `${p.label || 'point'}: −ΔG° = ${formatFixed(-p.deltaG0, 3)} eV, log₁₀ k = ${formatFixed(p.log10k, 2)}${s ? ` ± ${formatFixed(s, 2)}` : ''}`,
        );
    }
  }
}
