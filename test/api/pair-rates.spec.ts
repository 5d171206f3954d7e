/**
 * One pair version, four views: the pair page's data (the stored results of the version, and the
 * browser's own recomputation with the same pair model), the pairs table, the report PDF's text
 * and the report's CSV export must give the same k_CS, k_CR and ratio. The PDF prints the pair
 * model's view strings of the stored numbers; the CSV carries them at full precision; the Monte
 * Carlo interval of the report is the one the page runs (one request, one sample count).
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  PAIR_MONTE_CARLO_SAMPLES,
  computePairResults,
  pairRatesView,
  runPairMonteCarlo,
  type Pair,
  type PairInput,
  type PairListItem,
  type PairParameter,
  type ReportView,
} from '@gapwise/contracts';
import { registerUser, startTestApp, type Session, type TestApp } from './support/test-app';

const OUT = join(process.cwd(), 'test-output', 'reports');

let t: TestApp;
let editor: Session;
let wid: string;

beforeAll(async () => {
  execFileSync('bash', ['docker-free-scripts/poppler-ensure.sh'], { stdio: 'inherit' });
  mkdirSync(OUT, { recursive: true });
  t = await startTestApp();
  editor = await registerUser(t.app, 'editor');
  wid = (await editor.post('/api/workspaces', { name: 'Both rates' }).expect(201)).body.id;
});
afterAll(async () => t?.close());

const assumed = { kind: 'assumed' as const };
function param(
  kind: PairParameter['kind'],
  value: number,
  unit: string,
  uncertainty: number | null = null,
): PairParameter {
  return { kind, value, unit, uncertainty, provenance: assumed };
}

function pairOf(name: string, parameters: PairParameter[]): PairInput {
  return {
    name,
    donor: 'ZnP',
    acceptor: 'C60',
    medium: 'benzonitrile',
    temperature: 298.15,
    temperatureUnit: 'K',
    notes: '',
    status: 'active',
    tags: [],
    model: 'marcus',
    parameters,
  };
}

/** Rows of a CSV without quoted commas (the cells compared here have none). */
function csvRows(text: string): string[][] {
  return text
    .trim()
    .split(/\r\n/)
    .map((line) => line.split(','));
}

describe('k_CS and k_CR of one version on page, table, PDF and CSV', () => {
  it('agree by construction, recombination by MLJ because ħω is given', async () => {
    const input = pairOf('Dyad with recombination', [
      param('deltaG0', -0.45, 'eV', 0.03),
      param('deltaG0Recombination', -1.55, 'eV'),
      param('lambdaInner', 0.25, 'eV', 0.03),
      param('lambdaOuter', 0.55, 'eV', 0.04),
      param('coupling', 0.005, 'eV'),
      param('hbarOmega', 0.18, 'eV'),
    ]);
    const created = (await editor.post(`/api/workspaces/${wid}/pairs`, input).expect(201))
      .body as Pair;

    // The pair page's data for version 1, and the browser's recomputation of it.
    const page = (await editor.get(`/api/pairs/${created.id}/versions/1`).expect(200)).body as Pair;
    const stored = page.results!;
    expect(stored.recombination?.model).toBe('mlj');
    expect(stored.recombination?.note).toMatch(/Marcus–Levich–Jortner because ħω is given/);
    expect(stored.recombination?.regime).toBe('inverted');
    const browser = computePairResults(page);
    expect(browser.k).toBe(stored.k);
    expect(browser.recombination?.k).toBe(stored.recombination?.k);
    expect(browser.log10Ratio).toBe(stored.log10Ratio);
    expect(stored.log10Ratio).toBeCloseTo(stored.log10k! - stored.recombination!.log10k!, 12);

    // The pairs table.
    const list = (await editor.get(`/api/workspaces/${wid}/pairs`).expect(200)).body as {
      items: PairListItem[];
    };
    const row = list.items.find((i) => i.id === created.id)!;
    expect(row.log10k).toBe(stored.log10k);
    expect(row.log10kCr).toBe(stored.recombination!.log10k);
    expect(row.regimeCr).toBe('inverted');
    expect(row.log10Ratio).toBe(stored.log10Ratio);

    // The report: snapshot, PDF text, CSV export.
    const view = (
      await editor.post(`/api/workspaces/${wid}/reports`, { pairId: created.id }).expect(201)
    ).body as ReportView;
    const snap = view.snapshot.pairs[0];
    expect(snap.recombination?.k).toBe(stored.recombination!.k);
    expect(snap.log10Ratio).toBe(stored.log10Ratio);
    // The page's Monte Carlo run and the report's interval: the same request.
    const mc = runPairMonteCarlo(page);
    expect(mc.status).toBe('done');
    const interval = snap.results.find((r) => r.primary)!.interval!;
    expect(interval.samples).toBe(PAIR_MONTE_CARLO_SAMPLES);
    if (mc.status === 'done') {
      expect(interval.log10kMedian).toBe(mc.median);
      expect(interval.log10kLow).toBe(mc.p025);
      expect(interval.log10kHigh).toBe(mc.p975);
    }

    const res = await editor
      .get(`/api/reports/${view.reportId}/pdf`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      })
      .expect(200);
    const file = join(OUT, 'separation-and-recombination.pdf');
    writeFileSync(file, res.body as Buffer);
    const text = execFileSync('pdftotext', ['-layout', '-enc', 'UTF-8', file, '-'], {
      encoding: 'utf8',
    }).replace(/\s+/g, ' ');
    const shown = pairRatesView(stored);
    expect(text).toContain('Separation and recombination');
    // The rows carry the same strings the pair page shows for k_CS and k_CR.
    expect(text).toMatch(
      new RegExp(
        `recombination kCR .*?${escape(shown.recombination!.rate)} ${escape(shown.recombination!.log10k)} Inverted`,
      ),
    );
    expect(text).toContain(`${shown.separation.rate} ${shown.separation.log10k}`);
    expect(shown.ratio).toMatch(/^Separation outpaces recombination by /);
    const ordersOnly = /^(.*? orders of magnitude)/.exec(shown.ratio!)![1];
    expect(text).toContain(ordersOnly);

    const csv = await editor.get(`/api/reports/${view.reportId}/export?format=csv`).expect(200);
    const rows = csvRows(csv.text);
    const value = (section: string, quantity: string, model?: string) =>
      rows.find((r) => r[0] === section && r[5] === quantity && (!model || r[4] === model))?.[6];
    expect(Number(value('recombination', 'k', 'mlj'))).toBe(stored.recombination!.k);
    expect(Number(value('recombination', 'log10k', 'mlj'))).toBe(stored.recombination!.log10k);
    expect(Number(value('recombination', 'log10_ratio_cs_cr'))).toBe(stored.log10Ratio);
    expect(Number(value('result', 'k', 'marcus'))).toBe(stored.k);
  });

  it('takes λ as an entered total and refuses a total that contradicts both parts', async () => {
    const total = (
      await editor
        .post(
          `/api/workspaces/${wid}/pairs`,
          pairOf('λ from a fit', [
            param('deltaG0', -0.3, 'eV'),
            param('lambdaTotal', 0.8, 'eV', 0.05),
            param('coupling', 0.01, 'eV'),
          ]),
        )
        .expect(201)
    ).body as Pair;
    // SCIENCE.md §1 worked example (λ = 0.80 eV): log10 k = 10.953.
    expect(total.results?.log10k).toBeCloseTo(10.953, 3);
    const list = (await editor.get(`/api/workspaces/${wid}/pairs?q=fit`).expect(200)).body as {
      items: PairListItem[];
    };
    expect(list.items[0].lambda).toBe(0.8);

    const refused = await editor
      .post(
        `/api/workspaces/${wid}/pairs`,
        pairOf('Contradicting λ', [
          param('deltaG0', -0.3, 'eV'),
          param('lambdaTotal', 0.9, 'eV'),
          param('lambdaInner', 0.2, 'eV'),
          param('lambdaOuter', 0.6, 'eV'),
          param('coupling', 0.01, 'eV'),
        ]),
      )
      .expect(400);
    expect(JSON.stringify(refused.body)).toContain('parameters.1.value');
    expect(JSON.stringify(refused.body)).toContain('must equal inner λᵢ + outer λₒ');
  });
});

function escape(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}
