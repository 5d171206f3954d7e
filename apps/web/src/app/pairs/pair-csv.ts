import { csvCell, type PairListItem } from '@gapwise/contracts';

const COLUMNS: ReadonlyArray<[string, (row: PairListItem) => unknown]> = [
  ['name', (r) => r.name],
  ['donor', (r) => r.donor],
  ['acceptor', (r) => r.acceptor],
  ['status', (r) => r.status],
  ['deltaG0_eV', (r) => r.deltaG0],
  ['lambda_eV', (r) => r.lambda],
  ['coupling_eV', (r) => r.coupling],
  ['log10k_per_s', (r) => r.log10k],
  ['regime', (r) => r.regime],
  ['log10k_cr_per_s', (r) => r.log10kCr ?? null],
  ['regime_cr', (r) => r.regimeCr ?? null],
  ['log10_ratio_cs_cr', (r) => r.log10Ratio ?? null],
  ['tags', (r) => r.tags.join(';')],
  ['updated_at', (r) => r.updatedAt],
  ['updated_by', (r) => r.updatedBy],
];

/** The visible rows as CSV, canonical units named in the header (full precision). */
export function pairsToCsv(rows: readonly PairListItem[]): string {
  const header = COLUMNS.map(([name]) => name).join(',');
  const lines = rows.map((row) => COLUMNS.map(([, get]) => csvCell(get(row))).join(','));
  return [header, ...lines].join('\r\n') + '\r\n';
}

/** Offers a text as a file download. */
export function downloadText(text: string, filename: string, type: string): void {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = document.createElement('a');
  a.href = url;
  a.download = filename;
  a.click();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}
