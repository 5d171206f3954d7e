/**
 * Machine-readable exports of a report snapshot: JSON (the snapshot itself with its id and
 * review status) and CSV in long form, one value per row at full double precision, canonical
 * units named as in CALC-API.md.
 */
import { csvCell, reviewRevision, type ReportView } from '@gapwise/contracts';
import { provenanceText } from './pdf/report-text';

export const CSV_COLUMNS = [
  'section',
  'pair_id',
  'pair_version',
  'pair_name',
  'model',
  'quantity',
  'value',
  'unit',
  'typed_value',
  'typed_unit',
  'uncertainty',
  'provenance',
] as const;

export function reportCsv(view: ReportView): string {
  const rows: unknown[][] = [[...CSV_COLUMNS]];
  const s = view.snapshot;
  const meta: Array<[string, unknown]> = [
    ['report_id', view.reportId],
    ['snapshot_id', view.snapshotId],
    // The revision a reviewer knows: the number of submissions.
    ['revision', reviewRevision(view.history)],
    ['status', view.status],
    ['title', s.title],
    ['workspace', s.workspace.name],
    ['author', s.author.displayName],
    ['created_at', s.createdAt],
    ['software_version', s.softwareVersion],
    ['constants', s.constants],
  ];
  for (const [q, v] of meta) rows.push(['report', '', '', '', '', q, v, '', '', '', '', '']);
  for (const p of s.pairs) {
    for (const i of p.inputs) {
      rows.push([
        'input',
        p.pairId,
        p.pairVersion,
        p.name,
        '',
        i.kind,
        i.value,
        i.canonicalUnit,
        i.typedValue,
        i.typedUnit,
        i.uncertainty,
        provenanceText(i.provenance),
      ]);
    }
    for (const r of p.results) {
      if (!r.applies) {
        rows.push([
          'result',
          p.pairId,
          p.pairVersion,
          p.name,
          r.model,
          'not_applicable',
          r.reason,
          '',
          '',
          '',
          '',
          '',
        ]);
        continue;
      }
      const out: Array<[string, unknown, string]> = [
        ['k', r.k, 's-1'],
        ['log10k', r.log10k, ''],
        ['activationFreeEnergy', r.activationFreeEnergy, 'eV'],
        ['regime', r.regime, ''],
        ['couplingRegime', r.couplingRegime ?? null, ''],
      ];
      if (r.interval) {
        out.push(['log10k_median', r.interval.log10kMedian, '']);
        out.push(['log10k_p025', r.interval.log10kLow, '']);
        out.push(['log10k_p975', r.interval.log10kHigh, '']);
      }
      for (const [q, v, u] of out)
        rows.push(['result', p.pairId, p.pairVersion, p.name, r.model, q, v, u, '', '', '', '']);
      for (const w of r.warnings)
        rows.push([
          'warning',
          p.pairId,
          p.pairVersion,
          p.name,
          r.model,
          w.code,
          w.message,
          '',
          '',
          '',
          '',
          '',
        ]);
    }
    const cr = p.recombination;
    if (cr) {
      // Charge recombination, as the pair model computed it (section `recombination`).
      const out: Array<[string, unknown, string]> = [
        ['k', cr.k, 's-1'],
        ['log10k', cr.log10k, ''],
        ['activationFreeEnergy', cr.activationFreeEnergy, 'eV'],
        ['regime', cr.regime, ''],
        ['log10_ratio_cs_cr', p.log10Ratio ?? null, ''],
      ];
      for (const [q, v, u] of out)
        rows.push([
          'recombination',
          p.pairId,
          p.pairVersion,
          p.name,
          cr.model,
          q,
          v,
          u,
          '',
          '',
          '',
          '',
        ]);
    }
  }
  return rows.map((r) => r.map(csvCell).join(',')).join('\r\n') + '\r\n';
}

export function reportJson(view: ReportView): unknown {
  return {
    reportId: view.reportId,
    snapshotId: view.snapshotId,
    revision: view.revision,
    status: view.status,
    snapshot: view.snapshot,
  };
}
