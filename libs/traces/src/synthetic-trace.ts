/**
 * Seeded synthetic energy-gap traces with known parameters, for tests, the benchmark, the demo
 * seed and the browser test. Never used on user data.
 *
 * Samples follow a stationary AR(1) process x_t = μ + φ(x_{t−1} − μ) + σ√(1 − φ²) ε_t with
 * standard normal ε (Box–Muller on a seeded `alea` generator), so the marginal law is N(μ, σ²)
 * and the statistical inefficiency is (1 + φ)/(1 − φ) — known in advance, independent of the code
 * under test. In the linear-response (Marcus) picture a state sampled at temperature T has
 * μ_R = ΔG° + λ, μ_P = ΔG° − λ and σ² = 2λk_BT in both states (SCIENCE.md §7).
 */
import { once } from 'node:events';
import { createWriteStream } from 'node:fs';
import { createGzip } from 'node:zlib';
import seedrandom from 'seedrandom';

export interface SyntheticTraceSpec {
  readonly count: number;
  /** Mean and standard deviation of ΔE, eV. */
  readonly meanEv: number;
  readonly sdEv: number;
  /** AR(1) coefficient, 0 for independent samples. */
  readonly phi?: number;
  readonly seed: string;
}

/** Boltzmann constant in eV/K (CODATA 2018, exact). */
const BOLTZMANN_EV = 8.617333262e-5;

/** Mean and standard deviation of ΔE in each state for given λ, ΔG° (eV) and T (K). */
export function marcusGapMoments(lambdaEv: number, deltaG0Ev: number, temperatureK: number) {
  const sdEv = Math.sqrt(2 * lambdaEv * BOLTZMANN_EV * temperatureK);
  return { reactantMeanEv: deltaG0Ev + lambdaEv, productMeanEv: deltaG0Ev - lambdaEv, sdEv };
}

/** Yields `count` samples (eV) of the AR(1) process described above. */
export function* syntheticGapSamples(spec: SyntheticTraceSpec): Generator<number> {
  const random = seedrandom.alea(spec.seed);
  const phi = spec.phi ?? 0;
  const innovation = spec.sdEv * Math.sqrt(1 - phi * phi);
  let spare: number | null = null;
  const normal = (): number => {
    if (spare !== null) {
      const s = spare;
      spare = null;
      return s;
    }
    let u = 0;
    while (u === 0) u = random();
    const v = random();
    const r = Math.sqrt(-2 * Math.log(u));
    spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  };
  let deviation = spec.sdEv * normal();
  for (let i = 0; i < spec.count; i++) {
    if (i > 0) deviation = phi * deviation + innovation * normal();
    yield spec.meanEv + deviation;
  }
}

export interface TraceFileFormat {
  /** Values are written in eV divided by this factor's unit: value_written = ev / evPerUnit. */
  readonly evPerUnit?: number;
  readonly header?: string;
  readonly separator?: ',' | '\t' | ' ';
  /** Write a frame-number column before ΔE. */
  readonly frameColumn?: boolean;
  readonly lineEnd?: '\n' | '\r\n';
  readonly gzip?: boolean;
  readonly digits?: number;
}

/** Writes a synthetic trace file; returns its byte count on disk. */
export async function writeSyntheticTrace(
  path: string,
  spec: SyntheticTraceSpec,
  format: TraceFileFormat = {},
): Promise<void> {
  const file = createWriteStream(path);
  const gzip = format.gzip ? createGzip() : null;
  if (gzip) gzip.pipe(file);
  const out = gzip ?? file;
  const eol = format.lineEnd ?? '\n';
  const sep = format.separator ?? ',';
  const per = format.evPerUnit ?? 1;
  const digits = format.digits ?? 6;
  let text = format.header !== undefined ? format.header + eol : '';
  let frame = 0;
  for (const ev of syntheticGapSamples(spec)) {
    const value = (ev / per).toFixed(digits);
    text += format.frameColumn ? `${frame}${sep}${value}${eol}` : `${value}${eol}`;
    frame++;
    if (text.length > 1 << 20) {
      if (!out.write(text)) await once(out, 'drain');
      text = '';
    }
  }
  out.end(text);
  await once(file, 'close');
}
