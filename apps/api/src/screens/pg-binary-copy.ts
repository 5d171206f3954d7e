/**
 * A chunk of screen results in PostgreSQL's binary COPY format, for
 * `COPY screen_results (…) FROM STDIN (FORMAT binary)`: PostgreSQL reads each double as its
 * 8 bytes and skips the executor work of `INSERT … SELECT FROM unnest(…)` per row
 * (apps/api/src/screens/README.md has the measured figures).
 *
 * Layout (PostgreSQL documentation, "COPY — Binary Format"; all integers big-endian): the
 * 11-byte signature `PGCOPY\n\377\r\n\0`, int32 flags (0), int32 header-extension length (0);
 * then per row an int16 field count and per field an int32 byte length (−1 for NULL) followed
 * by the value's binary form (uuid: 16 bytes; int4: 4 bytes; float8: IEEE 754; text: UTF-8);
 * then the int16 trailer −1.
 */
import { REGIMES, type ChunkResult } from './chunk-computer';

const SIGNATURE = Buffer.from('PGCOPY\n\xff\r\n\0', 'latin1');
const HEADER_BYTES = SIGNATURE.length + 8;

/** The columns, in the order each row's fields are written. */
export const SCREEN_RESULT_COPY_COLUMNS = [
  'screen_id',
  'row_number',
  'donor',
  'acceptor',
  'solvent',
  'delta_g_cs',
  'delta_g_cr',
  'lambda_inner',
  'lambda_outer',
  'lambda_total',
  'coupling',
  'temperature_k',
  'log10k_cs_marcus',
  'log10k_cr_marcus',
  'log10k_cs_mlj',
  'log10k_cr_mlj',
  'regime_cs',
  'regime_cr',
  'warning_mask',
  'score',
] as const;

const FLOAT_COLUMNS = 11;
const REGIME_BYTES = REGIMES.map((r) => Buffer.from(r, 'utf8'));

/** The 16 bytes of a UUID written as text (`8-4-4-4-12` hex digits). */
function uuidBytes(uuid: string): Buffer {
  const hex = uuid.replace(/-/g, '');
  if (!/^[0-9a-f]{32}$/i.test(hex)) throw new Error(`not a UUID: ${uuid}`);
  return Buffer.from(hex, 'hex');
}

/**
 * The whole COPY payload of one chunk. Non-finite values (not computable) go in as NULL, as
 * does the regime of a rate that could not be computed.
 */
export function screenResultsCopyPayload(screenId: string, r: ChunkResult): Buffer {
  const id = uuidBytes(screenId);
  const floats = [
    r.deltaGCs,
    r.deltaGCr,
    r.lambdaInner,
    r.lambdaOuter,
    r.lambdaTotal,
    r.coupling,
    r.temperature,
    r.log10kCsMarcus,
    r.log10kCrMarcus,
    r.log10kCsMlj,
    r.log10kCrMlj,
  ];
  // The size with every value present first (a NULL takes 4 bytes less), so the payload is one
  // allocation: fixed fields plus the text lengths.
  const fixedPerRow =
    2 + (4 + 16) + (4 + 4) + 3 * 4 + FLOAT_COLUMNS * (4 + 8) + 2 * 4 + (4 + 4) + (4 + 8);
  let size = HEADER_BYTES + r.size * fixedPerRow + 2;
  for (let i = 0; i < r.size; i++) {
    size +=
      Buffer.byteLength(r.donor[i]!, 'utf8') +
      Buffer.byteLength(r.acceptor[i]!, 'utf8') +
      Buffer.byteLength(r.solvent[i]!, 'utf8') +
      (Number.isFinite(r.log10kCsMarcus[i]!) ? REGIME_BYTES[r.regimeCs[i]!]!.length : 0) +
      (Number.isFinite(r.log10kCrMarcus[i]!) ? REGIME_BYTES[r.regimeCr[i]!]!.length : 0);
  }
  const out = Buffer.allocUnsafe(size);
  SIGNATURE.copy(out, 0);
  let o = SIGNATURE.length;
  o = out.writeInt32BE(0, o);
  o = out.writeInt32BE(0, o);
  const text = (value: string) => {
    const n = out.write(value, o + 4, 'utf8');
    out.writeInt32BE(n, o);
    o += 4 + n;
  };
  const float = (value: number) => {
    if (Number.isFinite(value)) {
      o = out.writeInt32BE(8, o);
      o = out.writeDoubleBE(value, o);
    } else {
      o = out.writeInt32BE(-1, o);
    }
  };
  const regime = (code: number, rate: number) => {
    if (Number.isFinite(rate)) {
      const bytes = REGIME_BYTES[code]!;
      o = out.writeInt32BE(bytes.length, o);
      o += bytes.copy(out, o);
    } else {
      o = out.writeInt32BE(-1, o);
    }
  };
  for (let i = 0; i < r.size; i++) {
    o = out.writeInt16BE(SCREEN_RESULT_COPY_COLUMNS.length, o);
    o = out.writeInt32BE(16, o);
    o += id.copy(out, o);
    o = out.writeInt32BE(4, o);
    o = out.writeInt32BE(r.lines[i]!, o);
    text(r.donor[i]!);
    text(r.acceptor[i]!);
    text(r.solvent[i]!);
    for (const column of floats) float(column[i]!);
    regime(r.regimeCs[i]!, r.log10kCsMarcus[i]!);
    regime(r.regimeCr[i]!, r.log10kCrMarcus[i]!);
    o = out.writeInt32BE(4, o);
    o = out.writeInt32BE(r.warningMask[i]!, o);
    float(r.score[i]!);
  }
  o = out.writeInt16BE(-1, o);
  return out.subarray(0, o);
}
