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
import {
  drivingForceCurves,
  type DrivingForceGeometry,
  type DrivingForceInputs,
} from '@gapwise/plots';
import { line } from 'd3';
import { formatFixed, formatSignificant } from '../../units/number-format';
import { PlotExport } from '../plot-export/plot-export';
import { attachHover, drawFrame } from '../plot-frame';

const W = 600;
const H = 360;
const MARGIN = { top: 16, right: 24, bottom: 48, left: 62 };

/** log10 k against −ΔG°: classical Marcus and MLJ, inverted region shaded, the pair marked. */
@Component({
  selector: 'gw-driving-force-plot',
  imports: [PlotExport],
  template: `
    <figure class="plot">
      <figcaption>
        <span class="title">Rate against driving force</span>
        <span class="spacer"></span>
        <gw-plot-export
          [svg]="svgEl()"
          [filename]="filename()"
          what="the rate against driving force"
        />
      </figcaption>
      <svg #svg width="100%" preserveAspectRatio="xMidYMid meet"></svg>
      @if (geometry(); as g) {
        <p class="legend">
          <span class="key marcus">━━ classical Marcus</span>
          @if (g.hasMlj) {
            <span class="key mlj">- - - Marcus–Levich–Jortner</span>
          }
          <span class="key">◆ this pair</span>
          @for (series of measuredSeries(); track series.id) {
            <span class="key measured" [attr.data-series]="series.id"
              >{{ series.symbol }} measured ({{ series.name }})</span
            >
          }
          <span class="key">shaded: inverted region (−ΔG° &gt; λ)</span>
        </p>
        @if (!g.hasMlj) {
          <p class="note">Give ħω and both λᵢ and λₒ to add the Marcus–Levich–Jortner curve.</p>
        }
      } @else {
        <p class="empty">Enter λ, |H<sub>AB</sub>| and the temperature to draw the curve.</p>
      }
    </figure>
  `,
  styleUrl: '../plot.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DrivingForcePlot {
  readonly inputs = input.required<DrivingForceInputs | null>();
  readonly filename = input('gapwise-rate-vs-driving-force');
  /** Name of the pair's own rate model, for the marker's label. */
  readonly model = input('');
  readonly redrawn = output<void>();

  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  protected readonly svgEl = computed(() => this.svgRef().nativeElement);
  protected readonly geometry = computed(() => {
    const i = this.inputs();
    return i ? drivingForceCurves(i) : null;
  });
  /** One legend entry and marker shape per series of the measured points, in order of appearance. */
  protected readonly measuredSeries = computed(() => seriesOf(this.geometry()?.measured ?? []));

  constructor() {
    effect(() => {
      const g = this.geometry();
      const svg = this.svgRef().nativeElement;
      if (g) this.draw(svg, g);
      else svg.replaceChildren();
      this.redrawn.emit();
    });
  }

  private draw(svgEl: SVGSVGElement, g: DrivingForceGeometry): void {
    const f = drawFrame(svgEl, 'driving', {
      width: W,
      height: H,
      margin: MARGIN,
      xDomain: g.domain,
      yDomain: g.log10kDomain,
      xLabel: 'Driving force −ΔG° / eV',
      yLabel: 'log₁₀(k / s⁻¹)',
      title: `log10 k against driving force; inverted region beyond −ΔG° = ${formatSignificant(g.invertedFrom, 3)} eV`,
    });
    const { plot, overlay, x, y } = f;
    const x0 = Math.max(x(g.invertedFrom), 0);
    plot
      .append('rect')
      .attr('class', 'inverted')
      .attr('x', x0)
      .attr('y', 0)
      .attr('width', Math.max(0, f.innerWidth - x0))
      .attr('height', f.innerHeight)
      .attr('fill', 'rgba(224,160,32,0.13)');
    overlay
      .append('text')
      .attr('x', x0 + 6)
      .attr('y', 14)
      .attr('fill', '#7a4f00')
      .attr('font-weight', 600)
      .text('inverted region');
    overlay
      .append('text')
      .attr('x', Math.max(4, x0 - 6))
      .attr('y', 14)
      .attr('fill', '#3c4747')
      .attr('text-anchor', 'end')
      .text('normal region');
    plot
      .append('line')
      .attr('x1', x(g.invertedFrom))
      .attr('x2', x(g.invertedFrom))
      .attr('y1', 0)
      .attr('y2', f.innerHeight)
      .attr('stroke', '#9a6400')
      .attr('stroke-dasharray', '2 3');

    type P = DrivingForceGeometry['points'][number];
    const curve = (key: 'marcus' | 'mlj') =>
      line<P>()
        .defined((p) => p[key] !== null && (p[key] as number) >= g.log10kDomain[0] - 5)
        .x((p) => x(p.minusDeltaG0))
        .y((p) => y(p[key] as number))(g.points as P[]);
    plot
      .append('path')
      .attr('class', 'curve marcus')
      .attr('d', curve('marcus'))
      .attr('fill', 'none')
      .attr('stroke', '#006a6a')
      .attr('stroke-width', 2.4);
    if (g.hasMlj) {
      plot
        .append('path')
        .attr('class', 'curve mlj')
        .attr('d', curve('mlj'))
        .attr('fill', 'none')
        .attr('stroke', '#9a6400')
        .attr('stroke-width', 2)
        .attr('stroke-dasharray', '6 4');
    }
    const shapeOf = new Map(seriesOf(g.measured).map((sr) => [sr.id, sr]));
    for (const m of g.measured) {
      const sr = shapeOf.get(m.seriesId)!;
      const mx = x(m.x);
      const my = y(m.y);
      const group = plot
        .append('g')
        .attr('class', 'measured-point')
        .attr('data-series', sr.id)
        .attr('stroke', sr.colour)
        .attr('stroke-width', 1.4)
        .attr('fill', 'none');
      group
        .append('title')
        .text(
          `measured (${sr.name}): −ΔG° = ${formatSignificant(m.x, 3)} eV, log₁₀ k = ${formatFixed(m.y, 2)}` +
            (m.sigma !== null ? ` ± ${formatFixed(m.sigma, 2)}` : ''),
        );
      if (m.sigma !== null) {
        const top = y(m.y + m.sigma);
        const bottom = y(m.y - m.sigma);
        group
          .append('path')
          .attr('class', 'error-bar')
          .attr(
            'd',
            `M${mx},${top}V${bottom}M${mx - 3},${top}H${mx + 3}M${mx - 3},${bottom}H${mx + 3}`,
          );
      }
      group
        .append('path')
        .attr('class', `marker ${sr.shape}`)
        .attr('d', markerPath(sr.shape, mx, my));
    }
    if (g.pair) {
      const px = x(g.pair.x);
      const py = y(g.pair.y);
      overlay
        .append('path')
        .attr('class', 'pair-mark')
        .attr('d', `M${px},${py - 7}L${px + 7},${py}L${px},${py + 7}L${px - 7},${py}Z`)
        .attr('fill', '#e0a020')
        .attr('stroke', '#1f2b2b')
        .attr('stroke-width', 1.2);
      overlay
        .append('text')
        .attr('x', px + 10)
        .attr('y', py - 8)
        .attr('font-weight', 600)
        .attr('fill', '#1f2b2b')
        .text(`this pair${this.model() ? ` (${this.model()})` : ''}: ${formatFixed(g.pair.y, 2)}`);
    }
    attachHover(f, (xv) => {
      let best = g.points[0];
      for (const p of g.points)
        if (Math.abs(p.minusDeltaG0 - xv) < Math.abs(best.minusDeltaG0 - xv)) best = p;
      const lines = [
        `−ΔG° = ${formatSignificant(best.minusDeltaG0, 3)} eV`,
        `Marcus: log₁₀ k = ${formatFixed(best.marcus, 2)}`,
      ];
      if (g.hasMlj) lines.push(`MLJ: log₁₀ k = ${formatFixed(best.mlj, 2)}`);
      return { x: best.minusDeltaG0, lines };
    });
  }
}

type MarkerShape = 'circle' | 'square' | 'triangle' | 'cross';
const SHAPES: ReadonlyArray<{ shape: MarkerShape; symbol: string; colour: string }> = [
  { shape: 'circle', symbol: '○', colour: '#1f2b2b' },
  { shape: 'square', symbol: '□', colour: '#5b3f9e' },
  { shape: 'triangle', symbol: '△', colour: '#a33a2f' },
  { shape: 'cross', symbol: '✕', colour: '#2f5fa3' },
];

/** The series of the measured points, each with its own marker shape (and colour). */
function seriesOf(measured: DrivingForceGeometry['measured']): Array<{
  id: string;
  name: string;
  shape: MarkerShape;
  symbol: string;
  colour: string;
}> {
  const out = new Map<string, { id: string; name: string }>();
  for (const m of measured) {
    if (!out.has(m.seriesId))
      out.set(m.seriesId, { id: m.seriesId, name: m.seriesName || 'series' });
  }
  return [...out.values()].map((sr, i) => ({ ...sr, ...SHAPES[i % SHAPES.length] }));
}

/** An open marker of radius about 4.5 px centred at (x, y). */
function markerPath(shape: MarkerShape, x: number, y: number): string {
  const r = 4.5;
  switch (shape) {
    case 'square':
      return `M${x - r},${y - r}H${x + r}V${y + r}H${x - r}Z`;
    case 'triangle':
      return `M${x},${y - r - 1}L${x + r + 0.5},${y + r - 1}H${x - r - 0.5}Z`;
    case 'cross':
      return `M${x - r},${y - r}L${x + r},${y + r}M${x - r},${y + r}L${x + r},${y - r}`;
    default:
      return `M${x - r},${y}A${r},${r} 0 1,0 ${x + r},${y}A${r},${r} 0 1,0 ${x - r},${y}Z`;
  }
}
