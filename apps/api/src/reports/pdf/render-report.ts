/**
 * Renders a report snapshot and its review state to a PDF (pdfkit, A4, Inter embedded).
 *
 * Order: title block, key result, inputs, methods, results, plots, warnings, limits of this
 * estimate, review history; every page carries a footer with the snapshot id and "page i of n".
 */
import PDFDocument from 'pdfkit';
import {
  formatRateWithLog,
  formatRegime,
  formatReportDate,
  formatReportStatus,
  formatNumber,
  reviewRounds,
  reviewStatusText,
  transitionText,
  type ReportPairSnapshot,
  type ReportReviewState,
  type ReportSnapshot,
  type ReportStatus,
} from '@gapwise/contracts';
import { FONT_REGULAR, FONT_SEMIBOLD, reportFonts } from './fonts';
import { COLORS, Cursor, PAGE, drawNote, drawTable, type Doc } from './page-layout';
import { drawRich, measureRich } from './rich-text';
import { drawComparisonPlot, drawMonteCarlo, drawPairPlots } from './plots';
import { cascadeValueText, drawCascade } from './cascade-section';
import {
  comparisonRow,
  hasUncertainties,
  inputRow,
  modelName,
  primaryResult,
  resultRow,
  stepsText,
} from './report-text';

const STATUS_COLORS: Record<ReportStatus, string> = {
  draft: COLORS.muted,
  submitted: COLORS.amber,
  'changes-requested': COLORS.danger,
  approved: COLORS.teal,
};

/** Renders the whole report; resolves with the PDF bytes. */
export async function renderReportPdf(
  snapshot: ReportSnapshot,
  review: ReportReviewState,
): Promise<Buffer> {
  const fonts = reportFonts();
  const lastChange =
    review.history.length > 0 ? review.history[review.history.length - 1].at : snapshot.createdAt;
  const doc: Doc = new PDFDocument({
    size: PAGE.size,
    margins: PAGE.margin,
    bufferPages: true,
    autoFirstPage: true,
    // The default font would be Helvetica (not embeddable); start with Inter instead.
    font: fonts.regular as unknown as string,
    info: {
      Title: snapshot.title,
      Author: snapshot.author.displayName,
      Subject: `Gapwise report, snapshot ${review.snapshotId}`,
      Creator: `Gapwise ${snapshot.softwareVersion}`,
      Producer: 'Gapwise report renderer (pdfkit)',
      CreationDate: new Date(lastChange),
      ModDate: new Date(lastChange),
    },
    lang: 'en',
    displayTitle: true,
  });
  doc.registerFont(FONT_REGULAR, fonts.regular);
  doc.registerFont(FONT_SEMIBOLD, fonts.semibold);
  doc.font(FONT_REGULAR);
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  const cursor = new Cursor(doc);
  drawTitleBlock(cursor, snapshot, review);
  if (snapshot.kind === 'comparison') drawComparison(cursor, snapshot);
  for (const pair of snapshot.pairs) drawPair(cursor, snapshot, pair);
  if (snapshot.cascade) drawCascade(cursor, snapshot.cascade);
  drawMethods(cursor, snapshot);
  drawWarnings(cursor, snapshot);
  cursor.heading('Limits of this estimate', 40);
  drawNote(
    cursor,
    'Read this before relying on a number',
    snapshot.limitsNote,
    COLORS.amberLight,
    COLORS.amber,
  );
  drawReview(cursor, snapshot, review);
  drawFooters(doc, snapshot, review);
  doc.end();
  return done;
}

function drawTitleBlock(cursor: Cursor, snapshot: ReportSnapshot, review: ReportReviewState): void {
  const doc = cursor.doc;
  const kindLine =
    snapshot.kind === 'comparison'
      ? 'GAPWISE · COMPARISON REPORT'
      : snapshot.kind === 'cascade'
        ? 'GAPWISE · CASCADE REPORT (MULTI-STEP ELECTRON TRANSFER)'
        : 'GAPWISE · ELECTRON-TRANSFER RATE REPORT';
  drawRich(doc, kindLine, cursor.left, cursor.y, cursor.width, {
    size: 8,
    bold: true,
    color: COLORS.teal,
  });
  // Status badge, top right.
  const status = formatReportStatus(review.status).toUpperCase();
  doc.font(FONT_SEMIBOLD).fontSize(8.5);
  const badgeW = doc.widthOfString(status) + 16;
  const badgeX = cursor.left + cursor.width - badgeW;
  doc.roundedRect(badgeX, cursor.y - 3, badgeW, 17, 3).fill(STATUS_COLORS[review.status]);
  drawRich(doc, status, badgeX, cursor.y + 0.5, badgeW, {
    size: 8.5,
    bold: true,
    color: '#ffffff',
    align: 'center',
  });
  cursor.y += 16;
  cursor.y += drawRich(doc, snapshot.title, cursor.left, cursor.y, cursor.width - badgeW - 10, {
    size: 18,
    bold: true,
    leading: 1.2,
  });
  cursor.y += 6;

  const single = snapshot.kind === 'pair' ? snapshot.pairs[0] : null;
  const meta: Array<[string, string]> = [];
  if (single) {
    meta.push(['Pair', `${single.name}, version ${single.pairVersion}`]);
    meta.push(['Donor → acceptor', `${single.donor} → ${single.acceptor}`]);
    meta.push(['Medium', single.medium || '—']);
    meta.push(['Temperature', `${formatNumber(single.temperatureK, 5)} K`]);
    meta.push(['Rate model', modelName(single.model)]);
  } else if (snapshot.cascade) {
    const c = snapshot.cascade;
    meta.push(['Cascade', `${c.name}, version ${c.cascadeVersion}`]);
    meta.push(['States and steps', `${c.states.length} states, ${c.steps.length} directed steps`]);
    meta.push(['Temperature', `${formatNumber(c.temperatureK, 5)} K`]);
    if (c.notes) meta.push(['Notes', c.notes]);
  } else {
    meta.push(['Pairs', snapshot.pairs.map((p) => `${p.name} (v${p.pairVersion})`).join(', ')]);
  }
  meta.push(['Workspace', snapshot.workspace.name]);
  meta.push(['Author', snapshot.author.displayName]);
  meta.push(['Snapshot taken', formatReportDate(snapshot.createdAt)]);
  meta.push(['Review status', reviewStatusText(review.status, review.history)]);
  meta.push(['Software', `Gapwise ${snapshot.softwareVersion}; constants ${snapshot.constants}`]);
  meta.push(['Snapshot id', review.snapshotId]);
  const labelW = 92;
  for (const [label, value] of meta) {
    const h = measureRich(doc, value, cursor.width - labelW, { size: 9 });
    cursor.need(h);
    drawRich(doc, label, cursor.left, cursor.y, labelW, { size: 9, color: COLORS.muted });
    drawRich(doc, value, cursor.left + labelW, cursor.y, cursor.width - labelW, { size: 9 });
    cursor.y += h;
  }
  cursor.gap(8);
  if (single) {
    const r = primaryResult(single);
    const body = r?.applies
      ? `k = ${formatRateWithLog(r.k, r.log10k)}; ΔG‡ = ${r.activationFreeEnergy === null ? '—' : `${formatNumber(r.activationFreeEnergy, 3, true)} eV`}; ` +
        `regime: ${formatRegime(r.regime)}${r.couplingRegime ? `; coupling regime: ${formatRegime(r.couplingRegime)}` : ''}${r.warnings.length > 0 ? `; ${r.warnings.length} warning(s), see below` : ''}.`
      : `No rate: ${r?.reason ?? 'the chosen model does not apply to these inputs'}.`;
    drawNote(cursor, `Result (${modelName(single.model)})`, body, COLORS.tealLight, COLORS.teal);
  }
  if (snapshot.cascade) {
    const c = snapshot.cascade;
    const key = [...c.yields.filter((v) => v.label.startsWith('Formation')), ...c.lifetimes];
    const body =
      key.length > 0
        ? `${key.map((v) => `${v.label}: ${cascadeValueText(v)}`).join('; ')}.`
        : `${c.yields.map((v) => `${v.label}: ${cascadeValueText(v)}`).join('; ')}.`;
    drawNote(cursor, 'Key results', body, COLORS.tealLight, COLORS.teal);
  }
}

function drawComparison(cursor: Cursor, snapshot: ReportSnapshot): void {
  cursor.heading('Comparison of pairs', 80);
  drawTable(
    cursor,
    [
      { header: 'Pair', width: 0.15 },
      { header: 'ΔG°', width: 0.09, align: 'right' },
      { header: 'λ (total)', width: 0.09, align: 'right' },
      { header: '|H_AB|', width: 0.09, align: 'right' },
      { header: 'T', width: 0.08, align: 'right' },
      { header: 'Model', width: 0.17 },
      { header: 'k', width: 0.13, align: 'right' },
      { header: 'log10 k', width: 0.08, align: 'right' },
      { header: 'Regime', width: 0.12 },
    ],
    snapshot.pairs.map(comparisonRow),
    { size: 8 },
  );
  cursor.gap(8);
  drawComparisonPlot(cursor, snapshot.pairs);
}

function drawPair(cursor: Cursor, snapshot: ReportSnapshot, pair: ReportPairSnapshot): void {
  const prefix = snapshot.kind === 'comparison' ? `${pair.name}: ` : '';
  cursor.heading(`${prefix}Inputs`, 80);
  drawTable(
    cursor,
    [
      { header: 'Parameter', width: 0.23 },
      { header: 'As typed', width: 0.17, align: 'right' },
      { header: 'Canonical', width: 0.14, align: 'right' },
      { header: '± 1σ', width: 0.12, align: 'right' },
      { header: 'Provenance', width: 0.34 },
    ],
    pair.inputs.map(inputRow),
  );
  cursor.heading(`${prefix}Results`, 80);
  const applying = pair.results.filter((r) => r.applies);
  if (applying.length > 0) {
    drawTable(
      cursor,
      [
        { header: 'Model', width: 0.22 },
        { header: 'k', width: 0.14, align: 'right' },
        { header: 'log10 k', width: 0.08, align: 'right' },
        { header: 'ΔG‡', width: 0.1, align: 'right' },
        { header: 'Regime', width: 0.11 },
        { header: 'Coupling', width: 0.13 },
        { header: 'Monte Carlo interval of log10 k', width: 0.22 },
      ],
      applying.map((r) => resultRow(r, hasUncertainties(pair))),
      { rowStyles: applying.map((r) => (r.primary ? 'bold' : 'normal')) },
    );
  }
  const skipped = pair.results.filter((r) => !r.applies);
  if (skipped.length > 0) {
    cursor.gap(4);
    cursor.text(
      `Not computed: ${skipped.map((r) => `${modelName(r.model)} (${r.reason ?? 'does not apply'})`).join('; ')}.`,
      { size: 8.5, color: COLORS.muted },
    );
  }
  cursor.gap(4);
  if (snapshot.kind === 'pair') drawMonteCarlo(cursor, pair);
  cursor.text(
    'k in s⁻¹ (first order); ΔG‡ is the classical activation free energy (ΔG° + λ)²/4λ; the interval propagates the stated 1σ ' +
      'uncertainties (normal distributions) through the chosen model.',
    { size: 8, color: COLORS.muted },
  );
  drawSteps(cursor, pair, prefix);
  if (snapshot.kind === 'pair') {
    cursor.heading('Plots', 230);
    drawPairPlots(cursor, pair);
  }
}

/** Charge separation beside charge recombination and their ratio (the pair model's strings). */
function drawSteps(cursor: Cursor, pair: ReportPairSnapshot, prefix: string): void {
  const steps = stepsText(pair);
  if (!steps) return;
  cursor.heading(`${prefix}Separation and recombination`, 80);
  drawTable(
    cursor,
    [
      { header: 'Step', width: 0.26 },
      { header: 'Model', width: 0.3 },
      { header: 'k', width: 0.17, align: 'right' },
      { header: 'log10 k', width: 0.1, align: 'right' },
      { header: 'Regime', width: 0.17 },
    ],
    steps.rows,
  );
  cursor.gap(4);
  if (steps.ratio) cursor.text(`${steps.ratio}.`, { size: 9.5 });
  cursor.text(steps.note, { size: 8, color: COLORS.muted });
}

function drawMethods(cursor: Cursor, snapshot: ReportSnapshot): void {
  cursor.heading('Methods', 90);
  for (const method of snapshot.methods) {
    const refsH = method.references.reduce(
      (s, r) => s + measureRich(cursor.doc, r, cursor.width - 12, { size: 8.5 }),
      0,
    );
    cursor.need(Math.min(40 + refsH, 200));
    cursor.subheading(`${method.name} (${method.id})`, 30);
    for (const line of method.equation.split('\n').filter((l) => l.trim() !== '')) {
      cursor.text(line, { size: 9.5, color: COLORS.charcoal }, 12);
    }
    cursor.gap(2);
    for (const ref of method.references)
      cursor.text(`• ${ref}`, { size: 8.5, color: COLORS.muted }, 12);
    cursor.gap(4);
  }
  cursor.text(
    `Physical constants: ${snapshot.constants}. Energies per molecule in eV; rates in s⁻¹.`,
    {
      size: 8.5,
      color: COLORS.muted,
    },
  );
}

function drawWarnings(cursor: Cursor, snapshot: ReportSnapshot): void {
  cursor.heading('Warnings', 40);
  let any = false;
  for (const pair of snapshot.pairs) {
    const perModel = pair.results.filter((r) => r.applies && r.warnings.length > 0);
    if (perModel.length === 0 && pair.warnings.length === 0) continue;
    any = true;
    if (snapshot.kind === 'comparison') cursor.subheading(pair.name);
    const seen = new Set<string>();
    for (const r of perModel) {
      for (const w of r.warnings) {
        const key = `${w.code}:${w.message}`;
        const models = perModel
          .filter((m) => m.warnings.some((x) => x.code === w.code))
          .map((m) => modelName(m.model));
        if (seen.has(key)) continue;
        seen.add(key);
        cursor.text(`⚠ ${w.message} (${models.join(', ')})`, { size: 9, color: COLORS.amber }, 0);
        cursor.gap(2);
      }
    }
    for (const w of pair.warnings) {
      const key = `${w.code}:${w.message}`;
      if (seen.has(key)) continue;
      seen.add(key);
      cursor.text(`⚠ ${w.message}`, { size: 9, color: COLORS.amber });
      cursor.gap(2);
    }
  }
  for (const w of snapshot.cascade?.warnings ?? []) {
    any = true;
    cursor.text(`⚠ ${w.message}`, { size: 9, color: COLORS.amber });
    cursor.gap(2);
  }
  if (!any) cursor.text('No validity warnings for these inputs.', { size: 9, color: COLORS.muted });
}

function drawReview(cursor: Cursor, snapshot: ReportSnapshot, review: ReportReviewState): void {
  cursor.heading('Review history', 50);
  if (review.history.length === 0) {
    cursor.text('No review decisions yet.', { size: 9, color: COLORS.muted });
  } else {
    const rounds = reviewRounds(review.history);
    drawTable(
      cursor,
      [
        { header: 'When', width: 0.2 },
        { header: 'Who', width: 0.2 },
        { header: 'Decision', width: 0.25 },
        { header: 'Note', width: 0.35 },
      ],
      review.history.map((t, i) => [
        formatReportDate(t.at),
        t.by.displayName,
        transitionText(t, rounds[i]),
        t.note ?? '',
      ]),
    );
  }
  cursor.subheading('Comments', 20);
  if (review.comments.length === 0) {
    cursor.text('No comments.', { size: 9, color: COLORS.muted });
    return;
  }
  const labels = new Map<string, string>();
  for (const pair of snapshot.pairs) for (const i of pair.inputs) labels.set(i.kind, i.label);
  const children = new Map<string | null, typeof review.comments>();
  for (const c of review.comments) {
    const key = c.parentId && review.comments.some((p) => p.id === c.parentId) ? c.parentId : null;
    children.set(key, [...(children.get(key) ?? []), c]);
  }
  const walk = (parent: string | null, depth: number) => {
    for (const c of children.get(parent) ?? []) {
      const anchor = c.anchor ? ` · on ${labels.get(c.anchor) ?? c.anchor}` : '';
      const indent = Math.min(depth, 4) * 16;
      cursor.need(30);
      cursor.text(
        `${c.author.displayName} · ${formatReportDate(c.createdAt)}${anchor}`,
        { size: 8.5, bold: true, color: COLORS.muted },
        indent,
      );
      cursor.text(c.body, { size: 9 }, indent);
      cursor.gap(5);
      walk(c.id, depth + 1);
    }
  };
  walk(null, 0);
}

function drawFooters(doc: Doc, snapshot: ReportSnapshot, review: ReportReviewState): void {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottom = doc.page.height - 38;
    const left = doc.page.margins.left;
    const width = doc.page.width - left - doc.page.margins.right;
    doc
      .moveTo(left, bottom - 6)
      .lineTo(left + width, bottom - 6)
      .lineWidth(0.4)
      .strokeColor(COLORS.rule)
      .stroke();
    drawRich(doc, `Snapshot ${review.snapshotId}`, left, bottom, width * 0.75, {
      size: 7,
      color: COLORS.muted,
    });
    drawRich(
      doc,
      `Page ${i - range.start + 1} of ${range.count}`,
      left + width * 0.75,
      bottom,
      width * 0.25,
      {
        size: 7,
        color: COLORS.muted,
        align: 'right',
      },
    );
    drawRich(
      doc,
      `Gapwise ${snapshot.softwareVersion} · ${formatReportStatus(review.status)} · model estimate, not a measurement`,
      left,
      bottom + 10,
      width,
      { size: 7, color: COLORS.muted },
    );
  }
}
