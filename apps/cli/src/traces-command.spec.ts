/**
 * `gapwise traces analyze` prints the very result of the shared streaming analysis
 * (@gapwise/traces) and refuses bad files and bad command lines with its exit codes. Expected
 * values come from the known parameters of seeded synthetic samples (Marcus linear response,
 * σ² = 2λk_BT) and from calling the analysis directly on the same files.
 */
import { createReadStream } from 'node:fs';
import { mkdtemp, rm, stat, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Writable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  analyzeTraces,
  marcusGapMoments,
  writeSyntheticTrace,
  type SyntheticTraceSpec,
  type TraceAnalysisInput,
  type TraceParseSettings,
} from '@gapwise/traces';
import { runTracesAnalyze } from './traces-command';

/** 1 eV in kcal/mol (CODATA 2018: e·N_A/4184). */
const KCAL_PER_EV = (1.602176634e-19 * 6.02214076e23) / 4184;
const LAMBDA = 0.5;
const DG0 = -0.2;

let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'gapwise-cli-traces-'));
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

const marcus = marcusGapMoments(LAMBDA, DG0, 300);
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

describe('gapwise traces analyze', () => {
  const capture = () => {
    let text = '';
    const stream = new Writable({
      write(chunk, _enc, cb) {
        text += String(chunk);
        cb();
      },
    });
    return { stream, text: () => text };
  };

  it('prints the JSON the analysis produces (same code), for kcal/mol files with --column', async () => {
    const f = await writePair('cli', gaussR, gaussP, 1 / KCAL_PER_EV);
    const out = capture();
    const code = await runTracesAnalyze(
      [
        '--reactant',
        f.rp,
        '--product',
        f.pp,
        '--unit',
        'kcal/mol',
        '--column',
        '2',
        '--temperature',
        '300',
      ],
      out.stream,
      capture().stream,
    );
    expect(code).toBe(0);
    const printed = JSON.parse(out.text());
    const direct = await analyzeTraces(
      input(f.rp, { unit: 'kcal/mol', column: 2 }, f.rs),
      input(f.pp, { unit: 'kcal/mol', column: 2 }, f.ps),
      300,
    );
    expect(printed.outputs).toEqual(JSON.parse(JSON.stringify(direct.outputs)));
    expect(printed.sources.reactant.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(printed.outputs.lambdaFromMeans).toBeCloseTo(LAMBDA, 1);
  });

  it('exits 2 with the line numbers for a bad file and 1 for a bad command line', async () => {
    const bad = join(dir, 'bad.csv');
    await writeFile(bad, 'dE\n0.1\nabc\n');
    const f = await writePair('cli-bad', gaussR, gaussP);
    const out = capture();
    expect(
      await runTracesAnalyze(
        ['--reactant', bad, '--product', f.pp, '--unit', 'eV'],
        out.stream,
        capture().stream,
      ),
    ).toBe(2);
    expect(JSON.parse(out.text())).toEqual({
      ok: false,
      errors: [
        { field: 'reactantSamples', message: "Line 3: 'abc' is not a number." },
        { field: 'reactantSamples', message: '1 bad line in total.' },
      ],
    });
    expect(
      await runTracesAnalyze(
        ['--reactant', bad, '--unit', 'eV'],
        capture().stream,
        capture().stream,
      ),
    ).toBe(1);
    expect(
      await runTracesAnalyze(
        ['--reactant', bad, '--product', bad, '--unit', 'kcal'],
        capture().stream,
        capture().stream,
      ),
    ).toBe(1);
  });
});
