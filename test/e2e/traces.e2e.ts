/**
 * Energy-gap traces in Debian's chromium against the real server (worker, PostgreSQL, S3 fake):
 * an editor uploads the two demo trace files (seeded samples with λ = 0.62 eV, ΔG° = −0.35 eV,
 * written in kcal/mol), watches the upload and analysis progress, sees the histograms, curves and
 * block plot, uses λ and ΔG° on a pair, and finds the pair's λ provenance pointing at the analysis
 * and both traces.
 */
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchChromium, shoot, signIn, type Gapwise } from './support/browser';

const baseUrl = inject('baseUrl');
const root = fileURLToPath(new URL('../..', import.meta.url));
const demo = (state: string) => join(root, 'db', 'seed', 'traces', `demo-dyad-${state}.csv`);
/** The generator's parameters (db/seed/traces/generate.ts). */
const LAMBDA = 0.62;
const DG0 = -0.35;

let gw: Gapwise;
beforeAll(async () => {
  gw = await launchChromium();
});
afterAll(async () => {
  expect(gw.offLoopback, 'requests that left 127.0.0.1').toEqual([]);
  await gw?.close();
});

const cellNumber = async (page: Page, key: string, cls: string) =>
  Number(
    (await page.locator(`tr[data-key="${key}"] td.${cls}`).innerText())
      .replace('±', '')
      .replace('−', '-')
      .trim(),
  );

describe('energy-gap traces in chromium', () => {
  it('uploads two trace files, shows the analysis, and attaches λ and ΔG° to a pair with provenance', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await signIn(page, baseUrl, 'editor@gapwise.test');
    await page.getByRole('link', { name: 'Traces', exact: true }).click();
    await page.waitForURL(/\/w\/[0-9a-f-]{36}\/traces$/);
    const wid = /\/w\/([0-9a-f-]{36})\//.exec(page.url())![1];

    // Settings first, then the files.
    await page.locator('.unit-select').click();
    await page.getByRole('option', { name: 'kcal/mol', exact: true }).click();
    await page.locator('.column-input').fill('dE_kcal');
    await page.locator('#file-reactant').setInputFiles(demo('reactant'));
    await page.locator('#file-product').setInputFiles(demo('product'));
    await expect.poll(() => page.locator('.file-meta').count()).toBe(2);
    await shoot(page, 'traces-upload-form');

    // Upload progress bars appear, then the analysis page follows the job to the end.
    await page.locator('.upload-button').click();
    await page.waitForURL(/\/trace-analyses\/[0-9a-f-]{36}$/, { timeout: 60_000 });
    const aid = /trace-analyses\/([0-9a-f-]{36})$/.exec(page.url())![1];
    await expect
      .poll(() => page.locator('[data-testid="analysis-status"]').innerText(), { timeout: 90_000 })
      .toBe('done');

    // Numbers with error bars: the seeded λ and ΔG° within 4 standard errors.
    const lambda = await cellNumber(page, 'lambda', 'value');
    const lambdaSe = await cellNumber(page, 'lambda', 'err');
    const dg = await cellNumber(page, 'deltaG0', 'value');
    expect(lambdaSe).toBeGreaterThan(0);
    expect(Math.abs(lambda - LAMBDA)).toBeLessThan(4 * lambdaSe + 1e-3);
    expect(Math.abs(dg - DG0)).toBeLessThan(4 * lambdaSe + 1e-3);

    // The plots are drawn: histogram bars and Gaussians, both curves and the relation, block levels.
    await expect
      .poll(() => page.locator('svg.histogram-svg .bars.reactant rect').count())
      .toBeGreaterThan(10);
    expect(await page.locator('svg.histogram-svg path.gaussian').count()).toBe(2);
    expect(
      await page.locator('svg.free-energy-svg .points.reactant circle').count(),
    ).toBeGreaterThan(10);
    expect(await page.locator('svg.free-energy-svg .points.product rect').count()).toBeGreaterThan(
      10,
    );
    expect(await page.locator('svg.free-energy-svg path.relation').getAttribute('d')).toMatch(/^M/);
    expect(await page.locator('svg.block-svg .levels.reactant .mark').count()).toBeGreaterThan(5);
    await expect
      .poll(() => page.locator('[data-testid="relation-check"]').innerText())
      .toMatch(/G\s*P\s*− G\s*R\s*= ΔE/);
    await shoot(page, 'traces-analysis');

    // Use λ (as λₒ) and ΔG° on the first demo pair.
    await page.locator('.attach-button').click();
    await page.locator('.pair-select').waitFor({ state: 'visible', timeout: 60_000 });
    await page.locator('.pair-select').click();
    await page.getByRole('option').first().waitFor({ state: 'visible', timeout: 60_000 });
    const option = page.getByRole('option').first();
    const pairName = (await option.innerText()).split(' — ')[0].trim();
    await option.click();
    await page.locator('.dg-box input').check();
    await shoot(page, 'traces-attach-dialog');
    await page.locator('.save-attach').click();
    const link = page.locator('a.attached-link');
    await expect.poll(() => link.count(), { timeout: 30_000 }).toBe(1);
    expect(await link.innerText()).toContain(pairName);

    // The pair page shows λₒ as derived, with the note naming the trace files …
    await link.click();
    await page.waitForURL(/\/pairs\/[0-9a-f-]{36}$/);
    const pairId = /pairs\/([0-9a-f-]{36})$/.exec(page.url())![1];
    const lambdaField = page.locator('gw-parameter-field[data-kind="lambdaOuter"]');
    await expect
      .poll(() => lambdaField.locator('.provenance-select').innerText(), { timeout: 15_000 })
      .toMatch(/Derived/i);
    expect(await lambdaField.locator('input.note-input').inputValue()).toContain(
      'demo-dyad-reactant.csv',
    );
    await shoot(page, 'traces-pair-provenance');

    // … and the stored provenance points at the analysis and both traces.
    const pair = await page.evaluate(
      async (id) => (await fetch(`/api/pairs/${id}`)).json(),
      pairId,
    );
    const lambdaOuter = pair.parameters.find((p: { kind: string }) => p.kind === 'lambdaOuter');
    expect(lambdaOuter.provenance.kind).toBe('derived');
    expect(lambdaOuter.provenance.methodId).toBe('reorg.gapSamples');
    expect(lambdaOuter.provenance.sources[0]).toEqual({ type: 'trace-analysis', id: aid });
    const traces = await page.evaluate(
      async (w) => (await fetch(`/api/workspaces/${w}/traces`)).json(),
      wid,
    );
    const ids = traces.map((t: { id: string }) => t.id);
    expect(ids).toEqual(
      expect.arrayContaining(
        lambdaOuter.provenance.sources.slice(1).map((s: { id: string }) => s.id),
      ),
    );
    expect(pair.parameters.find((p: { kind: string }) => p.kind === 'deltaG0').value).toBeCloseTo(
      dg,
      3,
    );
    await context.close();
  });

  it('lists the bad lines of a refused file and stores nothing', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await signIn(page, baseUrl, 'editor@gapwise.test');
    await page.getByRole('link', { name: 'Traces', exact: true }).click();
    await page.waitForURL(/\/traces$/);
    const wid = /\/w\/([0-9a-f-]{36})\//.exec(page.url())![1];
    const stored = async () =>
      (await page.evaluate(async (w) => (await fetch(`/api/workspaces/${w}/traces`)).json(), wid))
        .length as number;
    const before = await stored();
    await expect.poll(() => page.locator('table.traces-table tbody tr').count()).toBe(before);
    await page.locator('#file-reactant').setInputFiles({
      name: 'broken.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from('frame,dE\n1,0.5\n2,abc\n3,nan\n'),
    });
    await page.locator('#file-product').setInputFiles(demo('product'));
    await page.locator('.upload-button').click();
    const refusal = page.locator('.refusal');
    await expect.poll(() => refusal.count(), { timeout: 30_000 }).toBe(1);
    const text = await refusal.innerText();
    expect(text).toContain("Line 3: 'abc' is not a number.");
    expect(text).toContain('Line 4: non-finite value.');
    await shoot(page, 'traces-refused');
    // The product file was stored (it is valid); the refused one was not.
    await expect.poll(() => page.locator('table.traces-table tbody tr').count()).toBe(before + 1);
    expect(await stored()).toBe(before + 1);
    expect(await page.locator('table.traces-table').innerText()).not.toContain('broken.csv');
    await context.close();
  });
});
