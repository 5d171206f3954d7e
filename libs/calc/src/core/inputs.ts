/**
 * Reads a request's `inputs` strictly (VALIDATION.md, general rules and A3/A4): numbers must be
 * finite JSON numbers, dimensioned inputs are bare canonical numbers or `{ value, unit }` with a
 * unit of the fixed list, and every problem is recorded against its field instead of stopping
 * at the first. Fields the method never reads are reported as unknown, so a misspelt optional
 * input cannot be silently ignored.
 */
import type {
  ArrayOptions,
  CalcWarning,
  FieldError,
  InputReader,
  Quantity,
  ReadOptions,
  WarningSink,
} from './method';
import {
  isReferenceElectrode,
  potentialScaleLabel,
  REFERENCE_ELECTRODES,
  referenceOffsetVsShe,
  samePotentialScale,
  type PotentialScale,
} from './reference-electrodes';
import { canonicalUnit, isUnitFor, toCanonical, unrecognisedUnitMessage } from './units';
import { WARNING_CODES } from './warnings';

/** At most this many element errors are listed per array (VALIDATION.md A16 lists 20). */
const MAX_ELEMENT_ERRORS = 20;

/** Decimal point, optional exponent; no locale commas, no `NaN`, no `Infinity` (VALIDATION.md). */
const STRICT_NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/**
 * Parses a number typed as text (CSV cells, form fields) strictly: `.` as decimal point and an
 * optional exponent. Returns undefined for anything else, and for values that overflow (1e400).
 */
export function parseStrictNumber(text: string): number | undefined {
  const trimmed = text.trim();
  if (!STRICT_NUMBER.test(trimmed)) return undefined;
  const value = Number(trimmed);
  return Number.isFinite(value) ? value : undefined;
}

export function isPlainObject(value: unknown): value is Record<string, unknown> {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) return false;
  const proto = Object.getPrototypeOf(value);
  return proto === Object.prototype || proto === null;
}

/** `Field X is not a finite number.` (VALIDATION.md A3). */
export function notFiniteMessage(field: string): string {
  return `Field ${field} is not a finite number.`;
}

type Parsed =
  | {
      readonly ok: true;
      readonly value: number;
      readonly unit: string;
      readonly scale?: PotentialScale;
    }
  | { readonly ok: false };

function describeBound(bound: number, unit: string): string {
  return unit === '' ? `${bound}` : `${bound} ${unit}`;
}

/** The one `InputReader` of the core; child readers share the error list of their root. */
export class RequestInputReader implements InputReader {
  /** Canonical values of every scalar read, by field path (echoed back to the user). */
  readonly echo: Record<string, number | string> = {};
  private readonly errors: FieldError[];
  private readonly readNames = new Set<string>();
  private readonly typedUnits = new Map<string, string>();
  private readonly scales = new Map<string, PotentialScale>();
  private readonly children: RequestInputReader[] = [];
  private readonly source: Record<string, unknown>;

  constructor(
    source: unknown,
    private readonly prefix = '',
    errors: FieldError[] = [],
  ) {
    this.errors = errors;
    if (isPlainObject(source)) {
      this.source = source;
    } else {
      this.source = {};
      const field = prefix === '' ? 'inputs' : prefix;
      this.errors.push({ field, message: `Field ${field} must be a JSON object.` });
    }
  }

  get failed(): boolean {
    return this.errors.length > 0;
  }

  /** Every error recorded so far, by this reader and its children. */
  get fieldErrors(): readonly FieldError[] {
    return this.errors;
  }

  path(name: string): string {
    return this.prefix === '' ? name : `${this.prefix}.${name}`;
  }

  fail(field: string, message: string): void {
    this.errors.push({ field: this.path(field), message });
  }

  potentialScale(name: string): PotentialScale | undefined {
    return this.scales.get(name);
  }

  /**
   * VALIDATION.md B15: the potentials of one calculation given against different reference
   * electrodes or in different solvents. They were converted to SHE with the published offsets;
   * the warning says so, names both scales and why that is not as good as one reference.
   */
  warnMixedReferences(sink: WarningSink): void {
    const entries = [...this.scales.entries()];
    for (let i = 1; i < entries.length; i++) {
      const [firstName, first] = entries[0]!;
      const [name, scale] = entries[i]!;
      if (samePotentialScale(first, scale)) continue;
      sink.warn(
        WARNING_CODES.referenceElectrode,
        `${this.path(firstName)} is vs ${potentialScaleLabel(first)} but ${this.path(name)} is vs ` +
          `${potentialScaleLabel(scale)}: potentials of one calculation must be vs the same ` +
          'reference electrode in the same solvent. Both were put on the SHE scale with published ' +
          'offsets, which leave a liquid-junction uncertainty of tens of mV between solvents.',
      );
    }
    for (const child of this.children) child.warnMixedReferences(sink);
  }

  unitOf(name: string): string {
    return this.typedUnits.get(name) ?? '';
  }

  raw(name: string): unknown {
    this.readNames.add(name);
    return Object.hasOwn(this.source, name) ? this.source[name] : undefined;
  }

  private has(name: string): boolean {
    return Object.hasOwn(this.source, name) && this.source[name] !== undefined;
  }

  quantity(name: string, quantity: Quantity, opts: ReadOptions = {}): number {
    const value = this.optionalQuantity(name, quantity, opts);
    if (value !== undefined) return value;
    if (opts.defaultValue !== undefined) return opts.defaultValue;
    if (!this.has(name)) this.fail(name, `Field ${this.path(name)} is required.`);
    return Number.NaN;
  }

  optionalQuantity(name: string, quantity: Quantity, opts: ReadOptions = {}): number | undefined {
    const raw = this.raw(name);
    if (raw === undefined) {
      if (opts.defaultValue !== undefined) this.echo[this.path(name)] = opts.defaultValue;
      return undefined;
    }
    const parsed = this.parseQuantity(raw, this.path(name), quantity, true, opts.referenced);
    if (!parsed.ok) return Number.NaN;
    this.typedUnits.set(name, parsed.unit);
    if (parsed.scale) this.scales.set(name, parsed.scale);
    if (!this.checkBounds(parsed.value, name, quantity, opts)) return Number.NaN;
    this.echo[this.path(name)] = parsed.value;
    return parsed.value;
  }

  number(name: string, opts: ReadOptions = {}): number {
    return this.quantity(name, 'dimensionless', opts);
  }

  optionalNumber(name: string, opts: ReadOptions = {}): number | undefined {
    return this.optionalQuantity(name, 'dimensionless', opts);
  }

  integer(name: string, opts: ReadOptions = {}): number {
    const value = this.number(name, opts);
    return this.checkInteger(name, value);
  }

  optionalInteger(name: string, opts: ReadOptions = {}): number | undefined {
    const value = this.optionalNumber(name, opts);
    return value === undefined ? undefined : this.checkInteger(name, value);
  }

  choice<T extends string>(name: string, choices: readonly T[], defaultValue?: T): T {
    const raw = this.raw(name);
    const field = this.path(name);
    if (raw === undefined && defaultValue !== undefined) {
      this.echo[field] = defaultValue;
      return defaultValue;
    }
    if (raw === undefined) {
      this.fail(name, `Field ${field} is required.`);
    } else if (typeof raw !== 'string' || !(choices as readonly string[]).includes(raw)) {
      this.fail(name, `Field ${field} must be one of ${choices.join(', ')}.`);
    } else {
      this.echo[field] = raw;
      return raw as T;
    }
    return (defaultValue ?? choices[0]) as T;
  }

  quantityArray(name: string, quantity: Quantity, opts: ArrayOptions = {}): Float64Array {
    const raw = this.raw(name);
    const field = this.path(name);
    if (raw === undefined) {
      this.fail(name, `Field ${field} is required.`);
      return new Float64Array(0);
    }
    if (ArrayBuffer.isView(raw) && !(raw instanceof DataView)) {
      // Typed arrays (from web workers) are bare canonical numbers.
      return this.typedArrayInput(raw as unknown as ArrayLike<number>, name, opts);
    }
    if (!Array.isArray(raw)) {
      this.fail(name, `Field ${field} must be an array.`);
      return new Float64Array(0);
    }
    if (!this.checkLength(raw.length, name, opts)) return new Float64Array(0);
    const out = new Float64Array(raw.length);
    let bad = 0;
    for (let i = 0; i < raw.length; i++) {
      const element = raw[i];
      // Fast path: a bare finite number is already canonical (gap samples run to 10⁷ elements).
      if (typeof element === 'number' && Number.isFinite(element)) {
        out[i] = element;
        continue;
      }
      const parsed = this.parseQuantity(
        element,
        `${field}[${i}]`,
        quantity,
        bad < MAX_ELEMENT_ERRORS,
      );
      if (parsed.ok) {
        out[i] = parsed.value;
      } else {
        bad++;
      }
    }
    if (bad > MAX_ELEMENT_ERRORS) {
      this.fail(name, `${bad - MAX_ELEMENT_ERRORS} more elements of ${field} are invalid.`);
    }
    return out;
  }

  objectArray(name: string, opts: ArrayOptions = {}): InputReader[] {
    const raw = this.raw(name);
    const field = this.path(name);
    if (raw === undefined) {
      this.fail(name, `Field ${field} is required.`);
      return [];
    }
    if (!Array.isArray(raw)) {
      this.fail(name, `Field ${field} must be an array.`);
      return [];
    }
    if (!this.checkLength(raw.length, name, opts)) return [];
    return raw.map((element, i) => {
      const child = new RequestInputReader(element, `${field}[${i}]`, this.errors);
      this.children.push(child);
      return child;
    });
  }

  quantityMatrix(name: string, quantity: Quantity): number[][] {
    const raw = this.raw(name);
    const field = this.path(name);
    if (raw === undefined) {
      this.fail(name, `Field ${field} is required.`);
      return [];
    }
    if (!Array.isArray(raw) || raw.length === 0 || !raw.every((row) => Array.isArray(row))) {
      this.fail(name, `Field ${field} must be a non-empty array of rows.`);
      return [];
    }
    const width = (raw[0] as unknown[]).length;
    if (width === 0 || raw.some((row) => (row as unknown[]).length !== width)) {
      this.fail(name, `Field ${field} must have rows of equal, non-zero length.`);
      return [];
    }
    return raw.map((row, i) =>
      (row as unknown[]).map((element, j) => {
        const parsed = this.parseQuantity(element, `${field}[${i}][${j}]`, quantity);
        return parsed.ok ? parsed.value : Number.NaN;
      }),
    );
  }

  /** Field paths present in the request that no reader asked for. */
  unknownFields(): string[] {
    const unknown = Object.keys(this.source)
      .filter((key) => !this.readNames.has(key))
      .map((key) => this.path(key));
    return unknown.concat(...this.children.map((child) => child.unknownFields()));
  }

  private parseQuantity(
    raw: unknown,
    field: string,
    quantity: Quantity,
    report = true,
    referenced = false,
  ): Parsed {
    const failWith = (message: string): Parsed => {
      if (report) this.errors.push({ field, message });
      return { ok: false };
    };
    let value: unknown = raw;
    let unit = '';
    let offsetV = 0;
    let scale: PotentialScale | undefined;
    if (isPlainObject(raw)) {
      const scaleKeys = quantity === 'potential' ? ['reference', 'solvent'] : [];
      const extra = Object.keys(raw).filter(
        (key) => key !== 'value' && key !== 'unit' && !scaleKeys.includes(key),
      );
      if (extra.length > 0) {
        return failWith(
          `Field ${field} has unexpected key '${extra[0]}'; give a number or { value, unit }.`,
        );
      }
      if (raw['reference'] !== undefined || raw['solvent'] !== undefined) {
        if (!referenced) {
          return failWith(
            `Field ${field} is a difference of potentials: a reference electrode does not apply.`,
          );
        }
        const reference = raw['reference'];
        const solvent = raw['solvent'];
        if (!isReferenceElectrode(reference)) {
          return failWith(
            `Field ${field}: reference must be one of ${REFERENCE_ELECTRODES.join(', ')}.`,
          );
        }
        if (solvent !== undefined && (typeof solvent !== 'string' || solvent.trim() === '')) {
          return failWith(`Field ${field}: solvent must be a non-empty string.`);
        }
        scale = solvent === undefined ? { reference } : { reference, solvent: solvent.trim() };
        const offset = referenceOffsetVsShe(scale);
        if (!offset.ok) return failWith(`Field ${field}: ${offset.message}`);
        offsetV = offset.offsetV;
      }
      value = raw['value'];
      if (raw['unit'] !== undefined) {
        if (typeof raw['unit'] !== 'string')
          return failWith(`Field ${field}: unit must be a string.`);
        unit = raw['unit'];
      }
    }
    if (typeof value !== 'number' || !Number.isFinite(value))
      return failWith(notFiniteMessage(field));
    if (unit === '' || unit === canonicalUnit(quantity)) {
      const canonical = unit === '' ? value : toCanonical(value, unit, quantity);
      return { ok: true, value: canonical + offsetV, unit, scale };
    }
    if (!isUnitFor(unit, quantity)) return failWith(unrecognisedUnitMessage(unit, quantity));
    if (unit === 'nm' && quantity === 'photonEnergy' && !(value > 0)) {
      return failWith(`Field ${field}: a wavelength must be greater than 0 nm.`);
    }
    const converted = toCanonical(value, unit, quantity) + offsetV;
    if (!Number.isFinite(converted)) {
      return failWith(
        `Field ${field} is out of range after conversion to ${canonicalUnit(quantity)}.`,
      );
    }
    return { ok: true, value: converted, unit, scale };
  }

  private checkBounds(value: number, name: string, quantity: Quantity, opts: ReadOptions): boolean {
    const unit = canonicalUnit(quantity);
    const field = this.path(name);
    const fault = (condition: string): boolean => {
      this.fail(name, opts.message ?? `Field ${field} must be ${condition}.`);
      return false;
    };
    if (opts.greaterThan !== undefined && !(value > opts.greaterThan)) {
      return fault(`greater than ${describeBound(opts.greaterThan, unit)}`);
    }
    if (opts.atLeast !== undefined && !(value >= opts.atLeast)) {
      return fault(`at least ${describeBound(opts.atLeast, unit)}`);
    }
    if (opts.atMost !== undefined && !(value <= opts.atMost)) {
      return fault(`at most ${describeBound(opts.atMost, unit)}`);
    }
    return true;
  }

  private checkInteger(name: string, value: number): number {
    if (Number.isNaN(value) || Number.isInteger(value)) return value;
    this.fail(name, `Field ${this.path(name)} must be an integer.`);
    return Number.NaN;
  }

  private checkLength(length: number, name: string, opts: ArrayOptions): boolean {
    const min = opts.minLength ?? 0;
    if (length >= min) return true;
    this.fail(name, opts.message ?? `Field ${this.path(name)} needs at least ${min} elements.`);
    return false;
  }

  private typedArrayInput(raw: ArrayLike<number>, name: string, opts: ArrayOptions): Float64Array {
    if (!this.checkLength(raw.length, name, opts)) return new Float64Array(0);
    const out = Float64Array.from(raw);
    const field = this.path(name);
    let bad = 0;
    for (let i = 0; i < out.length; i++) {
      if (Number.isFinite(out[i])) continue;
      const element = `${field}[${i}]`;
      if (bad < MAX_ELEMENT_ERRORS)
        this.errors.push({ field: element, message: notFiniteMessage(element) });
      bad++;
    }
    if (bad > MAX_ELEMENT_ERRORS) {
      this.fail(name, `${bad - MAX_ELEMENT_ERRORS} more elements of ${field} are invalid.`);
    }
    return out;
  }
}

/** Collects a method's warnings, each code+message once, in the order raised. */
export class WarningCollector implements WarningSink {
  private readonly items: CalcWarning[] = [];
  private readonly seen = new Set<string>();

  warn(code: string, message: string): void {
    const key = `${code}\u0000${message}`;
    if (this.seen.has(key)) return;
    this.seen.add(key);
    this.items.push({ code, message });
  }

  list(): CalcWarning[] {
    return [...this.items];
  }
}
