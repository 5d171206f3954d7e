/**
 * `uncertainty.monteCarlo`: propagates input uncertainties through any other method by seeded
 * Monte Carlo sampling, reporting median and 95 % interval of every numeric output.
 */
import seedrandom from 'seedrandom';

import { isPlainObject } from '../../core/inputs';
import {
  CalcRefusal,
  type CalcAnswer,
  type CalcOutputs,
  type InputReader,
  type MethodDefinition,
  type WarningSink,
} from '../../core/method';
import { internalError, runDefinition } from '../../core/run-definition';
import {
  freedmanDiaconisHistogram,
  percentileSorted,
  type Histogram,
} from '../../gap/histogram/histogram';

const SELF_ID = 'uncertainty.monteCarlo';
const MAX_SAMPLES = 200_000;
/**
 * Work limit: samples × the cost of one inner run, counted in MLJ vibronic terms (an inner method
 * that reports `termsUsed`) or as 1 otherwise. A term costs 70–200 ns of one CPU (idle machine
 * to one loaded by a test suite; measured on Node 20), so 2e7 terms stay within the default 10 s
 * budget. Checked after the nominal run, before any sample is drawn; over it the request is
 * refused naming `samples`.
 */
export const MONTE_CARLO_MAX_WORK = 2e7;
const DEFAULT_SAMPLES = 10_000;
/** Outputs whose distributions are also returned as histograms. */
const HISTOGRAM_OUTPUTS = ['log10k'];

/** A distribution found in the inner inputs, at a path of keys/indices. */
export type Distribution =
  | { readonly kind: 'normal'; readonly mean: number; readonly sigma: number }
  | { readonly kind: 'uniform'; readonly low: number; readonly high: number };

export interface UncertainInput {
  readonly path: readonly (string | number)[];
  readonly distribution: Distribution;
  /** Unit to attach to each drawn value ('' = canonical bare number). */
  readonly unit: string;
}

/**
 * How Monte Carlo finds the method it samples. The registry passes its own lookup in, so this
 * module imports neither the registry nor the dispatcher (no import cycle through the families).
 */
export type MethodLookup = (id: string) => MethodDefinition<any> | undefined;

export interface MonteCarloInputs {
  readonly method: string;
  /** The definition of `method`, found by the lookup when the request was read. */
  readonly definition: MethodDefinition<any> | undefined;
  /** The inner inputs with every distribution replaced by its centre (nominal request). */
  readonly nominalInputs: unknown;
  readonly uncertain: readonly UncertainInput[];
  readonly samples: number;
  readonly seed: number;
}

export interface OutputSummary {
  readonly median: number;
  readonly p025: number;
  readonly p975: number;
  readonly mean: number;
  readonly sd: number;
  readonly min: number;
  readonly max: number;
}

/**
 * Normal deviates by the Box–Muller transform, both members of each pair used, from a seeded
 * uniform generator (so a seed reproduces every draw).
 * References: G. E. P. Box, M. E. Muller, Ann. Math. Stat. 1958, 29, 610
 * (doi 10.1214/aoms/1177706645).
 */
export class SeededSampler {
  private readonly uniform: () => number;
  private spare: number | undefined;

  /** xor4096 (R. P. Brent's xorgens) from `seedrandom`, seeded by the decimal string of `seed`. */
  constructor(seed: number) {
    this.uniform = seedrandom.xor4096(String(seed));
  }

  /** Uniform on [0, 1). */
  next(): number {
    return this.uniform();
  }

  standardNormal(): number {
    if (this.spare !== undefined) {
      const value = this.spare;
      this.spare = undefined;
      return value;
    }
    const radius = Math.sqrt(-2 * Math.log(1 - this.uniform())); // 1 − u ∈ (0, 1]
    const angle = 2 * Math.PI * this.uniform();
    this.spare = radius * Math.sin(angle);
    return radius * Math.cos(angle);
  }

  draw(distribution: Distribution): number {
    return distribution.kind === 'normal'
      ? distribution.mean + distribution.sigma * this.standardNormal()
      : distribution.low + (distribution.high - distribution.low) * this.uniform();
  }
}

/** Median, 2.5 % and 97.5 % points (linear interpolation, type 7), mean, sd, min, max. */
export function summarise(values: Float64Array): OutputSummary {
  const sorted = values.slice().sort();
  const n = sorted.length;
  let sum = 0;
  for (let i = 0; i < n; i++) sum += sorted[i];
  const mean = sum / n;
  let squares = 0;
  for (let i = 0; i < n; i++) squares += (sorted[i] - mean) ** 2;
  return {
    median: percentileSorted(sorted, 0.5),
    p025: percentileSorted(sorted, 0.025),
    p975: percentileSorted(sorted, 0.975),
    mean,
    sd: n > 1 ? Math.sqrt(squares / (n - 1)) : 0,
    min: sorted[0],
    max: sorted[n - 1],
  };
}

/** Top-level numeric outputs, and numbers one level down as `parent.child`. */
export function numericOutputs(outputs: CalcOutputs): Map<string, number> {
  const found = new Map<string, number>();
  for (const [name, value] of Object.entries(outputs)) {
    if (typeof value === 'number') found.set(name, value);
    else if (isPlainObject(value)) {
      for (const [child, inner] of Object.entries(value)) {
        if (typeof inner === 'number') found.set(`${name}.${child}`, inner);
      }
    }
  }
  return found;
}

function setAtPath(target: unknown, path: readonly (string | number)[], value: unknown): void {
  let node = target as Record<string | number, unknown>;
  for (let i = 0; i < path.length - 1; i++)
    node = node[path[i]] as Record<string | number, unknown>;
  node[path[path.length - 1]] = value;
}

function deepCopy<T>(value: T): T {
  if (Array.isArray(value)) return value.map(deepCopy) as T;
  if (isPlainObject(value)) {
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(value)) out[k] = deepCopy(v);
    return out as T;
  }
  return value;
}

function pathName(path: readonly (string | number)[]): string {
  return path.reduce<string>(
    (name, key) =>
      typeof key === 'number' ? `${name}[${key}]` : name === '' ? key : `${name}.${key}`,
    '',
  );
}

const finite = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x);

/**
 * Finds `{ value, sigma }` (normal) and `{ low, high }` (uniform) leaves in the inner inputs,
 * replaces each by its centre (mean, or midpoint) in a copy, and records every malformed one.
 */
export function extractDistributions(
  inner: Record<string, unknown>,
  fail: (field: string, message: string) => void,
): { nominal: Record<string, unknown>; uncertain: UncertainInput[] } {
  const nominal = deepCopy(inner);
  const uncertain: UncertainInput[] = [];
  const visit = (node: unknown, path: (string | number)[]) => {
    if (Array.isArray(node)) {
      node.forEach((child, i) => visit(child, [...path, i]));
      return;
    }
    if (!isPlainObject(node)) return;
    const isNormal = 'sigma' in node;
    const isUniform = 'low' in node || 'high' in node;
    if (!isNormal && !isUniform) {
      for (const [key, child] of Object.entries(node)) visit(child, [...path, key]);
      return;
    }
    const field = `inputs.${pathName(path)}`;
    const unit = node['unit'];
    if (unit !== undefined && typeof unit !== 'string') {
      fail(field, 'unit must be a string.');
      return;
    }
    const allowed = isNormal ? ['value', 'sigma', 'unit'] : ['low', 'high', 'unit'];
    const extra = Object.keys(node).filter((key) => !allowed.includes(key));
    if (extra.length > 0 || (isNormal && isUniform)) {
      fail(
        field,
        'Give either { value, sigma } (normal) or { low, high } (uniform), with an optional unit.',
      );
      return;
    }
    let distribution: Distribution;
    if (isNormal) {
      const { value, sigma } = node;
      if (!finite(value) || !finite(sigma) || sigma < 0) {
        fail(field, 'A normal input needs a finite value and a finite sigma ≥ 0.');
        return;
      }
      distribution = { kind: 'normal', mean: value, sigma };
    } else {
      const { low, high } = node;
      if (!finite(low) || !finite(high) || !(high > low)) {
        fail(field, 'A uniform input needs finite low < high.');
        return;
      }
      distribution = { kind: 'uniform', low, high };
    }
    const centre =
      distribution.kind === 'normal'
        ? distribution.mean
        : (distribution.low + distribution.high) / 2;
    setAtPath(nominal, path, unit === undefined ? centre : { value: centre, unit });
    uncertain.push({ path, distribution, unit: unit ?? '' });
  };
  visit(inner, []);
  return { nominal, uncertain };
}

function readMonteCarlo(reader: InputReader, findMethod: MethodLookup): MonteCarloInputs {
  const method = reader.raw('method');
  let methodId = '';
  if (typeof method !== 'string') {
    reader.fail(
      'method',
      'Field method is required: the id of the method to sample, e.g. rate.marcus.',
    );
  } else if (method === SELF_ID) {
    reader.fail('method', 'uncertainty.monteCarlo cannot sample itself.');
  } else if (findMethod(method) === undefined) {
    reader.fail('method', `Unknown method '${method}'.`);
  } else {
    methodId = method;
  }
  const inner = reader.raw('inputs');
  let nominalInputs: unknown = {};
  let uncertain: UncertainInput[] = [];
  if (!isPlainObject(inner)) {
    reader.fail('inputs', 'Field inputs must be a JSON object: the inner method’s inputs.');
  } else {
    ({ nominal: nominalInputs, uncertain } = extractDistributions(inner, (field, message) =>
      reader.fail(field, message),
    ));
  }
  const samples =
    reader.optionalInteger('samples', {
      atLeast: 10,
      atMost: MAX_SAMPLES,
      message: `Samples must be an integer from 10 to ${MAX_SAMPLES}.`,
    }) ?? DEFAULT_SAMPLES;
  const seed = reader.optionalInteger('seed') ?? 1;
  const definition = methodId === '' ? undefined : findMethod(methodId);
  return { method: methodId, definition, nominalInputs, uncertain, samples, seed };
}

/**
 * Monte Carlo propagation of input uncertainty through method `method`.
 *
 * Method: the nominal request (each distribution at its centre) must be accepted; then `samples`
 * requests are drawn, each input in a fixed order from one seeded generator (normal by
 * Box–Muller, uniform by scaling), and run through the dispatcher. Samples the inner method
 * refuses are left out and counted (warning). Each numeric output (and numbers one level inside
 * an object output, as `parent.child`) is summarised by its median, 2.5 % and 97.5 % points
 * (type-7 interpolation), mean, sd, min and max; `log10k` also as a Freedman–Diaconis histogram.
 * Notes: the interval is a percentile interval of the propagated distribution, not a confidence
 * interval of the estimate; its own sampling error shrinks as 1/√samples.
 * References: JCGM 101:2008, Evaluation of measurement data — Supplement 1 to the "Guide to the
 * expression of uncertainty in measurement" — Propagation of distributions using a Monte Carlo
 * method, BIPM, 2008; Box & Muller 1958 (above).
 */
/**
 * What `uncertainty.monteCarlo` answers: one summary per numeric output of the inner method (by
 * its name, `parent.child` for numbers inside an object output), the histograms and the counts.
 */
export type MonteCarloOutputs = {
  readonly histograms: Partial<Record<string, Histogram>>;
  readonly samplesUsed: number;
  readonly samplesRefused: number;
} & { readonly [output: string]: OutputSummary | unknown };

/** Runs the sampled method on one request; never throws (as the dispatcher). */
function runInner(definition: MethodDefinition<any>, rawInputs: unknown): CalcAnswer {
  try {
    return runDefinition(definition, rawInputs);
  } catch (thrown) {
    return internalError('method', thrown);
  }
}

export function runMonteCarlo(inputs: MonteCarloInputs, warnings: WarningSink): MonteCarloOutputs {
  const definition = inputs.definition;
  if (definition === undefined) {
    throw new CalcRefusal([{ field: 'method', message: `Unknown method '${inputs.method}'.` }]);
  }
  const nominal = runInner(definition, inputs.nominalInputs);
  if (!nominal.ok) {
    throw new CalcRefusal(
      nominal.errors.map((e) => ({ field: `inputs.${e.field}`, message: e.message })),
    );
  }
  if (inputs.uncertain.length === 0) {
    warnings.warn(
      'monte-carlo-no-uncertainty',
      'No input carries { value, sigma } or { low, high }.',
    );
  }
  const termsUsed = (nominal.outputs as Record<string, unknown>)['termsUsed'];
  const costPerSample = typeof termsUsed === 'number' && termsUsed > 1 ? termsUsed : 1;
  if (inputs.samples * costPerSample > MONTE_CARLO_MAX_WORK) {
    const most = Math.max(0, Math.floor(MONTE_CARLO_MAX_WORK / costPerSample));
    throw new CalcRefusal([
      {
        field: 'samples',
        message:
          `${inputs.samples.toLocaleString('en-US')} samples of ${inputs.method} at ` +
          `${costPerSample.toLocaleString('en-US')} vibronic terms each exceed the work limit of ` +
          `${MONTE_CARLO_MAX_WORK.toExponential(0)} terms: use at most ` +
          `${most.toLocaleString('en-US')} samples, or a larger ħω.`,
      },
    ]);
  }
  const names = [...numericOutputs(nominal.outputs).keys()];
  const columns = new Map(names.map((name) => [name, new Float64Array(inputs.samples)]));
  const sampler = new SeededSampler(inputs.seed);
  const innerWarnings = new Map<string, { message: string; count: number }>();
  let used = 0;
  let refused = 0;
  let firstReason = '';
  for (let s = 0; s < inputs.samples; s++) {
    const request = deepCopy(inputs.nominalInputs);
    for (const input of inputs.uncertain) {
      const value = sampler.draw(input.distribution);
      setAtPath(request, input.path, input.unit === '' ? value : { value, unit: input.unit });
    }
    const answer = runInner(definition, request);
    if (!answer.ok) {
      refused++;
      firstReason ||= `${answer.errors[0]?.field}: ${answer.errors[0]?.message}`;
      continue;
    }
    const values = numericOutputs(answer.outputs);
    for (const name of names) columns.get(name)![used] = values.get(name) ?? Number.NaN;
    used++;
    for (const w of answer.warnings) {
      const seen = innerWarnings.get(w.code);
      if (seen) seen.count++;
      else innerWarnings.set(w.code, { message: w.message, count: 1 });
    }
  }
  if (used === 0) {
    throw new CalcRefusal([
      {
        field: 'inputs',
        message: `Every sample was refused by ${inputs.method} (${firstReason}).`,
      },
    ]);
  }
  if (refused > 0) {
    warnings.warn(
      'monte-carlo-samples-refused',
      `${refused} of ${inputs.samples} samples were refused by ${inputs.method} and left out ` +
        `(first: ${firstReason}).`,
    );
  }
  for (const [code, { message, count }] of innerWarnings) {
    warnings.warn(code, `In ${count} of ${used} samples: ${message}`);
  }
  const outputs: Record<string, unknown> = {};
  const histograms: Record<string, Histogram> = {};
  for (const name of names) {
    const column = columns.get(name)!.subarray(0, used).filter(Number.isFinite);
    if (column.length === 0) continue;
    outputs[name] = summarise(column);
    if (HISTOGRAM_OUTPUTS.includes(name) && column.length >= 20) {
      const { edges, counts } = freedmanDiaconisHistogram(column);
      if (edges.length > 0) histograms[name] = { edges, counts };
    }
  }
  return { ...outputs, histograms, samplesUsed: used, samplesRefused: refused };
}

/**
 * The `uncertainty.monteCarlo` method, sampling methods found by `findMethod` (the registry's
 * lookup; see `methods/registry.ts`).
 */
export const createMonteCarloMethod = (
  findMethod: MethodLookup,
): MethodDefinition<MonteCarloInputs> => ({
  id: SELF_ID,
  summary:
    'Seeded Monte Carlo propagation of { value, sigma } and { low, high } inputs through another ' +
    'method: median and 95 % interval of each output.',
  references: [
    'JCGM 101:2008, Propagation of distributions using a Monte Carlo method, BIPM, 2008.',
    'G. E. P. Box, M. E. Muller, Ann. Math. Stat. 1958, 29, 610. doi:10.1214/aoms/1177706645',
  ],
  inputs: [
    {
      name: 'method',
      quantity: 'string',
      required: true,
      description: 'Id of the method to sample.',
    },
    {
      name: 'inputs',
      quantity: 'object',
      required: true,
      description:
        'Its inputs; uncertain ones as { value, sigma[, unit] } or { low, high[, unit] }.',
    },
    {
      name: 'samples',
      quantity: 'integer',
      required: false,
      defaultValue: DEFAULT_SAMPLES,
      description: `Number of samples (10–${MAX_SAMPLES}).`,
    },
    {
      name: 'seed',
      quantity: 'integer',
      required: false,
      defaultValue: 1,
      description: 'Seed; the same seed reproduces the result exactly.',
    },
  ],
  outputs: [
    {
      name: '<output>',
      unit: 'as the inner method',
      description: '{ median, p025, p975, mean, sd, min, max } per numeric output.',
    },
    {
      name: 'histograms',
      unit: '',
      description: '{ log10k: { edges, counts } } when the inner method gives log10k.',
    },
    { name: 'samplesUsed', unit: '', description: 'Samples the inner method accepted.' },
    { name: 'samplesRefused', unit: '', description: 'Samples it refused (left out).' },
  ],
  read: (reader) => readMonteCarlo(reader, findMethod),
  compute: runMonteCarlo,
});
