/**
 * Streaming parser for energy-gap trace files (plain text or CSV), fed raw bytes chunk by chunk.
 *
 * - Separators: comma, tab or runs of whitespace (detected from the first content line unless
 *   given); `#` comment lines and blank lines are ignored; CRLF and LF both end a line; a UTF-8
 *   byte-order mark is dropped.
 * - An optional header row: the first content line is a header when none of its fields is a
 *   number. The ΔE column is chosen by header name or 1-based index (default: the last column).
 * - Every field of a data row must be a strict number (trace-number.ts); a bad row is reported
 *   with its line number (VALIDATION.md A16–A19). The first 20 bad lines are kept with the total.
 * - Values are converted to eV (the canonical energy unit) with the one units module of the
 *   calculation core and handed to the sink in batches, so nothing grows with the file size.
 */
import { toCanonical } from '@gapwise/calc';
import { TRACE_FILE_UNITS, type TraceFileUnit } from '@gapwise/contracts';
import {
  NOT_A_NUMBER,
  PARSED,
  isNonFiniteWord,
  latin1,
  parseStrictInto,
  readStrictNumber,
} from './trace-number';

export const TRACE_UNITS = TRACE_FILE_UNITS;
export type TraceUnit = TraceFileUnit;

export const TRACE_DELIMITERS = ['auto', 'comma', 'tab', 'whitespace'] as const;
export type TraceDelimiter = (typeof TRACE_DELIMITERS)[number];

/** How a file is read; stored with the trace so an analysis reads it again the same way. */
export interface TraceParseSettings {
  readonly unit: TraceUnit;
  /** Header name, or 1-based column index; null or absent: the last column. */
  readonly column?: string | number | null;
  readonly skipBadLines?: boolean;
  readonly delimiter?: TraceDelimiter;
}

export interface BadLine {
  readonly line: number;
  readonly message: string;
}

/** What a parse found, whether or not the file was accepted. */
export interface TraceParseSummary {
  /** Accepted samples (rows read into the ΔE series). */
  readonly sampleCount: number;
  /** Lines in the (decompressed) file, comments and blanks included. */
  readonly lineCount: number;
  readonly delimiter: Exclude<TraceDelimiter, 'auto'> | null;
  readonly header: string[] | null;
  readonly columnCount: number;
  /** 1-based index of the ΔE column, and its header name when there is a header. */
  readonly columnIndex: number;
  readonly columnName: string | null;
  /** Bad data lines: the first 20 and the total. With skipBadLines these were skipped. */
  readonly badLines: { readonly count: number; readonly first: BadLine[] };
  /** A problem with the settings or the file as a whole (no rows, unknown column). */
  readonly fatal: { readonly field: string; readonly message: string } | null;
  /** Smallest, largest and mean accepted value, eV (null when there are none). */
  readonly minEv: number | null;
  readonly maxEv: number | null;
  readonly meanEv: number | null;
}

/** Receives accepted values in eV; `values` is reused after the call returns. */
export type TraceSink = (values: Float64Array, count: number) => void;

export const MAX_REPORTED_BAD_LINES = 20;
const BATCH_SIZE = 16_384;
const MAX_FIELDS = 1024;
/** A "line" longer than this is not a trace row (binary file, missing newlines). */
export const MAX_LINE_BYTES = 1 << 20;

const LF = 0x0a;
const CR = 0x0d;
const SPACE = 0x20;
const TAB = 0x09;
const COMMA = 0x2c;
const HASH = 0x23;
const QUOTE = 0x22;

export class TraceLineParser {
  private readonly scale: number;
  private readonly skip: boolean;
  private delimiter: Exclude<TraceDelimiter, 'auto'> | null;
  private layoutKnown = false;
  private header: string[] | null = null;
  private columnCount = 0;
  private column = -1; // 0-based
  private fatal: { field: string; message: string } | null = null;
  private lineNo = 0;
  private carry: Buffer | null = null;
  private atStart = true;
  private badCount = 0;
  private readonly badFirst: BadLine[] = [];
  private sampleCount = 0;
  private min = Infinity;
  private max = -Infinity;
  private sum = 0;
  private readonly batch = new Float64Array(BATCH_SIZE);
  private batchLength = 0;
  private readonly fieldStart = new Int32Array(MAX_FIELDS);
  private readonly fieldEnd = new Int32Array(MAX_FIELDS);
  private readonly slot = new Float64Array(1);

  constructor(
    private readonly settings: TraceParseSettings,
    private readonly sink: TraceSink,
  ) {
    if (!(TRACE_UNITS as readonly string[]).includes(settings.unit)) {
      throw new TraceSettingsError(
        'unit',
        `Unrecognised unit '${settings.unit}' for an energy; use one of ${TRACE_UNITS.join(', ')}.`,
      );
    }
    this.scale = toCanonical(1, settings.unit, 'energy');
    this.skip = settings.skipBadLines === true;
    const delimiter = settings.delimiter ?? 'auto';
    if (!(TRACE_DELIMITERS as readonly string[]).includes(delimiter)) {
      throw new TraceSettingsError(
        'delimiter',
        `Delimiter must be one of ${TRACE_DELIMITERS.join(', ')}.`,
      );
    }
    this.delimiter = delimiter === 'auto' ? null : delimiter;
    const column = settings.column;
    if (typeof column === 'number' && (!Number.isInteger(column) || column < 1)) {
      throw new TraceSettingsError(
        'column',
        'Column index must be a whole number ≥ 1 (the first column is 1).',
      );
    }
    if (typeof column === 'string' && column.trim() === '') {
      throw new TraceSettingsError('column', 'Column name must not be empty.');
    }
  }

  /** True once the file cannot be accepted whatever follows (a settings problem). */
  get stopped(): boolean {
    return this.fatal !== null;
  }

  /** Feeds the next chunk of (decompressed) bytes. */
  push(chunk: Uint8Array): void {
    if (this.fatal) return;
    let buf = Buffer.isBuffer(chunk)
      ? chunk
      : Buffer.from(chunk.buffer, chunk.byteOffset, chunk.byteLength);
    let pos = 0;
    if (this.atStart) {
      if (this.carry) {
        buf = Buffer.concat([this.carry, buf]);
        this.carry = null;
      }
      if (buf.length < 3 && buf.indexOf(LF) < 0) {
        this.carry = Buffer.from(buf);
        return;
      }
      this.atStart = false;
      if (buf[0] === 0xef && buf[1] === 0xbb && buf[2] === 0xbf) pos = 3;
    }
    if (this.carry) {
      const nl = buf.indexOf(LF, pos);
      if (nl < 0) {
        this.appendCarry(buf, pos, buf.length);
        return;
      }
      const line = Buffer.concat([this.carry, buf.subarray(pos, nl)]);
      this.carry = null;
      this.processLine(line, 0, line.length);
      pos = nl + 1;
    }
    while (pos < buf.length && !this.fatal) {
      const nl = buf.indexOf(LF, pos);
      if (nl < 0) {
        this.appendCarry(buf, pos, buf.length);
        return;
      }
      this.processLine(buf, pos, nl);
      pos = nl + 1;
    }
  }

  /** Ends the input and returns what was found. */
  finish(): TraceParseSummary {
    if (!this.fatal && this.carry && this.carry.length > 0) {
      const line = this.carry;
      this.carry = null;
      this.processLine(line, 0, line.length);
    }
    this.flush();
    if (!this.fatal && this.sampleCount === 0 && this.badCount === 0) {
      this.fatal = { field: 'file', message: 'No data rows found.' };
    }
    if (!this.fatal && this.sampleCount === 0 && this.skip) {
      this.fatal = { field: 'file', message: 'No valid data rows found: every data line was bad.' };
    }
    const n = this.sampleCount;
    return {
      sampleCount: n,
      lineCount: this.lineNo,
      delimiter: this.delimiter,
      header: this.header,
      columnCount: this.columnCount,
      columnIndex: this.column + 1,
      columnName: this.header && this.column >= 0 ? (this.header[this.column] ?? null) : null,
      badLines: { count: this.badCount, first: [...this.badFirst] },
      fatal: this.fatal,
      minEv: n > 0 ? this.min : null,
      maxEv: n > 0 ? this.max : null,
      meanEv: n > 0 ? this.sum / n : null,
    };
  }

  private appendCarry(buf: Buffer, start: number, end: number): void {
    const piece = buf.subarray(start, end);
    this.carry = this.carry ? Buffer.concat([this.carry, piece]) : Buffer.from(piece);
    if (this.carry.length > MAX_LINE_BYTES) {
      this.fatal = {
        field: 'file',
        message: `Line ${this.lineNo + 1} is longer than ${MAX_LINE_BYTES} bytes: not a text trace file.`,
      };
      this.carry = null;
    }
  }

  private processLine(buf: Uint8Array, start: number, end: number): void {
    const lineNo = ++this.lineNo;
    if (end > start && buf[end - 1] === CR) end--;
    let p = start;
    while (p < end && (buf[p] === SPACE || buf[p] === TAB)) p++;
    if (p === end || buf[p] === HASH) return;
    if (!this.layoutKnown) {
      if (this.detectLayout(buf, p, end, lineNo)) return;
      if (this.fatal) return;
    }
    const count = this.splitFields(buf, p, end);
    if (count !== this.columnCount) {
      this.bad(
        lineNo,
        `Line ${lineNo}: expected ${this.columnCount} column${this.columnCount === 1 ? '' : 's'}${this.describeColumns()}, found ${count}.`,
      );
      return;
    }
    const slot = this.slot;
    let value = 0;
    for (let f = 0; f < count; f++) {
      const s = this.fieldStart[f];
      const e = this.fieldEnd[f];
      if (s === e) {
        this.bad(lineNo, `Line ${lineNo}: empty value in column ${f + 1}.`);
        return;
      }
      if (parseStrictInto(buf, s, e, slot) !== PARSED) {
        if (this.isHeaderRepeat(buf, count)) {
          this.bad(lineNo, `Line ${lineNo}: a second header row in the middle of the data.`);
          return;
        }
        const text = latin1(buf, s, Math.min(e, s + 40));
        if (isNonFiniteWord(text)) this.bad(lineNo, `Line ${lineNo}: non-finite value.`);
        else this.bad(lineNo, `Line ${lineNo}: '${text}' is not a number.`);
        return;
      }
      const v = slot[0];
      if (v === Infinity || v === -Infinity) {
        this.bad(lineNo, `Line ${lineNo}: non-finite value.`);
        return;
      }
      if (f === this.column) value = v;
    }
    // Accept (inlined: a double passed to a call may be boxed).
    if (this.badCount > 0 && !this.skip) return; // refused anyway: keep scanning for bad lines only
    const ev = value * this.scale;
    this.sampleCount++;
    this.sum += ev;
    if (ev < this.min) this.min = ev;
    if (ev > this.max) this.max = ev;
    this.batch[this.batchLength++] = ev;
    if (this.batchLength === BATCH_SIZE) this.flush();
  }

  private flush(): void {
    if (this.batchLength > 0) {
      this.sink(this.batch, this.batchLength);
      this.batchLength = 0;
    }
  }

  private bad(line: number, message: string): void {
    this.badCount++;
    if (this.badFirst.length < MAX_REPORTED_BAD_LINES) this.badFirst.push({ line, message });
  }

  private describeColumns(): string {
    return this.header ? ` (${this.header.join(',')})` : '';
  }

  /**
   * Splits a line (leading whitespace already skipped) into the field offset arrays; returns the
   * field count. Fields are trimmed of blanks and of one pair of surrounding double quotes.
   */
  private splitFields(buf: Uint8Array, start: number, end: number): number {
    let count = 0;
    if (this.delimiter === 'whitespace') {
      let p = start;
      while (p < end) {
        while (p < end && (buf[p] === SPACE || buf[p] === TAB)) p++;
        if (p === end) break;
        const s = p;
        while (p < end && buf[p] !== SPACE && buf[p] !== TAB) p++;
        if (count < MAX_FIELDS) this.setField(buf, count, s, p);
        count++;
      }
      return count;
    }
    const sep = this.delimiter === 'comma' ? COMMA : TAB;
    let s = start;
    for (let p = start; p < end; p++) {
      if (buf[p] === sep) {
        if (count < MAX_FIELDS) this.setField(buf, count, s, p);
        count++;
        s = p + 1;
      }
    }
    if (count < MAX_FIELDS) this.setField(buf, count, s, end);
    count++;
    return count;
  }

  /** Records field `f` as bytes [a, b), trimmed of blanks and of one pair of double quotes. */
  private setField(buf: Uint8Array, f: number, a: number, b: number): void {
    while (a < b && (buf[a] === SPACE || buf[a] === TAB)) a++;
    while (b > a && (buf[b - 1] === SPACE || buf[b - 1] === TAB)) b--;
    if (b - a >= 2 && buf[a] === QUOTE && buf[b - 1] === QUOTE) {
      a++;
      b--;
    }
    this.fieldStart[f] = a;
    this.fieldEnd[f] = b;
  }

  private isHeaderRepeat(buf: Uint8Array, count: number): boolean {
    if (!this.header || count !== this.header.length) return false;
    for (let f = 0; f < count; f++) {
      if (latin1(buf, this.fieldStart[f], this.fieldEnd[f]) !== this.header[f]) return false;
    }
    return true;
  }

  /** Reads the first content line: separator, header, column. Returns true when it was a header. */
  private detectLayout(buf: Uint8Array, start: number, end: number, lineNo: number): boolean {
    this.layoutKnown = true;
    if (this.delimiter === null) {
      let comma = false;
      let tab = false;
      let space = false;
      for (let p = start; p < end; p++) {
        if (buf[p] === COMMA) comma = true;
        else if (buf[p] === TAB) tab = true;
        else if (buf[p] === SPACE) space = true;
      }
      this.delimiter = comma ? 'comma' : tab && !space ? 'tab' : 'whitespace';
    }
    const count = this.splitFields(buf, start, end);
    if (count > MAX_FIELDS) {
      this.fatal = { field: 'file', message: `Line ${lineNo}: more than ${MAX_FIELDS} columns.` };
      return false;
    }
    this.columnCount = count;
    let numeric = 0;
    for (let f = 0; f < count; f++) {
      const s = this.fieldStart[f];
      const e = this.fieldEnd[f];
      const text = latin1(buf, s, e);
      if (s < e && (readStrictNumber(buf, s, e) !== NOT_A_NUMBER || isNonFiniteWord(text)))
        numeric++;
    }
    const isHeader = numeric === 0;
    if (isHeader) {
      this.header = [];
      for (let f = 0; f < count; f++) {
        this.header.push(
          Buffer.from(buf.subarray(this.fieldStart[f], this.fieldEnd[f])).toString('utf8'),
        );
      }
    }
    this.chooseColumn();
    return isHeader;
  }

  private chooseColumn(): void {
    const column = this.settings.column;
    if (column === undefined || column === null) {
      this.column = this.columnCount - 1;
      return;
    }
    if (typeof column === 'number') {
      if (column > this.columnCount) {
        this.fatal = {
          field: 'column',
          message: `Column ${column} does not exist: the file has ${this.columnCount} column${this.columnCount === 1 ? '' : 's'}${this.describeColumns()}.`,
        };
        return;
      }
      this.column = column - 1;
      return;
    }
    if (!this.header) {
      this.fatal = {
        field: 'column',
        message: `Column '${column}' was asked for by name but the file has no header row; give its number instead.`,
      };
      return;
    }
    let index = this.header.indexOf(column);
    if (index < 0) index = this.header.findIndex((h) => h.toLowerCase() === column.toLowerCase());
    if (index < 0) {
      this.fatal = {
        field: 'column',
        message: `Column '${column}' is not in the header (${this.header.join(',')}).`,
      };
      return;
    }
    this.column = index;
  }
}

/** A setting that cannot work for any file (unknown unit, column 0). */
export class TraceSettingsError extends Error {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message);
    this.name = 'TraceSettingsError';
  }
}

/**
 * Reads a column setting as typed in a form field, query string or command line: digits mean a
 * 1-based index, anything else a header name; empty means "the last column".
 */
export function readColumnSetting(raw: unknown): string | number | null {
  if (raw === undefined || raw === null) return null;
  if (typeof raw === 'number') return raw;
  const text = String(raw).trim();
  if (text === '') return null;
  return /^\d+$/.test(text) ? Number(text) : text;
}
