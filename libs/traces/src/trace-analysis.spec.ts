/**
 * The two-pass streaming analysis of trace files. Expected values come from outside the code
 * under test: the known parameters of seeded synthetic samples (Marcus linear response,
 * σ² = 2λk_BT; AR(1) statistical inefficiency (1 + φ)/(1 − φ)), and the in-memory
 * `reorg.gapSamples` method on the very same samples.
 */
import { createReadStream } from 'node:fs';
import { mkdtemp, readFile, rm, stat, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analyseGapSamples } from '@gapwise/calc';
import { analyzeTraces, TraceAnalysisRefusal, type TraceAnalysisInput } from './trace-analysis';
import {
  marcusGapMoments,
  syntheticGapSamples,
  writeSyntheticTrace,
  type SyntheticTraceSpec,
} from './synthetic-trace';
import type { TraceParseSettings } from './trace-parser';

/** 1 eV in kcal/mol (CODATA 2018: e·N_A/4184). */
const KCAL_PER_EV = (1.602176634e-19 * 6.02214076e23) / 4184;
const T = 300;
const LAMBDA = 0.5;
const DG0 = -0.2;

let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'gapwise-analysis-'));
});
afterAll(async () => rm(dir, { recursive: true, force: true }));

function input(path: string, settings: TraceParseSettings, sizeBytes: number): TraceAnalysisInput {
  return {
    open: async () => createReadStream(path),
    settings,
    sizeBytes,
    info: {
      traceId: null,
      fileName: path.split('/').pop()!,
      sha256: '',
      sizeBytes,
      unit: settings.unit,
      columnIndex: 2,
      columnName: 'dE',
      sampleCount: 0,
      skippedLineCount: 0,
    },
  };
}

async function writePair(
  name: string,
  r: SyntheticTraceSpec,
  p: SyntheticTraceSpec,
  evPerUnit = 1,
) {
  const rp = join(dir, `${name}-R.csv`);
  const pp = join(dir, `${name}-P.csv`);
  const format = { header: 'frame,dE', frameColumn: true, evPerUnit, digits: 12 };
  await writeSyntheticTrace(rp, r, format);
  await writeSyntheticTrace(pp, p, format);
  return { rp, pp, rs: (await stat(rp)).size, ps: (await stat(pp)).size };
}

const marcus = marcusGapMoments(LAMBDA, DG0, T);
const gaussR: SyntheticTraceSpec = {
  count: 20_000,
  meanEv: marcus.reactantMeanEv,
  sdEv: marcus.sdEv,
  seed: 'gauss-R',
};
const gaussP: SyntheticTraceSpec = {
  count: 20_000,
  meanEv: marcus.productMeanEv,
  sdEv: marcus.sdEv,
  seed: 'gauss-P',
};

describe('streaming trace analysis', () => {
  it('gives exactly the outputs of the in-memory reorg.gapSamples on the same samples', async () => {
    const f = await writePair('same', gaussR, gaussP);
    const streamed = await analyzeTraces(
      input(f.rp, { unit: 'eV' }, f.rs),
      input(f.pp, { unit: 'eV' }, f.ps),
      T,
    );
    // The in-memory method gets the values as the files hold them (12 decimals).
    const read = async (path: string) =>
      Float64Array.from(
        (await readFile(path, 'utf8'))
          .trim()
          .split('\n')
          .slice(1)
          .map((l) => Number(l.split(',')[1])),
      );
    const warnings: Array<{ code: string; message: string }> = [];
    const inMemory = analyseGapSamples(
      { reactant: await read(f.rp), product: await read(f.pp), temperatureK: T },
      { warn: (code, message) => warnings.push({ code, message }) },
    );
    expect(JSON.parse(JSON.stringify(streamed.outputs))).toEqual(
      JSON.parse(JSON.stringify(inMemory)),
    );
    expect(streamed.warnings).toEqual(warnings);
  });

  it('recovers λ and ΔG° of Gaussian linear-response samples; λ from means = λ from variances within sampling error', async () => {
    const f = await writePair('gauss', gaussR, gaussP);
    const res = await analyzeTraces(
      input(f.rp, { unit: 'eV' }, f.rs),
      input(f.pp, { unit: 'eV' }, f.ps),
      T,
    );
    const o = res.outputs;
    const se = o.standardErrors.lambdaFromMeans;
    expect(Math.abs(o.lambdaFromMeans - LAMBDA)).toBeLessThan(4 * se);
    expect(Math.abs(o.deltaG0FromMeans - DG0)).toBeLessThan(4 * se);
    // Relative SE of a variance from N independent normal samples: √(2/(N−1)) ≈ 1 %.
    expect(o.lambdaFromVarianceReactant / LAMBDA).toBeCloseTo(1, 1);
    expect(Math.abs(o.lambdaFromVarianceProduct / LAMBDA - 1)).toBeLessThan(
      4 * Math.sqrt(2 / 19_999),
    );
    expect(Math.abs(o.linearResponseRatio - 1)).toBeLessThan(0.05);
    expect(res.warnings.map((w) => w.code)).not.toContain('gap-nonlinear-response');
    expect(res.sources.reactant.sampleCount).toBe(20_000);
    // The merged curve travels with the streamed result; its shift estimates ΔG° (SCIENCE.md §7).
    const merged = (res.outputs as { mergedCurve: Record<string, number> | null }).mergedCurve;
    expect(merged).not.toBeNull();
    expect(Math.abs(merged!.shiftEv - DG0)).toBeLessThan(4 * merged!.shiftStandardError);
    expect(merged!.shiftStandardError).toBeLessThan(0.02);
  });

  it('warns when linear response fails (λ_St = 0.80 eV, λ_var = 1.00 and 0.61 eV)', async () => {
    const kT = 8.617333262e-5 * T;
    const f = await writePair(
      'nonlinear',
      { count: 20_000, meanEv: -0.3 + 0.8, sdEv: Math.sqrt(2 * 1.0 * kT), seed: 'nl-R' },
      { count: 20_000, meanEv: -0.3 - 0.8, sdEv: Math.sqrt(2 * 0.61 * kT), seed: 'nl-P' },
    );
    const res = await analyzeTraces(
      input(f.rp, { unit: 'eV' }, f.rs),
      input(f.pp, { unit: 'eV' }, f.ps),
      T,
    );
    expect(res.warnings.map((w) => w.code)).toContain('gap-nonlinear-response');
  });

  it('finds the statistical inefficiency (1 + φ)/(1 − φ) = 39 of AR(1) samples with φ = 0.95', async () => {
    const phi = 0.95;
    const f = await writePair(
      'ar1',
      { ...gaussR, count: 200_000, phi, seed: 'ar-R' },
      { ...gaussP, count: 200_000, phi, seed: 'ar-P' },
    );
    const res = await analyzeTraces(
      input(f.rp, { unit: 'eV' }, f.rs),
      input(f.pp, { unit: 'eV' }, f.ps),
      T,
    );
    const o = res.outputs as {
      standardErrors: Record<string, number>;
      naiveStandardErrors: Record<string, number>;
      statisticalInefficiency: Record<string, number>;
    };
    const expected = (1 + phi) / (1 - phi);
    // The plateau SE has a relative error ≈ 1/√(2(n_b − 1)); allow 35 % on the inefficiency.
    expect(o.statisticalInefficiency.reactant / expected).toBeGreaterThan(0.65);
    expect(o.statisticalInefficiency.reactant / expected).toBeLessThan(1.35);
    const ratio = o.standardErrors.meanReactant / o.naiveStandardErrors.meanReactant;
    expect(ratio / Math.sqrt(expected)).toBeGreaterThan(0.8);
    expect(ratio / Math.sqrt(expected)).toBeLessThan(1.2);
  });

  it('gives the same λ in eV for a file written in kcal/mol as for its eV twin', async () => {
    const ev = await writePair('twin-ev', gaussR, gaussP);
    const kcal = await writePair('twin-kcal', gaussR, gaussP, 1 / KCAL_PER_EV);
    const a = await analyzeTraces(
      input(ev.rp, { unit: 'eV' }, ev.rs),
      input(ev.pp, { unit: 'eV' }, ev.ps),
      T,
    );
    const b = await analyzeTraces(
      input(kcal.rp, { unit: 'kcal/mol' }, kcal.rs),
      input(kcal.pp, { unit: 'kcal/mol' }, kcal.ps),
      T,
    );
    const la = a.outputs.lambdaFromMeans;
    const lb = b.outputs.lambdaFromMeans;
    expect(Math.abs(lb / la - 1)).toBeLessThan(1e-9);
    // Read as eV, the kcal/mol file would be off by the factor 23.06 (a guard that units matter).
    const wrong = await analyzeTraces(
      input(kcal.rp, { unit: 'eV' }, kcal.rs),
      input(kcal.pp, { unit: 'eV' }, kcal.ps),
      T,
    );
    expect(wrong.outputs.lambdaFromMeans / la).toBeCloseTo(KCAL_PER_EV, 6);
  });

  it('refuses swapped files (λ from means ≤ 0) and constant data', async () => {
    const f = await writePair('swap', gaussP, gaussR);
    await expect(
      analyzeTraces(input(f.rp, { unit: 'eV' }, f.rs), input(f.pp, { unit: 'eV' }, f.ps), T),
    ).rejects.toThrow(/Negative λ from means/);
    const flat = join(dir, 'flat.csv');
    await writeFile(flat, 'dE\n' + '0.5\n'.repeat(100));
    const g = await writePair('flat-ok', gaussR, gaussP);
    const error = await analyzeTraces(
      input(flat, { unit: 'eV' }, 400),
      input(g.pp, { unit: 'eV' }, g.ps),
      T,
    ).catch((e) => e);
    expect(error).toBeInstanceOf(TraceAnalysisRefusal);
    expect((error as TraceAnalysisRefusal).errors[0].message).toMatch(/All values identical/);
  });

  it('says on the result that bad lines were skipped', async () => {
    const rp = join(dir, 'with-bad-lines.csv');
    const text =
      'dE\n' +
      [...syntheticGapSamples({ ...gaussR, count: 500 })].map((x) => x.toFixed(6)).join('\n') +
      '\nbad\nnan\n';
    await writeFile(rp, text);
    const f = await writePair('skip', gaussR, gaussP);
    const res = await analyzeTraces(
      input(rp, { unit: 'eV', skipBadLines: true }, text.length),
      input(f.pp, { unit: 'eV' }, f.ps),
      T,
    );
    expect(res.sources.reactant.skippedLineCount).toBe(2);
    expect(res.warnings).toContainEqual({
      code: 'trace-bad-lines-skipped',
      message: '2 bad lines were skipped in the reactant file (with-bad-lines.csv).',
    });
  });
});
