/**
 * The workbench's three plots drawn as PDF vector paths. All geometry (curves, domains, ticks,
 * arrows) comes from `@gapwise/plots`, the module the web page draws from; this file only maps
 * it onto a pdfkit page.
 */
import {
  LabelSpace,
  drivingForceCurves,
  linePath,
  linearScale,
  niceTicks,
  parabolaGeometry,
  temperatureCurve,
  type LinearScale,
} from '@gapwise/plots';
import {
  formatFixed,
  formatNumber,
  pairPlotInputs,
  pairRateRequest,
  modelName,
  plainText,
  type ReportPairSnapshot,
} from '@gapwise/contracts';
import { FONT_REGULAR, FONT_SEMIBOLD } from './fonts';
import { COLORS, type Cursor, type Doc } from './page-layout';
import { drawRich, measureRich } from './rich-text';
import { inputValue, primaryResult, sourceOf, totalLambda } from './report-text';

export interface Frame {
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

interface Axes {
  readonly sx: LinearScale;
  readonly sy: LinearScale;
  readonly inner: Frame;
}

export const SERIES_COLORS = [
  COLORS.teal,
  COLORS.product,
  COLORS.reactant,
  COLORS.amber,
  '#6a4c93',
  COLORS.charcoal,
];

interface LegendItem {
  readonly label: string;
  readonly color: string;
  readonly dash?: boolean;
  /** A marker, not a line (the legend sits above the data area, so it never reads as data). */
  readonly dot?: boolean;
}

const LEGEND_ROW = 10;
const LEGEND_SIZE = 7;
const LEGEND_KEY = 22;

/** Legend items laid out in rows of the given width: each item's offset, and the row count. */
function legendLayout(
  doc: Doc,
  items: readonly LegendItem[],
  width: number,
): { at: Array<{ x: number; row: number }>; rows: number } {
  doc.font(FONT_REGULAR).fontSize(LEGEND_SIZE);
  const at: Array<{ x: number; row: number }> = [];
  let x = 0;
  let row = 0;
  for (const item of items) {
    const w = LEGEND_KEY + doc.widthOfString(plainText(item.label)) + 12;
    if (x > 0 && x + w > width) {
      row += 1;
      x = 0;
    }
    at.push({ x, row });
    x += w;
  }
  return { at, rows: items.length ? row + 1 : 0 };
}

/**
 * The legend in rows above the plotting area, outside the data: a line key per curve and a ring
 * for a marked point (a filled dot inside the frame is data, never a legend key).
 */
function drawLegend(doc: Doc, x0: number, y0: number, width: number, items: readonly LegendItem[]) {
  const { at } = legendLayout(doc, items, width);
  items.forEach((item, i) => {
    const x = x0 + at[i].x;
    const y = y0 + at[i].row * LEGEND_ROW;
    if (item.dot) doc.circle(x + 9, y + 4, 3).fill(item.color);
    else
      strokePath(
        doc,
        `M${x},${y + 4}L${x + 18},${y + 4}`,
        item.color,
        1.4,
        item.dash ? 3 : undefined,
      );
    drawRich(doc, item.label, x + LEGEND_KEY, y - 0.5, width - at[i].x - LEGEND_KEY, {
      size: LEGEND_SIZE,
      color: COLORS.text,
    });
  });
}

/**
 * Frame with title, legend (above the data area), axes, ticks, grid and labels; returns the
 * scales of the inner plotting area.
 */
export function drawAxes(
  doc: Doc,
  frame: Frame,
  xDomain: readonly [number, number],
  yDomain: readonly [number, number],
  labels: { x: string; y: string; title: string },
  legendItems: readonly LegendItem[] = [],
): Axes {
  const legendRows = legendLayout(doc, legendItems, frame.width - 40).rows;
  // A long title wraps: the legend and the plotting area start below it.
  const titleH = measureRich(doc, labels.title, frame.width, { size: 9, bold: true });
  const legendY = frame.y + titleH + 3;
  const top = titleH + 6 + legendRows * LEGEND_ROW + (legendRows ? 3 : 0);
  const inner: Frame = {
    x: frame.x + 40,
    y: frame.y + top,
    width: frame.width - 50,
    height: frame.height - 32 - top,
  };
  drawLegend(doc, inner.x, legendY, frame.width - 40, legendItems);
  const sx = linearScale(xDomain, [inner.x, inner.x + inner.width]);
  const sy = linearScale(yDomain, [inner.y + inner.height, inner.y]);
  drawRich(doc, labels.title, frame.x, frame.y, frame.width, { size: 9, bold: true });
  doc.lineWidth(0.3).strokeColor(COLORS.rule);
  const xTicks = niceTicks(xDomain[0], xDomain[1], Math.max(3, Math.round(inner.width / 60)));
  const yTicks = niceTicks(yDomain[0], yDomain[1], Math.max(3, Math.round(inner.height / 32)));
  for (const t of xTicks) {
    doc
      .moveTo(sx(t), inner.y)
      .lineTo(sx(t), inner.y + inner.height)
      .stroke();
    drawRich(doc, formatNumber(t, 3), sx(t) - 20, inner.y + inner.height + 3, 40, {
      size: 7,
      color: COLORS.muted,
      align: 'center',
    });
  }
  for (const t of yTicks) {
    doc
      .moveTo(inner.x, sy(t))
      .lineTo(inner.x + inner.width, sy(t))
      .stroke();
    drawRich(doc, formatNumber(t, 3), inner.x - 38, sy(t) - 4.5, 35, {
      size: 7,
      color: COLORS.muted,
      align: 'right',
    });
  }
  doc
    .rect(inner.x, inner.y, inner.width, inner.height)
    .lineWidth(0.6)
    .strokeColor(COLORS.muted)
    .stroke();
  drawRich(doc, labels.x, inner.x, inner.y + inner.height + 14, inner.width, {
    size: 8,
    color: COLORS.text,
    align: 'center',
  });
  // Vertical y label.
  doc.save();
  doc.rotate(-90, { origin: [frame.x + 6, inner.y + inner.height / 2] });
  drawRich(
    doc,
    labels.y,
    frame.x + 6 - inner.height / 2,
    inner.y + inner.height / 2 - 6,
    inner.height,
    {
      size: 8,
      align: 'center',
    },
  );
  doc.restore();
  return { sx, sy, inner };
}

/** The pair's own point: a filled dot with a white ring, the legend's ring names it. */
function pairMarker(doc: Doc, x: number, y: number): void {
  doc.circle(x, y, 3.2).lineWidth(1).fillAndStroke(COLORS.text, '#ffffff');
}

function clipTo(doc: Doc, inner: Frame): void {
  doc.save();
  doc.rect(inner.x, inner.y, inner.width, inner.height).clip();
}

export function strokePath(doc: Doc, d: string, color: string, width = 1.4, dash?: number): void {
  if (!d) return;
  doc.save();
  if (dash) doc.dash(dash, { space: dash * 0.8 });
  doc.path(d).lineWidth(width).strokeColor(color).stroke();
  doc.restore();
}

/** Vertical double-headed arrow (its label is placed separately, clear of every line). */
function arrow(doc: Doc, x: number, y0: number, y1: number, color: string): void {
  if (Math.abs(y1 - y0) < 4) return;
  doc.moveTo(x, y0).lineTo(x, y1).lineWidth(0.8).strokeColor(color).stroke();
  const head = (y: number, dir: number) =>
    doc.polygon([x, y], [x - 2.5, y - 4.5 * dir], [x + 2.5, y - 4.5 * dir]).fill(color);
  head(y1, y1 > y0 ? 1 : -1);
  head(y0, y0 > y1 ? 1 : -1);
}

const ARROW_LABEL_SIZE = 7.5;

/**
 * True when a plot's geometry is all finite numbers with a non-empty, finite span on each axis.
 * Stored values far beyond physical ranges (ΔG° or λ of 1e155 eV, written before input limits
 * or by another tool) overflow the curves to ±Infinity/NaN, and pdfkit refuses NaN: such a plot
 * is left out (the tables still print every stored number).
 */
function plottable(
  domains: ReadonlyArray<readonly [number, number]>,
  ...values: ReadonlyArray<number | null | undefined>
): boolean {
  const finite = (v: number | null | undefined) => v == null || Number.isFinite(v);
  return (
    domains.every(
      ([a, b]) => Number.isFinite(a) && Number.isFinite(b) && Number.isFinite(b - a) && b > a,
    ) && values.every(finite)
  );
}

/** Diabatic parabolas with the adiabatic surfaces, crossing, ΔG°, λ and ΔG‡ marked. */
export function drawParabolas(doc: Doc, frame: Frame, pair: ReportPairSnapshot): boolean {
  const deltaG0 = inputValue(pair, 'deltaG0');
  const lambda = totalLambda(pair);
  const coupling = inputValue(pair, 'coupling') ?? 0;
  if (deltaG0 === null || lambda === null || !(lambda > 0)) return false;
  const g = parabolaGeometry({ deltaG0, lambda, coupling });
  if (
    !plottable(
      [g.gapDomain, g.energyDomain],
      g.crossing.gap,
      g.crossing.energy,
      ...g.arrows.flatMap((a) => [a.gap, a.from, a.to]),
      ...g.points.flatMap((p) => [p.gap, p.reactant, p.product, p.lower, p.upper]),
    )
  )
    return false;
  const axes = drawAxes(
    doc,
    frame,
    g.gapDomain,
    g.energyDomain,
    {
      title: 'Free-energy curves along the energy gap',
      x: 'Energy gap ΔE = E_P − E_R (eV)',
      y: 'Free energy (eV)',
    },
    [
      { label: 'Reactant diabat', color: COLORS.reactant },
      { label: 'Product diabat', color: COLORS.product },
      {
        label: `Adiabatic surfaces (2|H_AB| = ${formatNumber(2 * Math.abs(coupling), 3)} eV)`,
        color: COLORS.charcoal,
        dash: true,
      },
    ],
  );
  const { sx, sy, inner } = axes;
  clipTo(doc, inner);
  const at = (key: 'reactant' | 'product' | 'lower' | 'upper') =>
    g.points.map((p) => ({ x: p.gap, y: p[key] }));
  strokePath(doc, linePath(at('lower'), sx, sy), COLORS.charcoal, 1, 3);
  strokePath(doc, linePath(at('upper'), sx, sy), COLORS.charcoal, 1, 3);
  strokePath(doc, linePath(at('reactant'), sx, sy), COLORS.reactant, 1.6);
  strokePath(doc, linePath(at('product'), sx, sy), COLORS.product, 1.6);
  const cx = sx(g.crossing.gap);
  const cy = sy(g.crossing.energy);
  doc.circle(cx, cy, 2.4).fill(COLORS.text);
  // Room for the arrow labels: every curve, arrow and the crossing are obstacles (LabelSpace of
  // @gapwise/plots, as on the pair page), so no label sits on a line or on the crossing.
  const space = new LabelSpace({ x: 0, y: 0, width: inner.width, height: inner.height }, 2);
  const local = (x: number, y: number) => ({ x: x - inner.x, y: y - inner.y });
  for (const key of ['reactant', 'product', 'lower', 'upper'] as const)
    space.addPolyline(
      g.points.map((p) => local(sx(p.gap), sy(p[key]))),
      2,
    );
  space.addBox({ x: cx - inner.x - 4, y: cy - inner.y - 4, width: 8, height: 8 }, 2);
  const shown = g.arrows.filter((a) => a.id !== 'splitting');
  for (const a of shown) {
    space.addPolyline([local(sx(a.gap), sy(a.from)), local(sx(a.gap), sy(a.to))], 2);
  }
  const colorOf = (id: string) =>
    id === 'activation' ? COLORS.teal : id === 'lambda' ? COLORS.product : COLORS.amber;
  for (const a of shown) arrow(doc, sx(a.gap), sy(a.from), sy(a.to), colorOf(a.id));
  doc.restore();
  doc.font(FONT_SEMIBOLD).fontSize(ARROW_LABEL_SIZE);
  for (const a of shown) {
    const x = sx(a.gap) - inner.x;
    const y0 = sy(a.from) - inner.y;
    const y1 = sy(a.to) - inner.y;
    const w = doc.widthOfString(plainText(a.label)) + 2;
    const h = ARROW_LABEL_SIZE + 3;
    const mid = (y0 + y1) / 2 - h / 2;
    const placed = space.place(
      [
        { x, y: y0 },
        { x, y: y1 },
      ],
      w,
      h,
      {
        preferred: [
          { x: x + 3, y: mid, width: w, height: h },
          { x: x - 3 - w, y: mid, width: w, height: h },
        ],
        leaderFrom: 8,
      },
    );
    if (!placed) continue;
    const color = colorOf(a.id);
    if (placed.leader) {
      const [from, to] = placed.leader;
      doc
        .moveTo(from.x + inner.x, from.y + inner.y)
        .lineTo(to.x + inner.x, to.y + inner.y)
        .lineWidth(0.4)
        .strokeColor(color)
        .stroke();
    }
    drawRich(doc, a.label, placed.box.x + inner.x + 1, placed.box.y + inner.y + 1, w + 4, {
      size: ARROW_LABEL_SIZE,
      bold: true,
      color,
    });
  }
  return true;
}

/** log10 k against −ΔG° for the pair's λ and |H_AB|, inverted region shaded, the pair marked. */
export function drawDrivingForce(doc: Doc, frame: Frame, pair: ReportPairSnapshot): boolean {
  // The pair model's plot inputs: the same curves as the pair page draws.
  const inputs = pairPlotInputs(sourceOf(pair), primaryResult(pair)?.log10k ?? null);
  if (!inputs) return false;
  const g = drivingForceCurves({ ...inputs, samples: 161 });
  if (
    !plottable(
      [g.domain, g.log10kDomain],
      g.invertedFrom,
      g.pair?.x,
      g.pair?.y,
      ...g.points.map((p) => p.minusDeltaG0),
    )
  )
    return false;
  const { sx, sy, inner } = drawAxes(
    doc,
    frame,
    g.domain,
    g.log10kDomain,
    { title: 'Rate against driving force', x: '−ΔG° (eV)', y: 'log10 (k / s⁻¹)' },
    [
      { label: 'Classical Marcus', color: COLORS.teal },
      ...(g.hasMlj ? [{ label: 'MLJ', color: COLORS.amber, dash: true }] : []),
      ...(g.pair ? [{ label: 'This pair', color: COLORS.text, dot: true }] : []),
    ],
  );
  clipTo(doc, inner);
  const x0 = Math.max(sx(g.invertedFrom), inner.x);
  doc
    .rect(x0, inner.y, inner.x + inner.width - x0, inner.height)
    .fillOpacity(0.07)
    .fill(COLORS.amber);
  doc.fillOpacity(1);
  strokePath(
    doc,
    linePath(
      g.points.map((p) => ({ x: p.minusDeltaG0, y: p.marcus })),
      sx,
      sy,
    ),
    COLORS.teal,
    1.5,
  );
  if (g.hasMlj) {
    strokePath(
      doc,
      linePath(
        g.points.map((p) => ({ x: p.minusDeltaG0, y: p.mlj })),
        sx,
        sy,
      ),
      COLORS.amber,
      1.5,
      4,
    );
  }
  if (g.pair) pairMarker(doc, sx(g.pair.x), sy(g.pair.y));
  doc.restore();
  drawRich(doc, 'inverted region', x0 + 3, inner.y + inner.height - 11, 80, {
    size: 7,
    color: COLORS.amber,
  });
  return true;
}

/** log10 k against 1000/T for the pair's chosen model, with the apparent activation energy. */
export function drawTemperature(doc: Doc, frame: Frame, pair: ReportPairSnapshot): boolean {
  const request = pairRateRequest(sourceOf(pair));
  if ('missing' in request) return false;
  const g = temperatureCurve(request, pair.temperatureK);
  if (g.points.every((p) => p.log10k === null)) return false;
  if (
    !plottable(
      [g.inverseTDomain, g.log10kDomain],
      g.pair?.x,
      g.pair?.y,
      ...g.points.map((p) => p.inverseT),
    )
  )
    return false;
  const { sx, sy, inner } = drawAxes(
    doc,
    frame,
    g.inverseTDomain,
    g.log10kDomain,
    { title: 'Rate against temperature', x: '1000 / T (K⁻¹)', y: 'log10 (k / s⁻¹)' },
    [
      { label: modelName(pair.model), color: COLORS.teal },
      ...(g.pair ? [{ label: 'This pair', color: COLORS.text, dot: true }] : []),
    ],
  );
  clipTo(doc, inner);
  strokePath(
    doc,
    linePath(
      g.points.map((p) => ({ x: p.inverseT, y: p.log10k })),
      sx,
      sy,
    ),
    COLORS.teal,
    1.5,
  );
  if (g.pair) pairMarker(doc, sx(g.pair.x), sy(g.pair.y));
  doc.restore();
  const ea =
    g.apparentEa === null
      ? ''
      : `Apparent Eₐ = ${formatNumber(g.apparentEa, 3)} eV at ${formatNumber(pair.temperatureK, 5)} K`;
  if (ea)
    drawRich(doc, ea, inner.x + 4, inner.y + inner.height - 12, inner.width - 8, {
      size: 7,
      color: COLORS.muted,
    });
  return true;
}

/** The three plots of a pair: parabolas full width, the two rate plots side by side. */
export function drawPairPlots(cursor: Cursor, pair: ReportPairSnapshot): void {
  const doc = cursor.doc;
  const h1 = 215;
  cursor.need(h1);
  const drewParabolas = drawParabolas(
    doc,
    { x: cursor.left, y: cursor.y, width: cursor.width, height: h1 },
    pair,
  );
  if (drewParabolas) cursor.y += h1 + 6;
  const h2 = 205;
  cursor.need(h2);
  const half = (cursor.width - 14) / 2;
  const a = drawDrivingForce(doc, { x: cursor.left, y: cursor.y, width: half, height: h2 }, pair);
  const b = drawTemperature(
    doc,
    { x: cursor.left + half + 14, y: cursor.y, width: half, height: h2 },
    pair,
  );
  if (a || b) cursor.y += h2 + 4;
  if (!drewParabolas && !a && !b) {
    cursor.text(
      'No plots: the pair lacks ΔG°, λ or |H_AB|, or its values are beyond any plot range.',
      { size: 9, color: COLORS.muted },
    );
  }
}

/** All pairs of a comparison on one rate-against-driving-force plot: each pair's Marcus curve and point. */
export function drawComparisonPlot(cursor: Cursor, pairs: readonly ReportPairSnapshot[]): void {
  const doc = cursor.doc;
  const curves = pairs.flatMap((pair, i) => {
    const inputs = pairPlotInputs(sourceOf(pair), primaryResult(pair)?.log10k ?? null);
    if (!inputs) return [];
    // One classical curve per pair: the comparison reads the pairs side by side, not MLJ.
    const g = drivingForceCurves({
      ...inputs,
      lambdaSolvent: null,
      lambdaVib: null,
      hbarOmega: null,
      samples: 121,
    });
    if (!plottable([g.domain, g.log10kDomain], g.pair?.x, g.pair?.y)) return [];
    return [{ pair, g, color: SERIES_COLORS[i % SERIES_COLORS.length] }];
  });
  if (curves.length === 0) return;
  const xDomain: [number, number] = [
    Math.min(...curves.map((c) => c.g.domain[0])),
    Math.max(...curves.map((c) => c.g.domain[1])),
  ];
  const yDomain: [number, number] = [
    Math.min(...curves.map((c) => c.g.log10kDomain[0])),
    Math.max(...curves.map((c) => c.g.log10kDomain[1])),
  ];
  const h = 240;
  cursor.need(h);
  const { sx, sy, inner } = drawAxes(
    doc,
    { x: cursor.left, y: cursor.y, width: cursor.width, height: h },
    xDomain,
    yDomain,
    {
      title:
        'Rate against driving force, all pairs (classical Marcus with each pair’s λ and |H_AB|)',
      x: '−ΔG° (eV)',
      y: 'log10 (k / s⁻¹)',
    },
    curves.map((c) => ({ label: c.pair.name, color: c.color })),
  );
  clipTo(doc, inner);
  for (const c of curves) {
    strokePath(
      doc,
      linePath(
        c.g.points.map((p) => ({ x: p.minusDeltaG0, y: p.marcus })),
        sx,
        sy,
      ),
      c.color,
      1.2,
    );
    if (c.g.pair) doc.circle(sx(c.g.pair.x), sy(c.g.pair.y), 3).fill(c.color);
  }
  doc.restore();
  cursor.y += h + 6;
}

/**
 * The Monte Carlo distribution of log10 k of the chosen model, as the pair page shows it: bars
 * per bin (the 95 % interval darker), the median marked, axes for log10 k and the share of
 * samples per bin.
 */
/** Bins outside the 95 % interval: the teal at half strength, still visible on white. */
const MC_OUTSIDE = '#8cc7bf';

export function drawMonteCarlo(cursor: Cursor, pair: ReportPairSnapshot): boolean {
  const r = primaryResult(pair);
  const iv = r?.interval;
  const h = iv?.histogram;
  if (!iv || !h || h.counts.length === 0) return false;
  const total = h.counts.reduce((a, b) => a + b, 0);
  if (!(total > 0)) return false;
  const shares = h.counts.map((c) => (100 * c) / total);
  const xDomain: [number, number] = [h.edges[0], h.edges[h.edges.length - 1]];
  const yDomain: [number, number] = [0, Math.max(...shares) * 1.1];
  if (!plottable([xDomain, yDomain])) return false;
  const doc = cursor.doc;
  const height = 160;
  cursor.need(height);
  const frame = { x: cursor.left, y: cursor.y, width: cursor.width, height };
  const { sx, sy, inner } = drawAxes(
    doc,
    frame,
    xDomain,
    yDomain,
    {
      title: `Monte Carlo distribution of log10 k (${modelName(pair.model)}, ${iv.samples} samples)`,
      x: 'log10 (k / s⁻¹)',
      y: 'Share of samples (%)',
    },
    [
      {
        label: `95 % interval ${formatFixed(iv.log10kLow)} to ${formatFixed(iv.log10kHigh)}`,
        color: COLORS.teal,
      },
      { label: 'Outside it', color: MC_OUTSIDE },
      { label: `Median ${formatFixed(iv.log10kMedian)}`, color: COLORS.text, dash: true },
    ],
  );
  clipTo(doc, inner);
  shares.forEach((share, i) => {
    const x0 = sx(h.edges[i]);
    const x1 = sx(h.edges[i + 1]);
    const inside = h.edges[i + 1] >= iv.log10kLow && h.edges[i] <= iv.log10kHigh;
    doc
      .rect(x0 + 0.3, sy(share), Math.max(0.3, x1 - x0 - 0.6), sy(0) - sy(share))
      .fill(inside ? COLORS.teal : MC_OUTSIDE);
  });
  strokePath(
    doc,
    `M${sx(iv.log10kMedian)},${inner.y}L${sx(iv.log10kMedian)},${inner.y + inner.height}`,
    COLORS.text,
    0.9,
    3,
  );
  doc.restore();
  cursor.y += height + 6;
  return true;
}
