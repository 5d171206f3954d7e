/**
 * The pair workbench in Debian's chromium against the real server and a fresh demo database:
 * fonts and loopback, sign-in page weight, λ unit round trip without drift, live recompute and
 * redraw, save and reload with provenance, a new pair typed in mixed units, the viewer's
 * read-only editor, and the keystroke-to-redraw benchmark.
 */
import { gzipSync } from 'node:zlib';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { calculate } from '@gapwise/calc';
import { launchChromium, shoot, signIn, type Gapwise } from './support/browser';

const baseUrl = inject('baseUrl');
let gw: Gapwise;

beforeAll(async () => {
  gw = await launchChromium();
});
afterAll(async () => {
  expect(gw.offLoopback, 'requests that left 127.0.0.1').toEqual([]);
  await gw?.close();
});

const field = (page: Page, kind: string) => page.locator(`gw-parameter-field[data-kind="${kind}"]`);
const valueOf = (page: Page, kind: string) =>
  field(page, kind).locator('input.value-input').inputValue();

async function selectUnit(page: Page, kind: string, shown: string) {
  await field(page, kind).locator('.unit-select').click();
  await page.getByRole('option', { name: shown, exact: true }).click();
  await expect.poll(() => field(page, kind).locator('.unit-select').innerText()).toBe(shown);
}

async function typeValue(page: Page, kind: string, text: string) {
  const input = field(page, kind).locator('input.value-input');
  await input.fill('');
  await input.pressSequentially(text, { delay: 120 });
}

async function openPair(page: Page, name: string) {
  await page.getByRole('link', { name, exact: true }).click();
  await page.waitForURL(/\/pairs\/[0-9a-f-]{36}$/);
  await expect.poll(() => valueOf(page, 'deltaG0'), { timeout: 15_000 }).not.toBe('');
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
}

describe('the workbench in chromium', () => {
  it('serves the sign-in page with Inter and bundled SVG icons (no icon font), compressed, under 300 kB of compressed JS', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    const scripts: Array<{ url: string; body: Buffer; encoding: string | undefined }> = [];
    const fontUrls: string[] = [];
    const stylesheets: string[] = [];
    page.on('response', async (res) => {
      const type = res.request().resourceType();
      if (type === 'font') fontUrls.push(res.url());
      if (type === 'stylesheet') stylesheets.push(await res.text());
      if (res.request().resourceType() === 'script') {
        scripts.push({
          url: res.url(),
          body: await res.body(),
          encoding: res.headers()['content-encoding'],
        });
      }
    });
    await page.goto(`${baseUrl}/sign-in`, { waitUntil: 'networkidle' });
    await expect.poll(() => page.getByRole('heading', { name: 'Sign in' }).count()).toBe(1);
    const fonts = await page.evaluate(async () => {
      await document.fonts.ready;
      const loaded = [...document.fonts]
        .filter((f) => f.status === 'loaded')
        .map((f) => f.family.replace(/"/g, ''));
      return {
        loaded: [...new Set(loaded)],
        interCheck: document.fonts.check('16px Inter'),
        bodyFont: getComputedStyle(document.body).fontFamily,
      };
    });
    expect(fonts.loaded).toContain('Inter');
    // Icons are inline SVGs registered from our own bundle: no symbol font is built or loaded.
    expect(fonts.loaded).not.toContain('Material Symbols Outlined');
    expect(fontUrls.filter((u) => /material|symbols/i.test(u))).toEqual([]);
    expect(stylesheets.length).toBeGreaterThan(0);
    expect(stylesheets.filter((css) => /material-symbols|Material Symbols/i.test(css))).toEqual([]);
    expect(await page.locator('mat-icon svg').count()).toBeGreaterThan(0);
    // Brotli over the wire (the compression middleware leaves bodies under 1 kB as they are).
    const large = scripts.filter((s) => s.body.length > 1024);
    expect(large.length).toBeGreaterThan(0);
    expect(large.filter((s) => s.encoding !== 'br').map((s) => s.url)).toEqual([]);
    expect(fonts.interCheck).toBe(true);
    expect(fonts.bodyFont).toMatch(/^Inter/);

    const raw = scripts.reduce((n, s) => n + s.body.length, 0);
    const gzip = scripts.reduce((n, s) => n + gzipSync(s.body, { level: 9 }).length, 0);
    console.log(
      `[bench] sign-in page initial JavaScript: ${scripts.length} files, ${(raw / 1024).toFixed(1)} kB raw, ` +
        `${(gzip / 1024).toFixed(1)} kB gzip-compressed (budget 300 kB)`,
    );
    expect(gzip).toBeLessThan(300 * 1024);
    await shoot(page, 'sign-in');
    await context.close();
  });

  it('lets the editor change λ between eV and kcal/mol without drift, recompute live, save and reload with provenance', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await signIn(page, baseUrl, 'editor@gapwise.test');
    await page.waitForURL(/\/pairs$/);
    await expect
      .poll(() => page.locator('a.pair-link').count(), { timeout: 15_000 })
      .toBeGreaterThan(0);
    await shoot(page, 'pairs-table');
    await openPair(page, 'DA-1');

    // λ round trip: eV → kcal/mol → eV shows exactly what was stored.
    await selectUnit(page, 'lambdaOuter', 'eV');
    const before = await valueOf(page, 'lambdaOuter');
    expect(before).not.toBe('');
    await selectUnit(page, 'lambdaOuter', 'kcal/mol');
    const inKcal = Number(await valueOf(page, 'lambdaOuter'));
    // A derived λ is shown to 4 significant figures in eV; the kcal/mol view converts the stored value.
    expect(inKcal).toBeCloseTo(Number(before) * 23.06054783, 3);
    await selectUnit(page, 'lambdaOuter', 'eV');
    expect(await valueOf(page, 'lambdaOuter')).toBe(before);

    // Parabolas, avoided crossing and the Marcus curve are on the page.
    await expect.poll(() => page.locator('gw-parabola-plot path.curve.reactant').count()).toBe(1);
    expect(await page.locator('gw-parabola-plot path.curve.adiabatic').count()).toBe(2);
    await shoot(page, 'pair-editor');

    // Live: a new λ changes log10 k and the drawing; every keystroke is timed to its redraw.
    const log10kBefore = await page.locator('[data-testid="log10k"]').innerText();
    const pathBefore = await page.locator('gw-parabola-plot path.curve.reactant').getAttribute('d');
    await page.evaluate(() => performance.clearMeasures('gw-keystroke-to-redraw'));
    await typeValue(page, 'lambdaOuter', '0.4512345');
    await expect
      .poll(() => page.locator('[data-testid="log10k"]').innerText())
      .not.toBe(log10kBefore);
    expect(await page.locator('gw-parabola-plot path.curve.reactant').getAttribute('d')).not.toBe(
      pathBefore,
    );
    const durations = await page.evaluate(() =>
      performance.getEntriesByName('gw-keystroke-to-redraw').map((e) => e.duration),
    );
    expect(durations.length).toBeGreaterThanOrEqual(5);
    console.log(
      `[bench] keystroke → recompute → redraw of the workbench: median ${median(durations).toFixed(1)} ms ` +
        `over ${durations.length} keystrokes (max ${Math.max(...durations).toFixed(1)} ms; target < 16 ms)`,
    );

    // Provenance: literature with a citation.
    await field(page, 'lambdaOuter').locator('.provenance-select').click();
    await page.getByRole('option', { name: 'Literature' }).click();
    await field(page, 'lambdaOuter')
      .locator('input.citation-input')
      .fill('Invented J. Photochem. 2026, 12, 345');
    const shownLog10k = await page.locator('[data-testid="log10k"]').innerText();
    await page.locator('button.save').click();
    await expect.poll(() => page.locator('.agree, .mismatch').count(), { timeout: 15_000 }).toBe(1);
    expect(await page.locator('.mismatch').count(), 'browser and server agree').toBe(0);

    await page.reload();
    await expect.poll(() => valueOf(page, 'lambdaOuter'), { timeout: 15_000 }).toBe('0.4512345');
    expect(await field(page, 'lambdaOuter').locator('.provenance-select').innerText()).toBe(
      'Literature',
    );
    expect(await field(page, 'lambdaOuter').locator('input.citation-input').inputValue()).toBe(
      'Invented J. Photochem. 2026, 12, 345',
    );
    await expect.poll(() => page.locator('[data-testid="log10k"]').innerText()).toBe(shownLog10k);
    await context.close();
  });

  it('creates a pair typed in kcal/mol, cm⁻¹ and eV and keeps each unit', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await signIn(page, baseUrl, 'editor@gapwise.test');
    await page.getByRole('link', { name: 'New pair' }).click();
    await page.waitForURL(/\/pairs\/new$/);
    await page.getByLabel('Name', { exact: true }).fill('E2E-7');
    await page.getByLabel('Donor', { exact: true }).fill('Dye E-7');
    await page.getByLabel('Acceptor', { exact: true }).fill('Acc E-7');
    await selectUnit(page, 'deltaG0', 'kcal/mol');
    await typeValue(page, 'deltaG0', '-8.07');
    await typeValue(page, 'lambdaOuter', '0.75');
    await selectUnit(page, 'lambdaInner', 'cm⁻¹');
    await typeValue(page, 'lambdaInner', '1.2e3');
    await typeValue(page, 'coupling', '120');
    const answer = calculate({
      method: 'rate.marcus',
      inputs: {
        deltaG0: { value: -8.07, unit: 'kcal/mol' },
        lambda: 0.75 + 1200 / 8065.543937,
        coupling: { value: 120, unit: 'cm-1' },
        temperature: 298.15,
      },
    });
    const log10k = answer.ok ? (answer.outputs['log10k'] as number) : NaN;
    await expect
      .poll(() => page.locator('[data-testid="log10k"]').innerText())
      .toBe(log10k.toFixed(2));
    await page.locator('button.save').click();
    await page.waitForURL(/\/pairs\/[0-9a-f-]{36}$/, { timeout: 15_000 });
    await page.reload();
    await expect.poll(() => valueOf(page, 'deltaG0'), { timeout: 15_000 }).toBe('-8.07');
    expect(await field(page, 'deltaG0').locator('.unit-select').innerText()).toBe('kcal/mol');
    expect(await valueOf(page, 'lambdaInner')).toBe('1200');
    expect(await field(page, 'lambdaInner').locator('.unit-select').innerText()).toBe('cm⁻¹');
    expect(await valueOf(page, 'coupling')).toBe('120');
    await expect
      .poll(() => page.locator('[data-testid="log10k"]').innerText())
      .toBe(log10k.toFixed(2));
    await shoot(page, 'new-pair-saved');
    await context.close();
  });

  it('shows the viewer a read-only editor', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await signIn(page, baseUrl, 'viewer@gapwise.test');
    await page.waitForURL(/\/pairs$/);
    await expect
      .poll(() => page.locator('a.pair-link').count(), { timeout: 15_000 })
      .toBeGreaterThan(0);
    expect(await page.getByRole('link', { name: 'New pair' }).count()).toBe(0);
    await openPair(page, 'DA-1');
    await expect.poll(() => page.locator('.readonly-banner').count()).toBe(1);
    expect(await page.locator('button.save').count()).toBe(0);
    expect(await field(page, 'lambdaOuter').locator('input.value-input').isDisabled()).toBe(true);
    expect(await field(page, 'deltaG0').locator('input.value-input').isDisabled()).toBe(true);
    await shoot(page, 'pair-editor-viewer');
    await context.close();
  });
});
