/**
 * The cascade part of a report PDF (issue 17): states, steps with their sources, yields and
 * lifetimes with intervals, the state-energy diagram, the energy landscape (disconnectivity)
 * tree and the population plot. The pictures take their geometry from `@gapwise/plots` (the same
 * functions the cascade page draws with); this file only strokes it with pdfkit.
 */
import {
  formatNumber,
  formatRegime,
  formatScientific,
  type ReportCascadeSnapshot,
  type ReportCascadeValue,
} from '@gapwise/contracts';
import { disconnectivityLayout, energyLevels, populationPaths } from '@gapwise/plots';
import { COLORS, drawTable, type Cursor, type Doc } from './page-layout';
import { FONT_REGULAR } from './fonts';
import { drawAxes, SERIES_COLORS, strokePath, type Frame } from './plots';
import { drawRich } from './rich-text';

const STATE_KIND_TEXT: Record<string, string> = {
  ground: 'ground',
  excited: 'excited',
  chargeSeparated: 'charge-separated',
  product: 'product',
  other: 'other',
};

const STEP_TYPE_TEXT: Record<string, string> = {
  fixed: 'given',
  electronTransfer: 'ET',
  detailedBalance: 'ET reverse',
};

/** A value with its interval at the precision the interval supports. */
export function cascadeValueText(v: ReportCascadeValue): string {
  const unit = v.unit ? ` ${v.unit}` : '';
  const show = (x: number) => (v.unit === 's' ? formatScientific(x, 3) : formatNumber(x, 3));
  if (v.low === null || v.high === null) return `${show(v.value)}${unit}`;
  return `${show(v.value)}${unit} (95 % interval ${show(v.low)} to ${show(v.high)}${unit})`;
}

export function drawCascade(cursor: Cursor, c: ReportCascadeSnapshot): void {
  const label = new Map(c.states.map((s) => [s.id, s.label]));
  const name = (id: string) => label.get(id) ?? id;
  cursor.heading('Yields and lifetimes', 80);
  drawTable(
    cursor,
    [
      { header: 'Quantity', width: 0.45 },
      { header: 'Value', width: 0.55, align: 'right' },
    ],
    [...c.yields, ...c.lifetimes].map((v) => [v.label, cascadeValueText(v)]),
  );
  cursor.gap(4);
  cursor.text(c.monteCarloNote, { size: 8, color: COLORS.muted });
  if (c.dominantPathway.length > 1) {
    cursor.text(`Dominant pathway by integrated flux: ${c.dominantPathway.join(' → ')}.`, {
      size: 9.5,
    });
  }

  cursor.heading('States', 80);
  drawTable(
    cursor,
    [
      { header: 'State', width: 0.22 },
      { header: 'Kind', width: 0.16 },
      { header: 'G (eV)', width: 0.12, align: 'right' },
      { header: 'Source', width: 0.5 },
    ],
    c.states.map((s) => [
      s.label,
      STATE_KIND_TEXT[s.kind] ?? s.kind,
      formatNumber(s.energyEv, 4),
      s.source,
    ]),
  );

  cursor.heading('Steps', 80);
  drawTable(
    cursor,
    [
      { header: 'Step', width: 0.2 },
      { header: 'Type', width: 0.09 },
      { header: 'k (s⁻¹)', width: 0.12, align: 'right' },
      { header: 'ΔG° (eV)', width: 0.09, align: 'right' },
      { header: 'Regime', width: 0.1 },
      { header: 'Integrated flux', width: 0.11, align: 'right' },
      { header: 'Source', width: 0.29 },
    ],
    c.steps.map((s) => [
      `${name(s.from)} → ${name(s.to)}`,
      STEP_TYPE_TEXT[s.type] ?? s.type,
      formatScientific(s.k, 3),
      s.deltaG0Ev === null ? '—' : formatNumber(s.deltaG0Ev, 3),
      s.regime ? formatRegime(s.regime) : '—',
      formatNumber(s.flux, 2),
      s.source,
    ]),
    { size: 7.5 },
  );
  cursor.gap(4);
  cursor.text(
    'Integrated flux: ∫k p dt of the step, the expected number of times it is taken (it can ' +
      'exceed 1 when a step runs back and forth). Reverse ET steps ' +
      'follow from detailed balance; reverse steps slower than 10⁻¹⁰ of every given rate are left out.',
    { size: 8, color: COLORS.muted },
  );

  cursor.heading('Plots', 250);
  const h = 230;
  cursor.need(h);
  const half = (cursor.width - 14) / 2;
  drawEnergyDiagram(cursor.doc, { x: cursor.left, y: cursor.y, width: half, height: h }, c);
  drawLandscapeTree(
    cursor.doc,
    { x: cursor.left + half + 14, y: cursor.y, width: half, height: h },
    c,
  );
  cursor.y += h + 8;
  cursor.need(220);
  drawPopulations(cursor.doc, { x: cursor.left, y: cursor.y, width: cursor.width, height: 210 }, c);
  cursor.y += 214;
}

/** Title and an energy axis (eV) on the left; returns the inner plotting box. */
function energyFrame(doc: Doc, frame: Frame, title: string, lo: number, hi: number) {
  drawRich(doc, title, frame.x, frame.y, frame.width, { size: 9, bold: true });
  const inner = {
    x: frame.x + 34,
    y: frame.y + 18,
    width: frame.width - 38,
    height: frame.height - 40,
  };
  const span = hi - lo || 1;
  const y = (e: number) => inner.y + (1 - (e - lo) / span) * inner.height;
  doc.lineWidth(0.6).strokeColor(COLORS.muted);
  doc
    .moveTo(inner.x, inner.y)
    .lineTo(inner.x, inner.y + inner.height)
    .stroke();
  const step = span > 2 ? 0.5 : span > 1 ? 0.25 : 0.1;
  for (let e = Math.ceil(lo / step) * step; e <= hi + 1e-9; e += step) {
    doc
      .moveTo(inner.x - 3, y(e))
      .lineTo(inner.x, y(e))
      .stroke();
    drawRich(doc, formatNumber(e, 3), inner.x - 34, y(e) - 4, 29, {
      size: 7,
      color: COLORS.muted,
      align: 'right',
    });
  }
  drawRich(doc, 'G (eV)', frame.x, frame.y + frame.height - 12, 40, {
    size: 7.5,
    color: COLORS.muted,
  });
  return { inner, y };
}

/** Levels at their energies, ET steps as arrows (width by flux) labelled with log10 k. */
function drawEnergyDiagram(doc: Doc, frame: Frame, c: ReportCascadeSnapshot): void {
  const energies = c.states.map((s) => s.energyEv);
  const lo = Math.min(0, ...energies);
  const hi = Math.max(...energies) + 0.1;
  const { inner } = energyFrame(doc, frame, 'State-energy diagram', lo, hi);
  const box = {
    width: inner.x + inner.width,
    height: inner.y + inner.height,
    left: inner.x + 6,
    right: 0,
    top: inner.y,
    bottom: 0,
  };
  // One column per state, ground → excited → charge-separated → products, as the cascade page
  // draws it: a step reads left to right and no two arrows share a column.
  const order = Object.keys(STATE_KIND_TEXT);
  const rank = (kind: string) => (order.includes(kind) ? order.indexOf(kind) : order.length);
  const ordered = [...c.states].sort((a, b) => rank(a.kind) - rank(b.kind));
  const { levels } = energyLevels(
    ordered.map((s) => ({ id: s.id, energy: s.energyEv })),
    box,
    { columnPerState: true },
  );
  // energyLevels spans min(0, E) … max(E); map its y onto this frame's scale (hi has headroom).
  const span = hi - lo;
  const y = (e: number) => inner.y + (1 - (e - lo) / span) * inner.height;
  const at = new Map(levels.map((l, i) => [l.id, { ...l, y: y(ordered[i]!.energyEv) }]));
  const maxFlux = Math.max(1e-12, ...c.steps.map((s) => s.flux));
  for (const s of c.steps) {
    if (s.type === 'detailedBalance') continue;
    const a = at.get(s.from);
    const b = at.get(s.to);
    if (!a || !b) continue;
    // From the end of one level to the near end of the other (each state has its own column),
    // so arrows leave the labels centred over the levels clear.
    const rightward = a.x1 < b.x1;
    const xa = rightward ? a.x2 : a.x1;
    const xb = rightward ? b.x1 : b.x2;
    const color = s.type === 'fixed' ? COLORS.muted : COLORS.teal;
    const width = 0.5 + 2.5 * Math.sqrt(s.flux / maxFlux);
    doc.save();
    if (s.type === 'fixed') doc.dash(2, { space: 2 });
    doc.moveTo(xa, a.y).lineTo(xb, b.y).lineWidth(width).strokeColor(color).stroke();
    doc.restore();
    const angle = Math.atan2(b.y - a.y, xb - xa);
    doc
      .polygon(
        [xb, b.y],
        [xb - 5 * Math.cos(angle - 0.4), b.y - 5 * Math.sin(angle - 0.4)],
        [xb - 5 * Math.cos(angle + 0.4), b.y - 5 * Math.sin(angle + 0.4)],
      )
      .fill(color);
  }
  for (const l of at.values()) {
    doc.moveTo(l.x1, l.y).lineTo(l.x2, l.y).lineWidth(1.6).strokeColor(COLORS.charcoal).stroke();
    // The label centred over its level across the whole column; a long one takes two lines
    // and moves up so it never sits on the level or its arrows' heads.
    const text = label(c, l.id);
    const column = (box.width - box.left) / Math.max(1, at.size);
    const centre = (l.x1 + l.x2) / 2;
    doc.font(FONT_REGULAR).fontSize(6.5);
    // Word wrapping loses some of each line: allow for it.
    const lines = Math.min(3, Math.ceil((doc.widthOfString(text) * 1.2) / (column - 4)));
    drawRich(doc, text, centre - column / 2 + 2, l.y - 2 - 8 * lines, column - 4, {
      size: 6.5,
      align: 'center',
    });
  }
  drawRich(
    doc,
    'Solid: ET steps (width by flux); dashed: given decays.',
    inner.x,
    frame.y + frame.height - 12,
    inner.width,
    { size: 6.5, color: COLORS.muted, align: 'right' },
  );
}

function label(c: ReportCascadeSnapshot, id: string): string {
  return c.states.find((s) => s.id === id)?.label ?? id;
}

/** The disconnectivity tree: minima at their energies, joined at transition-state energies. */
function drawLandscapeTree(doc: Doc, frame: Frame, c: ReportCascadeSnapshot): void {
  if (c.tree.nodes.length === 0) return;
  const energies = c.tree.nodes.map((n) => n.energy);
  const lo = Math.min(...energies);
  const hi = Math.max(...energies);
  // Room below the lowest minimum for its label (it would otherwise run into the footnote) and
  // above the highest join for its energy.
  const pad = 0.12 * (hi - lo || 1);
  const { inner, y } = energyFrame(doc, frame, 'Energy landscape tree', lo - pad, hi + pad / 2);
  // The layout maps lo … hi onto top … height − bottom; place that span on the frame's scale.
  const box = {
    width: inner.x + inner.width,
    height: y(lo),
    left: inner.x + 4,
    right: 0,
    top: y(hi),
    bottom: 0,
  };
  const { points, segments } = disconnectivityLayout(c.tree.nodes, c.tree.roots, box);
  // Edges: a vertical from each child up to the join's energy and the join's horizontal bar.
  doc.save();
  doc.lineCap('round');
  for (const s of segments) {
    const bar = s.y1 === s.y2;
    doc
      .moveTo(s.x1, s.y1)
      .lineTo(s.x2, s.y2)
      .lineWidth(bar ? 2 : 1.2)
      .strokeColor(bar ? COLORS.teal : COLORS.charcoal)
      .stroke();
  }
  doc.restore();
  for (const n of c.tree.nodes) {
    const p = points[n.id];
    if (!p) continue;
    if (n.kind === 'minimum') {
      doc.circle(p.x, p.y, 2).fill(COLORS.charcoal);
      drawRich(doc, label(c, n.id), p.x - 30, p.y + 3, 60, { size: 6.5, align: 'center' });
    } else {
      drawRich(doc, `${formatNumber(n.energy, 3)} eV`, p.x + 3, p.y - 9, 50, {
        size: 6,
        color: COLORS.muted,
      });
    }
  }
  drawRich(
    doc,
    'Decays (no transition state) do not join minima.',
    inner.x,
    frame.y + frame.height - 12,
    inner.width,
    { size: 6.5, color: COLORS.muted, align: 'right' },
  );
}

/** Populations of every state against log10 t. */
function drawPopulations(doc: Doc, frame: Frame, c: ReportCascadeSnapshot): void {
  if (c.times.length < 2) return;
  const logs = c.times.map(Math.log10);
  const lo = Math.floor(Math.min(...logs));
  const hi = Math.ceil(Math.max(...logs));
  const ids = c.states.map((s) => s.id);
  const color = (i: number) => SERIES_COLORS[i % SERIES_COLORS.length];
  const axes = drawAxes(
    doc,
    frame,
    [lo, hi],
    [0, 1],
    { x: 'log₁₀(t / s)', y: 'Population', title: 'Populations against time' },
    ids.map((id, i) => ({ label: label(c, id), color: color(i), dash: i >= SERIES_COLORS.length })),
  );
  const { inner } = axes;
  const { paths } = populationPaths(c.times, c.populations, {
    width: inner.x + inner.width,
    height: inner.y + inner.height,
    left: inner.x,
    right: 0,
    top: inner.y,
    bottom: 0,
  });
  ids.forEach((id, i) =>
    strokePath(doc, paths[id] ?? '', color(i), 1.2, i >= SERIES_COLORS.length ? 3 : undefined),
  );
}
