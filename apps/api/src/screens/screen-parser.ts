/**
 * Streaming parser of screen CSVs. Rows are validated one by one (VALIDATION.md A2, A3, A8–A13,
 * A16–A19), converted to canonical units and handed on in columnar chunks, so memory stays flat
 * whatever the file size. Every bad row is counted; the first `maxListed` are listed with their
 * line numbers.
 */
import { createHash } from 'node:crypto';
import type { Readable } from 'node:stream';
import { StringDecoder } from 'node:string_decoder';
import Papa from 'papaparse';
import {
  NUMERIC_KEYS,
  resolveHeader,
  type NumericKey,
  type ResolvedColumn,
} from './screen-columns';
import { findSolvent } from '@gapwise/contracts';

/** One chunk of good rows, canonical units, NaN where a cell was empty. */
export interface InputChunk {
  readonly index: number;
  /** Line number of each row in the uploaded file (1 = header). */
  readonly lines: number[];
  readonly donor: string[];
  readonly acceptor: string[];
  readonly solvent: string[];
  readonly values: Record<NumericKey, Float64Array>;
}

export interface BadRow {
  readonly line: number;
  readonly message: string;
}

export interface ParseSummary {
  readonly goodRows: number;
  readonly badRowCount: number;
  /** The first `maxListed` bad rows. */
  readonly badRows: BadRow[];
  readonly chunks: number;
  /** sha256 of the canonical good rows (hex): equal inputs give equal hashes. */
  readonly inputHash: string;
  /** Header problems or an empty file: nothing can be run. */
  readonly fatal: boolean;
  /** Unit written in the header per column key (only columns that name one). */
  readonly units: Record<string, string>;
}

/** The file has more data rows than `ParseOptions.maxRows`; reading stopped there. */
export class ScreenTooManyRowsError extends Error {
  constructor(readonly maxRows: number) {
    super(`The screen has more than ${maxRows} data rows.`);
    this.name = 'ScreenTooManyRowsError';
  }
}

export interface ParseOptions {
  readonly chunkSize: number;
  /** Most data rows (good and bad) read; one more throws ScreenTooManyRowsError. */
  readonly maxRows?: number;
  readonly maxListed?: number;
  /**
   * Awaited for every full chunk (and the last partial one): gives back-pressure. `encoded` is
   * the chunk's storage form (`encodeInputChunk`), already made for the input hash.
   */
  readonly onChunk?: (chunk: InputChunk, encoded: string) => Promise<void> | void;
}

const NUMBER_RE = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const NON_FINITE_RE = /^[+-]?(?:nan|inf|infinity)$/i;

function emptyValues(size: number): Record<NumericKey, Float64Array> {
  const values = {} as Record<NumericKey, Float64Array>;
  for (const key of NUMERIC_KEYS) values[key] = new Float64Array(size).fill(Number.NaN);
  return values;
}

/** Row-level validation of one record; returns the problems (empty when good). */
function readRow(
  cells: readonly string[],
  columns: readonly ResolvedColumn[],
  out: Record<NumericKey, number>,
  text: { donor: string; acceptor: string; solvent: string },
): string[] {
  const problems: string[] = [];
  for (const key of NUMERIC_KEYS) out[key] = Number.NaN;
  text.solvent = '';
  for (const col of columns) {
    const raw = (cells[col.index] ?? '').trim();
    const key = col.spec.key;
    if (col.spec.quantity === 'string') {
      if (raw === '' && col.spec.required) problems.push(`'${key}' is empty`);
      if (key === 'donor') text.donor = raw;
      else if (key === 'acceptor') text.acceptor = raw;
      else text.solvent = raw;
      continue;
    }
    if (raw === '') {
      if (col.spec.required) problems.push(`'${key}' is empty`);
      continue;
    }
    if (NON_FINITE_RE.test(raw)) {
      problems.push(`'${key}': non-finite value '${raw}'`);
      continue;
    }
    if (!NUMBER_RE.test(raw)) {
      problems.push(`'${key}': '${raw}' is not a number`);
      continue;
    }
    const typed = Number(raw);
    if (!Number.isFinite(typed)) {
      problems.push(`'${key}': non-finite value '${raw}'`);
      continue;
    }
    out[key as NumericKey] = typed * col.scale + col.offset;
  }
  if (problems.length > 0) return problems;

  if (text.solvent !== '') {
    const solvent = findSolvent(text.solvent);
    if (!solvent)
      problems.push(`unknown solvent '${text.solvent}'; give epsilon and refractiveIndex instead`);
    else {
      if (Number.isNaN(out.epsilon)) out.epsilon = solvent.epsilon;
      if (Number.isNaN(out.refractiveIndex)) out.refractiveIndex = solvent.refractiveIndex;
    }
  }
  const has = (key: NumericKey) => !Number.isNaN(out[key]);
  if (!(out.temperature > 0))
    problems.push('Temperature must be > 0 K (absolute). Did you enter °C?');
  if (!(out.distance > 0)) problems.push('Radii and distances must be > 0 (distance).');
  for (const key of ['radiusDonor', 'radiusAcceptor', 'distance0'] as const) {
    if (has(key) && !(out[key] > 0)) problems.push(`Radii and distances must be > 0 (${key}).`);
  }
  if (!has('epsilon')) problems.push('give a solvent from the table or epsilon');
  else if (out.epsilon < 1)
    problems.push('Dielectric constant and refractive index must be ≥ 1 (epsilon).');
  if (has('refractiveIndex') && out.refractiveIndex < 1) {
    problems.push('Dielectric constant and refractive index must be ≥ 1 (refractiveIndex).');
  }
  if (has('epsilonReference')) {
    if (out.epsilonReference < 1)
      problems.push('Dielectric constant must be ≥ 1 (epsilonReference).');
    if (!has('radiusDonor') || !has('radiusAcceptor')) {
      problems.push(
        'the Weller correction (epsilonReference) needs radiusDonor and radiusAcceptor',
      );
    }
  }
  for (const key of ['chargeDonor', 'chargeAcceptor'] as const) {
    if (has(key) && !(Number.isInteger(out[key]) && Math.abs(out[key]) <= 10))
      problems.push(`Charges must be whole numbers from −10 to 10 (${key}).`);
  }
  if (out.lambdaInner < 0) problems.push('lambdaInner must be ≥ 0.');
  if (has('lambdaOuter')) {
    if (out.lambdaOuter < 0) problems.push('lambdaOuter must be ≥ 0.');
  } else {
    if (!has('radiusDonor') || !has('radiusAcceptor') || !has('refractiveIndex')) {
      problems.push(
        'lambdaOuter is empty: give radiusDonor, radiusAcceptor and refractiveIndex (or a solvent) to derive it',
      );
    } else {
      if (out.distance < out.radiusDonor + out.radiusAcceptor) {
        problems.push('Centre-to-centre distance must be ≥ a_D + a_A.');
      }
      if (has('epsilon') && out.refractiveIndex ** 2 > out.epsilon) {
        problems.push(
          'Optical dielectric constant exceeds static one; for a non-polar solvent set lambdaOuter = 0 explicitly.',
        );
      }
    }
  }
  const lambdaOuterZero = has('lambdaOuter')
    ? out.lambdaOuter === 0
    : has('epsilon') && out.refractiveIndex ** 2 === out.epsilon;
  if (out.lambdaInner === 0 && lambdaOuterZero)
    problems.push('Reorganization energy must be a positive number.');
  if (!has('coupling')) {
    if (!has('coupling0') || !has('distance0') || !has('beta')) {
      problems.push('coupling is empty: give coupling0, distance0 and beta for distance decay');
    } else if (!(out.beta >= 0)) problems.push('beta must be ≥ 0.');
  }
  if (has('hbarOmega') && !(out.hbarOmega > 0)) problems.push('Mode energy must be > 0.');
  return problems;
}

/**
 * Parses a CSV stream. Header problems are fatal (reported on line 1); row problems are
 * collected and the good rows go on to `onChunk`.
 */
export async function parseScreenCsv(
  source: Readable | string,
  options: ParseOptions,
): Promise<ParseSummary> {
  const maxListed = options.maxListed ?? 20;
  const maxRows = options.maxRows ?? Number.POSITIVE_INFINITY;
  const chunkSize = options.chunkSize;
  const hash = createHash('sha256');
  const badRows: BadRow[] = [];
  let badRowCount = 0;
  let goodRows = 0;
  let chunks = 0;
  let columns: ResolvedColumn[] | null = null;
  let width = 0;
  let headerKey = '';
  let headerFirst = '';
  let fatal = false;

  let chunk = newChunk(0);
  let fill = 0;
  const row = {} as Record<NumericKey, number>;
  const text = { donor: '', acceptor: '', solvent: '' };

  function newChunk(index: number): InputChunk {
    return {
      index,
      lines: [],
      donor: [],
      acceptor: [],
      solvent: [],
      values: emptyValues(chunkSize),
    };
  }
  const bad = (line: number, message: string) => {
    badRowCount += 1;
    if (badRows.length < maxListed) badRows.push({ line, message: `Line ${line}: ${message}` });
  };
  async function flush(): Promise<void> {
    if (fill === 0) return;
    const out: InputChunk = fill === chunkSize ? chunk : trimChunk(chunk, fill);
    const encoded = encodeInputChunk(out);
    hash.update(encoded);
    chunks += 1;
    await options.onChunk?.(out, encoded);
    chunk = newChunk(chunks);
    fill = 0;
  }

  let nextLine = 1;
  let longRecord: RecordTooLongError | null = null;
  const batches = csvRecordBatches(source);
  records: for (;;) {
    let next: IteratorResult<string[][]>;
    try {
      next = await batches.next();
    } catch (error) {
      if (!(error instanceof RecordTooLongError)) throw error;
      longRecord = error;
      break;
    }
    if (next.done) break;
    for (const cells of next.value) {
      const last = cells.length - 1;
      if (cells[last]!.endsWith('\r')) cells[last] = cells[last]!.slice(0, -1);
      const line = nextLine;
      nextLine += 1 + lineBreaksInside(cells);
      if (line === 1 && cells[0]?.charCodeAt(0) === 0xfeff) cells[0] = cells[0].slice(1); // BOM
      if (cells.length === 1 && cells[0] === '') continue; // an empty line
      if (columns === null) {
        const header = resolveHeader(cells);
        if (!header.ok) {
          fatal = true;
          for (const p of header.problems) bad(line, p.message);
          break records;
        }
        columns = header.columns;
        width = header.width;
        headerKey = cells.map((c) => c.trim().toLowerCase()).join(',');
        headerFirst = cells[0]?.trim().toLowerCase() ?? '';
        continue;
      }
      if (goodRows + badRowCount >= maxRows) {
        await batches.return(undefined);
        throw new ScreenTooManyRowsError(maxRows);
      }
      if (
        cells[0]?.trim().toLowerCase() === headerFirst &&
        cells.map((c) => c.trim().toLowerCase()).join(',') === headerKey
      ) {
        bad(line, 'a second header in the middle of the file');
        continue;
      }
      if (cells.length !== width) {
        bad(line, `expected ${width} columns, found ${cells.length}`);
        continue;
      }
      const problems = readRow(cells, columns, row, text);
      if (problems.length > 0) {
        // A problem may end with a full stop; joined, that read ".;".
        bad(line, problems.map((m) => m.replace(/\.$/, '')).join('; '));
        continue;
      }
      chunk.lines.push(line);
      chunk.donor.push(text.donor);
      chunk.acceptor.push(text.acceptor);
      chunk.solvent.push(text.solvent);
      for (const key of NUMERIC_KEYS) chunk.values[key][fill] = row[key];
      fill += 1;
      goodRows += 1;
      if (fill === chunkSize) await flush();
    }
  }
  // Stops reading without destroying the stream (an early stop leaves the rest for the caller).
  await batches.return(undefined);
  if (longRecord) {
    fatal = true;
    bad(nextLine, longRecord.message);
  }
  if (!fatal) await flush();
  if (!fatal && columns === null) {
    fatal = true;
    bad(1, 'No data rows found.');
  } else if (!fatal && goodRows === 0 && badRowCount === 0) {
    fatal = true;
    bad(1, 'No data rows found.');
  }
  const units: Record<string, string> = {};
  for (const c of columns ?? []) if (c.unit) units[c.spec.key] = c.unit;
  return { goodRows, badRowCount, badRows, chunks, inputHash: hash.digest('hex'), fatal, units };
}

const PARSE_OPTIONS = { delimiter: ',', newline: '\n' } as const;
/** Longest record accepted; a longer one is nearly always a quote that was never closed. */
export const MAX_RECORD_CHARS = 1 << 20;

class RecordTooLongError extends Error {
  constructor() {
    super(
      `a record longer than ${MAX_RECORD_CHARS / 2 ** 20} MB (is a quote left open?); nothing after it was read`,
    );
  }
}

/**
 * The records of a CSV stream, one batch per piece read. Papa Parse (RFC 4180 quoting) with a
 * comma and LF records fixed, not guessed from the first piece, which may hold no line break
 * yet; the CR of CRLF files is taken off later. A piece's last, possibly unfinished record is
 * carried over to the next piece. The stream is read without being destroyed when the caller
 * stops early, so an HTTP request can still be drained and answered.
 */
async function* csvRecordBatches(source: Readable | string): AsyncGenerator<string[][]> {
  if (typeof source === 'string') {
    yield new Papa.Parser(PARSE_OPTIONS).parse(source, 0, false).data as string[][];
    return;
  }
  const decoder = new StringDecoder('utf8');
  let carry = '';
  for await (const piece of source.iterator({ destroyOnReturn: false })) {
    const text = carry + (typeof piece === 'string' ? piece : decoder.write(piece as Buffer));
    const parsed = new Papa.Parser(PARSE_OPTIONS).parse(text, 0, true);
    carry = text.substring(parsed.meta.cursor as number);
    if (carry.length > MAX_RECORD_CHARS) throw new RecordTooLongError();
    if (parsed.data.length > 0) yield parsed.data as string[][];
  }
  const rest = carry + decoder.end();
  if (rest !== '') yield new Papa.Parser(PARSE_OPTIONS).parse(rest, 0, false).data as string[][];
}

/** Line breaks inside quoted cells (CRLF counts once: its LF). */
function lineBreaksInside(cells: readonly string[]): number {
  let count = 0;
  for (const cell of cells) {
    for (let at = cell.indexOf('\n'); at !== -1; at = cell.indexOf('\n', at + 1)) count += 1;
  }
  return count;
}

function trimChunk(chunk: InputChunk, size: number): InputChunk {
  const values = {} as Record<NumericKey, Float64Array>;
  for (const key of NUMERIC_KEYS) values[key] = chunk.values[key].slice(0, size);
  return { ...chunk, values };
}

/** Compact storage form of a chunk: JSON with columns (null for empty cells). */
export function encodeInputChunk(chunk: InputChunk): string {
  const values: Record<string, Array<number | null>> = {};
  for (const key of NUMERIC_KEYS) {
    const column = chunk.values[key];
    let any = false;
    for (let i = 0; i < column.length; i++)
      if (!Number.isNaN(column[i])) {
        any = true;
        break;
      }
    if (any) values[key] = Array.from(column, (v) => (Number.isNaN(v) ? null : v));
  }
  return JSON.stringify({
    lines: chunk.lines,
    donor: chunk.donor,
    acceptor: chunk.acceptor,
    solvent: chunk.solvent,
    values,
  });
}

export function decodeInputChunk(index: number, text: string): InputChunk {
  const raw = JSON.parse(text) as {
    lines: number[];
    donor: string[];
    acceptor: string[];
    solvent: string[];
    values: Record<string, Array<number | null>>;
  };
  const size = raw.lines.length;
  const values = emptyValues(size);
  for (const key of NUMERIC_KEYS) {
    const column = raw.values[key];
    if (!column) continue;
    const target = values[key];
    for (let i = 0; i < size; i++) target[i] = column[i] ?? Number.NaN;
  }
  return {
    index,
    lines: raw.lines,
    donor: raw.donor,
    acceptor: raw.acceptor,
    solvent: raw.solvent,
    values,
  };
}
