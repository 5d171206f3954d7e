/**
 * The shape every calculation method of the core follows. The dispatcher (`calculate`), the
 * command line's `--help`, the HTTP API's documentation and the web forms are all generated from
 * the one registry of `MethodDefinition`s, so there is never a second list to keep in step.
 */

import type { PotentialScale } from './reference-electrodes';

/** One refused field: `field` is the input's name as the request spells it (dotted for nested). */
export interface FieldError {
  readonly field: string;
  readonly message: string;
}

/** A valid-but-suspicious condition; `code` is stable kebab-case (VALIDATION.md part B). */
export interface CalcWarning {
  readonly code: string;
  readonly message: string;
}

export interface CalcRequest {
  readonly method: string;
  readonly inputs: unknown;
}

export type CalcOutputs = Record<string, unknown>;

export type CalcAnswer =
  | {
      readonly ok: true;
      readonly method: string;
      readonly outputs: CalcOutputs;
      readonly warnings: CalcWarning[];
    }
  | { readonly ok: false; readonly errors: FieldError[] };

/** Physical kinds of input, each with one canonical unit (CALC-API.md). */
export type Quantity =
  | 'energy' // eV
  | 'photonEnergy' // eV; an energy of light, also accepted as a wavelength in nm (E = hc/λ)
  | 'distance' // Å
  | 'temperature' // K
  | 'potential' // V
  | 'dipole' // debye
  | 'time' // s
  | 'viscosity' // Pa s
  | 'wavenumber' // cm⁻¹ (band positions and widths)
  | 'molarAbsorptivity' // M⁻¹ cm⁻¹
  | 'inverseDistance' // Å⁻¹
  | 'rateFirstOrder' // s⁻¹
  | 'rateSecondOrder' // M⁻¹ s⁻¹
  | 'dimensionless'
  | 'integer'
  | 'string'
  | 'array'
  | 'object';

/** Describes one input for help text, API docs and forms. */
export interface InputSpec {
  readonly name: string;
  readonly quantity: Quantity;
  readonly required: boolean;
  readonly description: string;
  /**
   * Short name for people (report provenance, forms): "Donor radius a_D". When absent, the
   * description up to its first parenthesis, full stop, colon or semicolon (see `inputLabel`).
   */
  readonly label?: string;
  /** Default used when an optional input is absent (canonical unit). */
  readonly defaultValue?: number | string;
  /**
   * A potential on an electrode scale: accepts `{ value, unit, reference, solvent }` and is
   * converted to SHE (`core/reference-electrodes.ts`). Absent for potential differences.
   */
  readonly referenced?: boolean;
}

/** Describes one output: canonical unit (or '' for dimensionless / classifications). */
export interface OutputSpec {
  readonly name: string;
  readonly unit: string;
  readonly description: string;
}

/**
 * Reads and converts request fields, collecting every problem instead of stopping at the first.
 * Each reader returns the value in the canonical unit, or NaN (or an empty value) after recording
 * an error for that field; the dispatcher refuses the request if any error was recorded.
 */
export interface InputReader {
  /** A dimensioned number: a bare number in the canonical unit, or `{ value, unit }`. */
  quantity(name: string, quantity: Quantity, opts?: ReadOptions): number;
  /** Same, for an optional field: `undefined` when absent. */
  optionalQuantity(name: string, quantity: Quantity, opts?: ReadOptions): number | undefined;
  /** A plain finite number (no unit). */
  number(name: string, opts?: ReadOptions): number;
  optionalNumber(name: string, opts?: ReadOptions): number | undefined;
  /** An integer within the given bounds. */
  integer(name: string, opts?: ReadOptions): number;
  optionalInteger(name: string, opts?: ReadOptions): number | undefined;
  /** A string from a fixed list. */
  choice<T extends string>(name: string, choices: readonly T[], defaultValue?: T): T;
  /** An array of dimensioned numbers (each element a number or `{value, unit}`). */
  quantityArray(name: string, quantity: Quantity, opts?: ArrayOptions): Float64Array;
  /** The raw value of a field, for methods with nested structures. */
  raw(name: string): unknown;
  /** Records an error directly (for cross-field rules). */
  fail(field: string, message: string): void;
  /**
   * The reference electrode (and solvent) a potential was given against, when the request named
   * one (only inputs read with `referenced: true`); the value read is then vs SHE.
   */
  potentialScale(name: string): PotentialScale | undefined;
  /** Whether any error has been recorded so far. */
  readonly failed: boolean;
  /** The typed unit of a dimensioned input, as given ('' when a bare number). */
  unitOf(name: string): string;
  /**
   * Readers for each element of an array of objects (e.g. `neighbors`, `points`); their errors
   * name the element (`neighbors[2].distance`) and land in the same list.
   */
  objectArray(name: string, opts?: ArrayOptions): InputReader[];
  /** A matrix (array of equal-length rows) of dimensioned numbers, converted element-wise. */
  quantityMatrix(name: string, quantity: Quantity): number[][];
}

export interface ReadOptions {
  /** Strict lower bound (value must be > this). */
  readonly greaterThan?: number;
  /** Inclusive lower bound (value must be ≥ this). */
  readonly atLeast?: number;
  /** Inclusive upper bound. */
  readonly atMost?: number;
  /** Message to use when a bound fails (VALIDATION.md wording). */
  readonly message?: string;
  readonly defaultValue?: number;
  /**
   * For potentials on an electrode scale: accept `reference` (and `solvent`) and convert the value
   * to SHE. Without it a `reference` is refused (the input is a potential difference).
   */
  readonly referenced?: boolean;
}

export interface ArrayOptions {
  readonly minLength?: number;
  readonly message?: string;
}

/** Collects warnings while a method computes. */
export interface WarningSink {
  warn(code: string, message: string): void;
}

/**
 * Thrown by a method's `compute` when the inputs are individually valid but jointly refused
 * (e.g. 2|H_AB| ≥ λ). The dispatcher turns it into `{ ok: false, errors }`.
 */
export class CalcRefusal extends Error {
  constructor(readonly errors: FieldError[]) {
    super(errors.map((e) => `${e.field}: ${e.message}`).join('; '));
    this.name = 'CalcRefusal';
  }
}

export interface MethodDefinition<I = unknown> {
  /** Stable id of CALC-API.md, e.g. `rate.marcus`. */
  readonly id: string;
  /** One line for help text. */
  readonly summary: string;
  /** Published sources of the formulas (full citations). */
  readonly references: readonly string[];
  readonly inputs: readonly InputSpec[];
  readonly outputs: readonly OutputSpec[];
  /** Reads the request's inputs through the reader (which records every field error). */
  read(reader: InputReader): I;
  /** Computes outputs from valid, canonical inputs; may warn, may throw `CalcRefusal`. */
  compute(inputs: I, warnings: WarningSink): CalcOutputs;
}
