/**
 * The version comparison shows what a change did, not only what was typed: a pair saved twice
 * (λ and ħω changed) shows the shift in log k_CS and log k_CR, the regime that moved and the
 * recombination model that changed, computed through the pair model in the browser and equal to
 * what the server stored with each version.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { apiWrite, launchChromium, shoot, signIn, type Gapwise } from './support/browser';

const baseUrl = inject('baseUrl');
let gw: Gapwise;

beforeAll(async () => {
  gw = await launchChromium();
});
afterAll(async () => {
  expect(gw.offLoopback, 'requests that left 127.0.0.1').toEqual([]);
  await gw?.close();
});

const measured = { kind: 'measured' };
const param = (kind: string, value: number) => ({
  kind,
  value,
  unit: 'eV',
  uncertainty: null,
  provenance: measured,
});

interface StoredPair {
  id: string;
  version: number;
  results: { log10k: number; recombination: { log10k: number } | null };
}

describe('the version comparison', () => {
  it('shows the change in log k, regime and recombination model between two versions', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await signIn(page, baseUrl, 'editor@gapwise.test');
    await page.waitForURL(/\/w\/[0-9a-f-]{36}\/pairs$/);
    const wid = /\/w\/([0-9a-f-]{36})\//.exec(page.url())![1]!;
    const base = {
      name: `DIFF-${Date.now()}`,
      donor: 'D-9',
      acceptor: 'A-9',
      medium: 'acetonitrile',
      temperature: 298.15,
      model: 'marcus',
    };
    const created = await apiWrite(page, baseUrl, 'post', `/api/workspaces/${wid}/pairs`, {
      ...base,
      parameters: [
        param('deltaG0', -0.3),
        param('lambdaInner', 0.2),
        param('lambdaOuter', 0.6),
        param('coupling', 0.01),
        param('deltaG0Recombination', -1.6),
      ],
    });
    expect(created.status()).toBe(201);
    const v1 = (await created.json()) as StoredPair;
    // Version 2: λₒ down to 0.1 eV (separation crosses into the inverted region) and ħω given
    // (recombination switches to Marcus–Levich–Jortner).
    const saved = await apiWrite(page, baseUrl, 'put', `/api/pairs/${v1.id}`, {
      ...base,
      version: v1.version,
      parameters: [
        param('deltaG0', -0.3),
        param('lambdaInner', 0.05),
        param('lambdaOuter', 0.1),
        param('coupling', 0.01),
        param('deltaG0Recombination', -1.6),
        param('hbarOmega', 0.18),
      ],
    });
    expect(saved.status()).toBe(200);
    const v2 = (await saved.json()) as StoredPair;

    await page.goto(`${baseUrl}/w/${wid}/pairs/${v1.id}/history`);
    const effects = page.getByTestId('version-effects');
    const row = (field: string) => effects.locator(`tbody tr[data-field="${field}"]`);
    await expect.poll(() => row('log₁₀ k_CS').count(), { timeout: 15_000 }).toBe(1);
    const cells = async (field: string) =>
      (await row(field).locator('td').allInnerTexts()).map((t) => t.trim());

    // log k_CS before and after, and their shift, equal to what the server stored.
    const [csLeft, csRight, csShift] = await cells('log₁₀ k_CS');
    const num = (t: string) => Number(t!.replace('−', '-'));
    expect(num(csLeft!)).toBeCloseTo(v1.results.log10k, 2);
    expect(num(csRight!)).toBeCloseTo(v2.results.log10k, 2);
    expect(num(csShift!)).toBeCloseTo(v2.results.log10k - v1.results.log10k, 1);
    expect(await cells('Regime (separation)')).toEqual(['Normal', 'Inverted', '']);

    const [crLeft, crRight, crShift] = await cells('log₁₀ k_CR');
    expect(num(crLeft!)).toBeCloseTo(v1.results.recombination!.log10k, 2);
    expect(num(crRight!)).toBeCloseTo(v2.results.recombination!.log10k, 2);
    expect(crShift).toMatch(/^[+−]\d+\.\d\d$/);
    expect((await cells('Recombination model')).slice(0, 2)).toEqual([
      'Classical nonadiabatic Marcus',
      'Marcus–Levich–Jortner (one quantum mode)',
    ]);
    // The inputs table still lists what was typed, with labels.
    const inputs = await page.locator('table.diff:not(.effects) tbody').innerText();
    expect(inputs).toContain('Effective mode energy ħω');
    // The version list names the changed parameters with their labels, not stored kinds.
    const summary = await page.locator('.versions li').first().innerText();
    expect(summary).toContain('Outer reorganization energy');
    expect(summary).not.toContain('lambdaOuter');
    await page.setViewportSize({ width: 1440, height: 900 });
    await shoot(page, 'version-diff-1440');
    await page.setViewportSize({ width: 390, height: 844 });
    await shoot(page, 'version-diff-390');
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
      390,
    );
    await context.close();
  }, 120_000);
});
