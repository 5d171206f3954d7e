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
import type { ScreenResultRow } from '@gapwise/contracts';
import {
  brush as d3brush,
  extent,
  interpolateHcl,
  quantileSorted,
  quadtree,
  scaleSequential,
  symbol,
  symbolCircle,
  symbolDiamond,
  symbolTriangle,
  type Quadtree,
} from 'd3';
import { formatFixed, formatSignificant } from '../../units/number-format';
import { PlotExport } from '../../plots/plot-export/plot-export';
import { drawFrame } from '../../plots/plot-frame';
import { setSvgRichText } from '../../plots/svg-rich-text';
import { RichText } from '../../shared/rich-text/rich-text';
import type { BrushBox } from '../screen-results-store';
import {
  COLOUR_BY,
  COLUMN_BY_KEY,
  REGIME_LABELS,
  shownValue,
  type ColourBy,
  type PlotRate,
} from '../result-columns';

const W = 780;
const H = 420;
const MARGIN = { top: 16, right: 170, bottom: 48, left: 62 };

/** Sequential colours from deep teal to amber (our palette), for numeric columns. */
export const SEQUENTIAL = interpolateHcl('#0b4f5c', '#e8a317');

/** Regimes: colour AND shape, so colour is never the only carrier. */
export const REGIME_STYLE: Record<string, { colour: string; shape: typeof symbolCircle }> = {
  normal: { colour: '#006a6a', shape: symbolCircle },
  activationless: { colour: '#3a3a3a', shape: symbolDiamond },
  inverted: { colour: '#b86e00', shape: symbolTriangle },
};

export interface ScatterPoint {
  readonly row: ScreenResultRow;
  /** −ΔG° / eV. */
  readonly x: number;
  /** log10(k / s⁻¹). */
  readonly y: number;
  readonly colourValue: number | string | null;
}

/** The points a rate column gives (rows without a rate or a driving force are left out). */
export function scatterPoints(
  rows: readonly ScreenResultRow[],
  rate: PlotRate,
  colourBy: ColourBy,
): ScatterPoint[] {
  const out: ScatterPoint[] = [];
  for (const row of rows) {
    const dg = row[rate.x];
    const k = row[rate.key];
    if (dg === null || k === null || !Number.isFinite(dg) || !Number.isFinite(k)) continue;
    const colourValue =
      colourBy === 'regimeCr' || colourBy === 'regimeCs'
        ? row[colourBy]
        : shownValue(row, colourBy);
    out.push({ row, x: -dg, y: k, colourValue });
  }
  return out;
}

interface Hover {
  readonly left: number;
  readonly top: number;
  /** Plain lines (pair names as typed), then the colour value with its subscript markup. */
  readonly lines: string[];
  readonly colourLine: string;
}

/**
 * The range an axis shows: the data's range, narrowed to Tukey's outer fences (quartiles ∓ 3 ×
 * the interquartile range; Tukey, Exploratory Data Analysis, 1977) when a few values lie far out,
 * so one row at log k = −87 does not squash every other point into a line. Values outside are
 * drawn at the edge and marked as outliers.
 */
export function robustRange(values: readonly number[]): [number, number] | null {
  if (!values.length) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const lo = sorted[0];
  const hi = sorted[sorted.length - 1];
  if (sorted.length < 8) return [lo, hi];
  const q1 = quantileSorted(sorted, 0.25)!;
  const q3 = quantileSorted(sorted, 0.75)!;
  const iqr = q3 - q1;
  if (iqr === 0) return [lo, hi];
  return [Math.max(lo, q1 - 3 * iqr), Math.min(hi, q3 + 3 * iqr)];
}

/**
 * log10 k against −ΔG° for the rows of a screen: coloured by a chosen column (with a legend;
 * regimes also by shape), hover names the pair, a brushed rectangle is reported as ranges in
 * stored units (ΔG° in eV, log10 k) so the table can filter by it.
 */
@Component({
  selector: 'gw-screen-scatter',
  imports: [PlotExport, RichText],
  template: `
    <figure class="plot">
      <figcaption>
        <span class="title">{{ rate().name }}: log₁₀ k against driving force</span>
        <span class="spacer"></span>
        <gw-plot-export [svg]="svgEl()" [filename]="filename()" what="the screen scatter plot" />
      </figcaption>
      <div class="canvas" #canvas>
        <svg #svg width="100%" preserveAspectRatio="xMidYMid meet"></svg>
        @if (hover(); as h) {
          <div class="tip" role="status" [style.left.px]="h.left" [style.top.px]="h.top">
            @for (line of h.lines; track $index) {
              <div [class.strong]="$first">{{ line }}</div>
            }
            <div><gw-rich-text [text]="h.colourLine" /></div>
          </div>
        }
      </div>
      <p class="hint">
        {{ points().length }} pair(s) drawn. Drag a rectangle over points to filter the table to
        them; click outside it to clear.
      </p>
    </figure>
  `,
  styleUrls: ['../../plots/plot.scss', './screen-scatter.scss'],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ScreenScatter {
  readonly rows = input.required<readonly ScreenResultRow[]>();
  readonly rate = input.required<PlotRate>();
  readonly colourBy = input.required<ColourBy>();
  readonly filename = input('gapwise-screen-scatter');
  readonly brushed = output<BrushBox | null>();

  private readonly svgRef = viewChild.required<ElementRef<SVGSVGElement>>('svg');
  private readonly canvasRef = viewChild.required<ElementRef<HTMLDivElement>>('canvas');
  protected readonly svgEl = computed(() => this.svgRef().nativeElement);
  protected readonly points = computed(() =>
    scatterPoints(this.rows(), this.rate(), this.colourBy()),
  );
  protected readonly hover = signal<Hover | null>(null);
  private tree: Quadtree<ScatterPoint> | null = null;
  private clear: (() => void) | null = null;

  constructor() {
    effect(() => this.draw(this.svgRef().nativeElement, this.points()));
  }

  private draw(svgEl: SVGSVGElement, points: ScatterPoint[]): void {
    const rate = this.rate();
    const colourBy = this.colourBy();
    const xs = robustRange(points.map((p) => p.x)) ?? [undefined, undefined];
    const ys = robustRange(points.map((p) => p.y)) ?? [undefined, undefined];
    const outside = (p: ScatterPoint) =>
      xs[0] !== undefined &&
      ys[0] !== undefined &&
      (p.x < xs[0] || p.x > xs[1]! || p.y < ys[0] || p.y > ys[1]!);
    const outliers = points.filter(outside).length;
    const pad = (lo: number | undefined, hi: number | undefined, min: number): [number, number] => {
      if (lo === undefined || hi === undefined) return [0, 1];
      const span = Math.max(hi - lo, min);
      return [lo - span * 0.06, hi + span * 0.06];
    };
    const reaction = rate.x === 'deltaGCs' ? 'CS' : 'CR';
    const f = drawFrame(svgEl, 'screen-scatter', {
      width: W,
      height: H,
      margin: MARGIN,
      xDomain: pad(xs[0], xs[1], 0.2),
      yDomain: pad(ys[0], ys[1], 1),
      xLabel: `Driving force −ΔG°_${reaction} / eV`,
      yLabel: `log₁₀(k_${reaction} / s⁻¹)`,
      title: `${rate.name}: log10 k against driving force for ${points.length} pairs`,
    });
    const { plot, x, y, svg } = f;

    const categorical = colourBy === 'regimeCr' || colourBy === 'regimeCs';
    const numbers = points
      .map((p) => p.colourValue)
      .filter((v): v is number => typeof v === 'number');
    const [c0, c1] = numbers.length ? (extent(numbers) as [number, number]) : [0, 1];
    const seq = scaleSequential(SEQUENTIAL).domain([c0, c1 === c0 ? c0 + 1 : c1]);
    const fill = (p: ScatterPoint) =>
      categorical
        ? (REGIME_STYLE[String(p.colourValue)]?.colour ?? '#9aabab')
        : typeof p.colourValue === 'number'
          ? seq(p.colourValue)
          : '#c8d0d0';
    const shape = (p: ScatterPoint) =>
      symbol()
        .type(
          categorical ? (REGIME_STYLE[String(p.colourValue)]?.shape ?? symbolCircle) : symbolCircle,
        )
        .size(36)();
    plot
      .append('g')
      .attr('class', 'points')
      .selectAll('path')
      .data(points)
      .join('path')
      .attr('class', (p) => (outside(p) ? 'point outlier' : 'point'))
      // An outlier sits at the edge it lies beyond (clamped), drawn hollow with a dark ring.
      .attr('transform', (p) => {
        const px = Math.min(Math.max(x(p.x), 0), f.innerWidth);
        const py = Math.min(Math.max(y(p.y), 0), f.innerHeight);
        return `translate(${px.toFixed(1)},${py.toFixed(1)})`;
      })
      .attr('d', (p) => (outside(p) ? symbol().type(symbolDiamond).size(64)() : shape(p)))
      .attr('fill', (p) => (outside(p) ? '#ffffff' : fill(p)))
      .attr('fill-opacity', 0.85)
      .attr('stroke', (p) => (outside(p) ? '#1f2b2b' : '#ffffff'))
      .attr('stroke-width', (p) => (outside(p) ? 1.4 : 0.6));
    if (outliers > 0) {
      plot
        .append('text')
        .attr('class', 'outlier-note')
        .attr('x', f.innerWidth - 4)
        .attr('y', 14)
        .attr('text-anchor', 'end')
        .attr('font-size', 11)
        .attr('fill', '#1f2b2b')
        .text(
          `◇ ${outliers} outlier${outliers === 1 ? '' : 's'} beyond the axes, drawn at the edge`,
        );
    }

    this.drawLegend(svg, categorical, colourBy, c0, c1, seq);

    // Hover: nearest point within 12 units, found through a quadtree in drawing units.
    this.tree = quadtree<ScatterPoint>()
      .x((p) => x(p.x))
      .y((p) => y(p.y))
      .addAll(points);

    const root = plot.append('g').attr('class', 'brush');
    const b = d3brush<unknown>()
      .extent([
        [0, 0],
        [f.innerWidth, f.innerHeight],
      ])
      .on(
        'end',
        (event: {
          selection: [[number, number], [number, number]] | null;
          sourceEvent?: unknown;
        }) => {
          if (!event.sourceEvent) return;
          const s = event.selection;
          if (!s) {
            this.brushed.emit(null);
            return;
          }
          const [[px0, py0], [px1, py1]] = s;
          // x is −ΔG°: the stored ΔG° range is the negated, swapped one.
          this.brushed.emit({
            x: rate.x,
            xMin: -x.invert(px1),
            xMax: -x.invert(px0),
            y: rate.key,
            yMin: y.invert(py1),
            yMax: y.invert(py0),
          });
        },
      );
    root.call(b);
    this.clear = () => root.call(b.move, null);
    root.select('.selection').attr('fill', 'rgba(0,106,106,0.12)').attr('stroke', '#006a6a');
    root
      .on('pointermove.hover', (event: PointerEvent) => this.showHover(event))
      .on('pointerleave.hover', () => this.hover.set(null));
  }

  private drawLegend(
    svg: ReturnType<typeof drawFrame>['svg'],
    categorical: boolean,
    colourBy: ColourBy,
    c0: number,
    c1: number,
    seq: (v: number) => string,
  ): void {
    const g = svg
      .append('g')
      .attr('class', 'legend')
      .attr('transform', `translate(${W - MARGIN.right + 20},${MARGIN.top + 6})`);
    const name = COLOUR_BY.find((c) => c.key === colourBy)?.name ?? colourBy;
    const title = g.append('text').attr('font-weight', 600).attr('fill', '#1f2b2b');
    setSvgRichText(title.node()!, 'Colour: ' + name);
    if (categorical) {
      Object.entries(REGIME_STYLE).forEach(([regime, style], i) => {
        const row = g.append('g').attr('transform', `translate(6,${20 + i * 20})`);
        row
          .append('path')
          .attr('d', symbol().type(style.shape).size(60)())
          .attr('fill', style.colour);
        row
          .append('text')
          .attr('x', 14)
          .attr('dy', '0.35em')
          .attr('fill', '#1f2b2b')
          .text(REGIME_LABELS[regime]);
      });
      return;
    }
    const unit = COLUMN_BY_KEY.get(colourBy as never)?.unit ?? '';
    const steps = 24;
    const barH = 140;
    for (let i = 0; i < steps; i++) {
      g.append('rect')
        .attr('x', 0)
        .attr('y', 14 + (barH * i) / steps)
        .attr('width', 16)
        .attr('height', barH / steps + 0.5)
        .attr('fill', seq(c1 - ((c1 - c0) * i) / (steps - 1)));
    }
    const label = (v: number, yPos: number) =>
      g
        .append('text')
        .attr('x', 22)
        .attr('y', yPos)
        .attr('dy', '0.35em')
        .attr('fill', '#3c4747')
        .text(`${formatSignificant(v, 3)}${unit && unit !== 'decades' ? ` ${unit}` : ''}`);
    label(c1, 16);
    label((c0 + c1) / 2, 14 + barH / 2);
    label(c0, 12 + barH);
    g.append('text')
      .attr('y', 32 + barH)
      .attr('fill', '#57606a')
      .attr('font-size', 10)
      .text('grey: no value (e.g. no score)');
  }

  /** Removes the brushed rectangle (the caller clears its filter). */
  clearBrush(): void {
    this.clear?.();
  }

  private showHover(event: PointerEvent): void {
    const node = event.currentTarget as SVGGElement;
    const ctm = node.getScreenCTM();
    if (!ctm || !this.tree) return;
    const p = new DOMPoint(event.clientX, event.clientY).matrixTransform(ctm.inverse());
    const hit = this.tree.find(p.x, p.y, 12);
    if (!hit) {
      this.hover.set(null);
      return;
    }
    const r = hit.row;
    const rate = this.rate();
    const colour = this.colourBy();
    const colourLine =
      colour === 'regimeCr' || colour === 'regimeCs'
        ? `${COLOUR_BY.find((c) => c.key === colour)?.name}: ${hit.colourValue ?? '—'}`
        : `${COLOUR_BY.find((c) => c.key === colour)?.name}: ${formatSignificant(hit.colourValue as number | null, 3)}`;
    const box = this.canvasRef().nativeElement.getBoundingClientRect();
    const left = event.clientX - box.left;
    this.hover.set({
      left: left + 14 + 220 > box.width ? left - 230 : left + 14,
      top: event.clientY - box.top + 10,
      lines: [
        `${r.donor} → ${r.acceptor}`,
        `line ${r.rowNumber}${r.solvent ? ` · ${r.solvent}` : ''}`,
        `−ΔG° = ${formatFixed(hit.x, 3)} eV`,
        `log₁₀ k = ${formatFixed(hit.y, 2)} (${rate.name})`,
      ],
      colourLine,
    });
  }
}
