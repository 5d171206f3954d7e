/**
 * Report PDFs checked against worked examples and handbook values: each pair is built through
 * the API, a report is created, its PDF downloaded, its text extracted with pdftotext (Debian's
 * poppler-utils) and the printed numbers, units and significant figures compared with the
 * published values. The PDF's numbers must also equal the API's JSON for the same snapshot; page
 * 1 is rendered to PNG (test-output/reports/) and must not be blank; every font must be
 * embedded Inter.
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  formatLog10,
  formatRate,
  type PairInput,
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
  wid = (await editor.post('/api/workspaces', { name: 'Worked examples' }).expect(201)).body.id;
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

function pairOf(
  name: string,
  parameters: PairParameter[],
  extra: Partial<PairInput> = {},
): PairInput {
  return {
    name,
    donor: 'D-1',
    acceptor: 'A-1',
    medium: 'acetonitrile',
    temperature: 298.15,
    temperatureUnit: 'K',
    notes: '',
    status: 'active',
    tags: [],
    model: 'marcus',
    parameters,
    ...extra,
  };
}

interface Produced {
  readonly view: ReportView;
  readonly pdf: Buffer;
  /** pdftotext -layout output with runs of white space collapsed to one space. */
  readonly text: string;
  readonly file: string;
}

async function produce(slug: string, input: PairInput): Promise<Produced> {
  const pair = (await editor.post(`/api/workspaces/${wid}/pairs`, input).expect(201)).body;
  const view = (
    await editor.post(`/api/workspaces/${wid}/reports`, { pairId: pair.id }).expect(201)
  ).body as ReportView;
  const res = await editor
    .get(`/api/reports/${view.reportId}/pdf`)
    .buffer(true)
    .parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    })
    .expect(200);
  expect(res.headers['content-type']).toBe('application/pdf');
  const pdf = res.body as Buffer;
  const file = join(OUT, `${slug}.pdf`);
  writeFileSync(file, pdf);
  // Layout mode keeps each table row on one line; white space is then collapsed.
  const text = execFileSync('pdftotext', ['-layout', '-enc', 'UTF-8', file, '-'], {
    encoding: 'utf8',
  }).replace(/\s+/g, ' ');
  return { view, pdf, text, file };
}

/** The key result line of page 1: "k = 8.98 × 10¹⁰ s⁻¹ (log10 k = 10.95)". */
function keyResult(text: string): string {
  const m = /k = (.+? s⁻¹) \(log10 k = (\S+)\)/.exec(text);
  expect(m, 'key result line on page 1').not.toBeNull();
  return `${m![1]} | ${m![2]}`;
}

describe('report PDFs against worked examples', () => {
  it('classical Marcus, SCIENCE.md §1 worked example (independent SciPy computation): H = 0.010 eV, λ = 0.80 eV, ΔG° = −0.30 eV, 298.15 K → k = 8.978 × 10¹⁰ s⁻¹, ΔG‡ = 0.078125 eV', async () => {
    const p = await produce(
      'marcus-worked-example',
      pairOf('Worked Marcus', [
        param('deltaG0', -0.3, 'eV'),
        param('lambdaOuter', 0.8, 'eV'),
        param('coupling', 0.01, 'eV'),
      ]),
    );
    // 8.978e10 to three significant figures; log10(8.978e10) = 10.953.
    expect(keyResult(p.text)).toBe('8.98 × 10¹⁰ s⁻¹ | 10.95');
    expect(p.text).toContain('ΔG‡ = 0.0781 eV');
    expect(p.text).toContain('regime: Normal');
    // γ = π^(3/2)H²/(hν_n(λk_BT)^½) = 0.094 < 0.1 with ν_n = 1e13 s⁻¹ (SCIENCE.md §3 example):
    // the coupling regime stands beside the driving-force regime, in the summary and the table.
    expect(p.text).toContain('regime: Normal; coupling regime: Nonadiabatic');
    expect(p.text).toMatch(/Regime Coupling Monte Carlo .* Normal Nonadiabatic no uncertainties/);
    // The inputs table prints the typed and the canonical value with its unit.
    expect(p.text).toMatch(/Driving force ΔG° −0\.3 eV −0\.3 eV/);

    // Same numbers as the API's JSON for this snapshot.
    const json = p.view.snapshot.pairs[0].results.find((r) => r.primary)!;
    expect(json.k).toBeCloseTo(8.978e10, -8);
    expect(keyResult(p.text)).toBe(`${formatRate(json.k)} | ${formatLog10(json.log10k)}`);
    const exported = await editor
      .get(`/api/reports/${p.view.reportId}/export?format=json`)
      .expect(200);
    expect(exported.body.snapshotId).toBe(p.view.snapshotId);
    expect(exported.body.snapshot.pairs[0].results[0].k).toBe(json.k);
    // Footer with the snapshot id on every page, and page numbers.
    const pages = Number(
      /Pages:\s+(\d+)/.exec(execFileSync('pdfinfo', [p.file], { encoding: 'utf8' }))![1],
    );
    expect(pages).toBeGreaterThanOrEqual(2);
    for (let page = 1; page <= pages; page++) {
      const pageText = execFileSync(
        'pdftotext',
        ['-f', String(page), '-l', String(page), p.file, '-'],
        { encoding: 'utf8' },
      );
      expect(pageText).toContain(`Snapshot ${p.view.snapshotId}`);
      expect(pageText).toContain(`Page ${page} of ${pages}`);
    }
    // Methods print the citations of the calculation core's catalog.
    expect(p.text).toContain('R. A. Marcus, J. Chem. Phys. 1956, 24, 966');
    expect(p.text).toContain('Limits of this estimate');
  });

  it('the same pair typed in kcal/mol, kJ/mol, cm⁻¹ and °C (CODATA 2018 factors of SCIENCE.md §16: 1 eV = 23.06054783 kcal/mol = 96.48533212 kJ/mol = 8065.543937 cm⁻¹; 25 °C = 298.15 K by definition) prints the typed values and the same rate', async () => {
    const p = await produce(
      'marcus-typed-units',
      pairOf(
        'Worked Marcus, other units',
        [
          param('deltaG0', -0.3, 'kcal/mol'),
          param('lambdaOuter', 0.8, 'kJ/mol'),
          param('coupling', 0.01, 'cm-1'),
        ],
        { temperatureUnit: 'degC' },
      ),
    );
    // −0.3 × 23.06054783 = −6.918164…; 0.8 × 96.48533212 = 77.188266…; 0.01 × 8065.543937 = 80.655439…
    expect(p.text).toMatch(/Driving force ΔG° −6\.91816 kcal\/mol −0\.3 eV/);
    expect(p.text).toMatch(/77\.1883 kJ\/mol 0\.8 eV/);
    expect(p.text).toMatch(/80\.6554 cm⁻¹ 0\.01 eV/);
    expect(p.text).toMatch(/Temperature T 25 °C 298\.15 K/);
    expect(keyResult(p.text)).toBe('8.98 × 10¹⁰ s⁻¹ | 10.95');
  });

  it('activationless maximum, SCIENCE.md §1 (k_max = (2π/ħ)|H|²(4πλk_BT)^−½ with 2π/ħ = 9.545838906 × 10¹⁵ eV⁻¹ s⁻¹ and k_BT = 0.02569258 eV at 298.15 K, §16) → 1.878 × 10¹² s⁻¹', async () => {
    const kMax = (9.545838906e15 * 0.01 ** 2) / Math.sqrt(4 * Math.PI * 0.8 * 0.02569258);
    expect(kMax).toBeCloseTo(1.8783e12, -8);
    const p = await produce(
      'marcus-activationless',
      pairOf('Activationless', [
        param('deltaG0', -0.8, 'eV'),
        param('lambdaOuter', 0.8, 'eV'),
        param('coupling', 0.01, 'eV'),
      ]),
    );
    expect(keyResult(p.text)).toBe('1.88 × 10¹² s⁻¹ | 12.27');
    expect(p.text).toContain('regime: Activationless');
  });

  it('empirical protein ruler, SCIENCE.md §9 worked example (Moser et al., Nature 1992, 355, 796, from memory): R = 10 Å, ΔG° = −0.5 eV, λ = 0.7 eV → log10 k = 8.983', async () => {
    const p = await produce(
      'ruler-worked-example',
      pairOf('Ruler', [
        param('deltaG0', -0.5, 'eV'),
        param('lambdaOuter', 0.7, 'eV'),
        param('coupling', 0.01, 'eV'),
        param('edgeDistance', 10, 'A'),
      ]),
    );
    // Results table row: model, k (10^8.983 = 9.61 × 10⁸), log10 k to two decimals.
    expect(p.text).toMatch(/Empirical protein ruler 9\.61 × 10⁸ s⁻¹ 8\.98 /);
    expect(p.text).toContain(
      'C. C. Moser, J. M. Keske, K. Warncke, R. S. Farid, P. L. Dutton, Nature 1992, 355, 796',
    );
  });

  it('Marcus–Levich–Jortner with λ_v = 0 (S = 0) reduces exactly to classical Marcus with λ_s (SCIENCE.md §2; Jortner, J. Chem. Phys. 1976, 64, 4860, from memory) → the §1 value 8.978 × 10¹⁰ s⁻¹', async () => {
    const p = await produce(
      'mlj-classical-limit',
      pairOf(
        'MLJ, S = 0',
        [
          param('deltaG0', -0.3, 'eV'),
          param('lambdaOuter', 0.8, 'eV'),
          param('lambdaInner', 0, 'eV'),
          param('hbarOmega', 0.18, 'eV'),
          param('coupling', 0.01, 'eV'),
        ],
        { model: 'mlj' },
      ),
    );
    expect(keyResult(p.text)).toBe('8.98 × 10¹⁰ s⁻¹ | 10.95');
    expect(p.text).toContain('Result (Marcus–Levich–Jortner (one quantum mode)) k = 8.98');
    // The classical Marcus row with λ = λ_s + 0 prints the same rate.
    expect(p.text).toMatch(/Classical nonadiabatic 8\.98 × 10¹⁰ s⁻¹ 10\.95/);
  });

  it('solvent-controlled crossover, SCIENCE.md §3 (Zusman, Chem. Phys. 1980, 49, 295, from memory): κ_A = 4π|H|²τ_L/(ħλ) with τ_L = 0.5 ps (water, from memory) on the §1 pair → k = 8.978 × 10¹⁰/(1 + 1.1932) = 4.09 × 10¹⁰ s⁻¹', async () => {
    const kappa = (4 * Math.PI * 0.01 ** 2 * 0.5e-12) / (6.582119569e-16 * 0.8);
    expect(kappa).toBeCloseTo(1.1932, 3);
    const p = await produce(
      'crossover',
      pairOf(
        'Crossover',
        [
          param('deltaG0', -0.3, 'eV'),
          param('lambdaOuter', 0.8, 'eV'),
          param('coupling', 0.01, 'eV'),
          param('tauL', 0.5e-12, 'ps'),
        ],
        { model: 'crossover' },
      ),
    );
    expect(keyResult(p.text)).toBe(
      `${formatRate(8.978e10 / (1 + kappa))} | ${formatLog10(Math.log10(8.978e10 / (1 + kappa)))}`,
    );
    expect(keyResult(p.text)).toBe('4.09 × 10¹⁰ s⁻¹ | 10.61');
    // κ_A = 1.19 lies between 0.1 and 10: intermediate (CALC-API.md couplingRegime, from κ_A when
    // τ_L is known).
    expect(p.text).toContain('coupling regime: Intermediate');
    expect(p.text).toMatch(/0\.5 ps 5 × 10⁻¹³ s/);
  });
});

describe('report PDF as a document', () => {
  it('embeds only Inter, every glyph printed exists in it, and page 1 renders to a non-blank PNG', async () => {
    const p = await produce(
      'document-checks',
      pairOf('Document', [
        param('deltaG0', -0.3, 'eV', 0.05),
        param('lambdaOuter', 0.6, 'eV', 0.05),
        param('lambdaInner', 0.2, 'eV'),
        param('coupling', 0.01, 'eV', 0.002),
      ]),
    );
    const fonts = execFileSync('pdffonts', [p.file], { encoding: 'utf8' })
      .trim()
      .split('\n')
      .slice(2);
    expect(fonts.length).toBeGreaterThan(0);
    for (const line of fonts) {
      const cols = line.trim().split(/\s+/);
      // name … emb sub uni object ID: emb is the fifth column from the end.
      expect(cols[0]).toMatch(/^[A-Z]{6}\+Inter-(Regular|SemiBold)$/);
      expect(cols[cols.length - 5]).toBe('yes');
    }
    // Every printed character has a glyph in the embedded font (no .notdef boxes).
    // fontkit (pdfkit's font engine) ships no type declarations.
    const fontkitModule = 'fontkit';
    const fontkit = (await import(fontkitModule)) as {
      create(b: Buffer): { hasGlyphForCodePoint(c: number): boolean };
    };
    const { reportFonts } = await import('../../apps/api/src/reports/pdf/fonts');
    const regular = fontkit.create(reportFonts().regular);
    const missing = [...new Set(Array.from(p.text))].filter(
      (c) => c.trim() && !regular.hasGlyphForCodePoint(c.codePointAt(0)!),
    );
    expect(missing).toEqual([]);
    for (const c of ['λ', 'Δ', '‡', '−', '⁻', '¹', 'ħ', 'ω', 'ᵢ', 'ₒ', 'σ'])
      expect(p.text).toContain(c);

    const png = join(OUT, 'document-checks-page1');
    execFileSync('pdftoppm', [
      '-f',
      '1',
      '-l',
      '1',
      '-r',
      '60',
      '-png',
      '-singlefile',
      p.file,
      png,
    ]);
    // Non-blank: a PPM render of the same page has many pixels that are not white.
    const ppm = execFileSync(
      'pdftoppm',
      ['-f', '1', '-l', '1', '-r', '30', '-gray', '-singlefile', p.file],
      { maxBuffer: 1 << 24 },
    );
    const header = /^P5\s+(\d+)\s+(\d+)\s+255\s/.exec(ppm.subarray(0, 40).toString('latin1'))!;
    const pixels = ppm.subarray(header[0].length);
    const dark = pixels.filter((v) => v < 200).length;
    expect(dark / pixels.length).toBeGreaterThan(0.01);
    expect(readFileSync(`${png}.png`).subarray(1, 4).toString()).toBe('PNG');
  });

  it('prints every provenance as a sentence with labels and units: no JSON, no record ids or hashes', async () => {
    const traceA = '3f0c1a52-7d4e-4b1a-9c55-0e1f2a3b4c5d';
    const traceB = '9a8b7c6d-5e4f-4a3b-8c2d-1e0f9a8b7c6d';
    const series = '0e1d2c3b-4a59-4687-a5b4-c3d2e1f0a9b8';
    const withProvenance = (
      p: PairParameter,
      provenance: PairParameter['provenance'],
    ): PairParameter => ({
      ...p,
      provenance,
    });
    const p = await produce(
      'provenance-sentences',
      pairOf('Provenance', [
        // As the pair page's helper dialog stores them: inputs typed with units.
        withProvenance(param('deltaG0', -0.3, 'eV'), {
          kind: 'derived',
          methodId: 'drivingForce.rehmWeller',
          methodInputs: {
            donorOxidation: { value: 1.1, unit: 'V' },
            acceptorReduction: { value: -0.6, unit: 'V' },
            excitationEnergy: { value: 2.1, unit: 'eV' },
            distance: { unit: 'A', value: 12 },
          },
        }),
        // As a trace analysis writes them (apps/api/src/traces/trace-use-case.ts); the sources
        // (which must name records of the workspace) are left out, the ids in the inputs stay.
        withProvenance(param('lambdaOuter', 0.6, 'eV'), {
          kind: 'derived',
          methodId: 'reorg.gapSamples',
          methodInputs: {
            estimator: 'lambdaFromMeans',
            temperature: 300,
            reactantTraceId: traceA,
            productTraceId: traceB,
            reactantFileName: 'reactant.dat',
            productFileName: 'product.dat',
            reactantSha256: 'ab'.repeat(32),
            productSha256: 'cd'.repeat(32),
            reactantSamples: 4000,
            productSamples: 4000,
            skippedLines: 0,
          },
        }),
        // As a series fit writes them (apps/api/src/series/series-use-case.ts).
        withProvenance(param('lambdaInner', 0.2, 'eV'), {
          kind: 'derived',
          methodId: 'fit.drivingForceSeries',
          methodInputs: { seriesId: series, seriesVersion: 1, model: 'marcus', points: 6 },
          note: 'Fitted to series "Quinones" (marcus, 6 points).',
        }),
        withProvenance(param('coupling', 0.01, 'eV'), {
          kind: 'literature',
          citation: 'Group notebook, p. 7',
        }),
      ]),
    );
    const raw = execFileSync('pdftotext', ['-enc', 'UTF-8', p.file, '-'], { encoding: 'utf8' });
    const text = raw.replace(/\s+/g, ' ');
    expect(text).not.toContain('{"');
    expect(text).not.toMatch(/[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/i);
    expect(text).not.toContain('abab');
    expect(text).not.toContain('drivingForce.rehmWeller from');
    for (const words of [
      'Rehm–Weller helper',
      'reactant.dat',
      'product.dat',
      'trace analysis',
      'Quinones',
      'From the literature',
      '12 Å',
    ])
      expect(text, words).toContain(words);
  });

  it('regenerates byte-identical PDFs from the same snapshot and review state', async () => {
    const p = await produce(
      'deterministic',
      pairOf('Deterministic', [
        param('deltaG0', -0.3, 'eV'),
        param('lambdaOuter', 0.8, 'eV'),
        param('coupling', 0.01, 'eV'),
      ]),
    );
    const again = await editor
      .get(`/api/reports/${p.view.reportId}/pdf`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(Buffer.compare(again.body as Buffer, p.pdf)).toBe(0);
  });
});
