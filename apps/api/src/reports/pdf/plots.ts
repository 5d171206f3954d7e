/**
 * The workbench's three plots drawn as PDF vector paths. All geometry (curves, domains, ticks,
 * arrows) comes from `@gapwise/plots`, the module the web page draws from; this file only maps
 * it onto a pdfkit page.
 */
import {
  drivingForceCurves,
  linePath,
  linearScale,
  niceTicks,
  parabolaGeometry,
  temperatureCurve,
  type LinearScale,
} from '@gapwise/plots';
import {
  formatNumber,
  pairPlotInputs,
  pairRateRequest,
  type ReportPairSnapshot,
} from '@gapwise/contracts';
import { COLORS, type Cursor, type Doc } from './page-layout';
import { drawRich } from './rich-text';
import { inputValue, primaryResult, sourceOf, totalLambda } from './report-text';

interface Frame {
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

const SERIES_COLORS = [
  COLORS.teal,
  COLORS.product,
  COLORS.reactant,
  COLORS.amber,
  '#6a4c93',
  COLORS.charcoal,
];

/** Frame with axes, ticks, grid and labels; returns the scales of the inner plotting area. */
function drawAxes(
  doc: Doc,
  frame: Frame,
  xDomain: readonly [number, number],
  yDomain: readonly [number, number],
  labels: { x: string; y: string; title: string },
): Axes {
  const inner: Frame = {
    x: frame.x + 40,
    y: frame.y + 18,
    width: frame.width - 50,
    height: frame.height - 50,
  };
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

function clipTo(doc: Doc, inner: Frame): void {
  doc.save();
  doc.rect(inner.x, inner.y, inner.width, inner.height).clip();
}

function strokePath(doc: Doc, d: string, color: string, width = 1.4, dash?: number): void {
  if (!d) return;
  doc.save();
  if (dash) doc.dash(dash, { space: dash * 0.8 });
  doc.path(d).lineWidth(width).strokeColor(color).stroke();
  doc.restore();
}

function legend(
  doc: Doc,
  inner: Frame,
  items: ReadonlyArray<{ label: string; color: string; dash?: boolean; dot?: boolean }>,
): void {
  let y = inner.y + 5;
  for (const item of items) {
    const x = inner.x + inner.width - 118;
    if (item.dot) doc.circle(x + 9, y + 4, 2.6).fill(item.color);
    else
      strokePath(
        doc,
        `M${x},${y + 4}L${x + 18},${y + 4}`,
        item.color,
        1.4,
        item.dash ? 3 : undefined,
      );
    drawRich(doc, item.label, x + 22, y - 0.5, 96, { size: 7, color: COLORS.text });
    y += 10;
  }
}

/** Vertical double-headed arrow with a label to its right. */
function arrow(doc: Doc, x: number, y0: number, y1: number, label: string, color: string): void {
  if (Math.abs(y1 - y0) < 4) return;
  doc.moveTo(x, y0).lineTo(x, y1).lineWidth(0.8).strokeColor(color).stroke();
  const head = (y: number, dir: number) =>
    doc.polygon([x, y], [x - 2.5, y - 4.5 * dir], [x + 2.5, y - 4.5 * dir]).fill(color);
  head(y1, y1 > y0 ? 1 : -1);
  head(y0, y0 > y1 ? 1 : -1);
  drawRich(doc, label, x + 3, (y0 + y1) / 2 - 5, 40, { size: 7.5, bold: true, color });
}

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
  const axes = drawAxes(doc, frame, g.gapDomain, g.energyDomain, {
    title: 'Free-energy curves along the energy gap',
    x: 'Energy gap ΔE = E_P − E_R (eV)',
    y: 'Free energy (eV)',
  });
  const { sx, sy, inner } = axes;
  clipTo(doc, inner);
  const at = (key: 'reactant' | 'product' | 'lower' | 'upper') =>
    g.points.map((p) => ({ x: p.gap, y: p[key] }));
  strokePath(doc, linePath(at('lower'), sx, sy), COLORS.charcoal, 1, 3);
  strokePath(doc, linePath(at('upper'), sx, sy), COLORS.charcoal, 1, 3);
  strokePath(doc, linePath(at('reactant'), sx, sy), COLORS.reactant, 1.6);
  strokePath(doc, linePath(at('product'), sx, sy), COLORS.product, 1.6);
  doc.circle(sx(g.crossing.gap), sy(g.crossing.energy), 2.4).fill(COLORS.text);
  for (const a of g.arrows) {
    if (a.id === 'splitting') continue;
    const color =
      a.id === 'activation' ? COLORS.teal : a.id === 'lambda' ? COLORS.product : COLORS.amber;
    arrow(doc, sx(a.gap), sy(a.from), sy(a.to), a.label, color);
  }
  doc.restore();
  legend(doc, inner, [
    { label: 'Reactant diabat', color: COLORS.reactant },
    { label: 'Product diabat', color: COLORS.product },
    {
      label: `Adiabatic (2|H_AB| = ${formatNumber(2 * Math.abs(coupling), 3)} eV)`,
      color: COLORS.charcoal,
      dash: true,
    },
  ]);
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
  const { sx, sy, inner } = drawAxes(doc, frame, g.domain, g.log10kDomain, {
    title: 'Rate against driving force',
    x: '−ΔG° (eV)',
    y: 'log10 (k / s⁻¹)',
  });
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
  if (g.pair) doc.circle(sx(g.pair.x), sy(g.pair.y), 3).fill(COLORS.text);
  doc.restore();
  drawRich(doc, 'inverted', x0 + 3, inner.y + inner.height - 11, 60, {
    size: 7,
    color: COLORS.amber,
  });
  legend(doc, inner, [
    { label: 'Classical Marcus', color: COLORS.teal },
    ...(g.hasMlj ? [{ label: 'MLJ', color: COLORS.amber, dash: true }] : []),
    { label: 'This pair', color: COLORS.text, dot: true },
  ]);
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
  const { sx, sy, inner } = drawAxes(doc, frame, g.inverseTDomain, g.log10kDomain, {
    title: 'Rate against temperature',
    x: '1000 / T (K⁻¹)',
    y: 'log10 (k / s⁻¹)',
  });
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
  if (g.pair) doc.circle(sx(g.pair.x), sy(g.pair.y), 3).fill(COLORS.text);
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
  legend(
    doc,
    inner,
    curves.slice(0, 8).map((c) => ({ label: c.pair.name, color: c.color })),
  );
  cursor.y += h + 6;
}
