/**
 * Material cases in Debian's chromium against the real server: the lab editor opens the demo
 * layer (tensor, Monte Carlo, contributions, μ(T)), then makes a 1D chain by CSV paste, computes
 * it in the pool and saves it. The page's D and μ are checked against the closed forms D = a²k
 * (1D random walk, Coropceanu et al., Chem. Rev. 2007, 107, 926) and μ = eD/k_BT (Einstein 1905)
 * with k the classical Marcus rate, and a class III coupling is refused naming the neighbour.
 */
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
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

const poll = <T>(read: () => T | Promise<T>) => expect.poll(read, { timeout: 30_000 });

async function shootBoth(page: Page, name: string) {
  await page.setViewportSize({ width: 1440, height: 900 });
  await shoot(page, `${name}-1440`);
  await page.setViewportSize({ width: 390, height: 844 });
  const overflow = await page.evaluate(
    () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
  );
  expect(overflow, `${name}: horizontal scroll at 390 px`).toBeLessThanOrEqual(0);
  await shoot(page, `${name}-390`);
  await page.setViewportSize({ width: 1440, height: 900 });
}

const KB = 8.617333262e-5;
const HBAR = 6.582119569e-16;
function marcus(J: number, lambda: number, T: number) {
  const kT = KB * T;
  return (
    ((2 * Math.PI) / HBAR) *
    J *
    J *
    (1 / Math.sqrt(4 * Math.PI * lambda * kT)) *
    Math.exp(-lambda / (4 * kT))
  );
}
const SUPERSCRIPT: Record<string, string> = {
  '⁰': '0',
  '¹': '1',
  '²': '2',
  '³': '3',
  '⁴': '4',
  '⁵': '5',
  '⁶': '6',
  '⁷': '7',
  '⁸': '8',
  '⁹': '9',
  '⁻': '-',
};
/** The first number shown, "1.23 × 10⁻⁴ cm² …" or "0.0123 ± 0.0010 …", as a number. */
function first(text: string): number {
  const m = /([-−]?\d+(?:\.\d+)?)(?:\s*×\s*10([⁻⁰¹²³⁴⁵⁶⁷⁸⁹]+))?/.exec(text)!;
  const mantissa = Number(m[1].replace('−', '-'));
  const exponent = m[2] ? Number([...m[2]].map((c) => SUPERSCRIPT[c]).join('')) : 0;
  return mantissa * 10 ** exponent;
}

describe('materials in chromium', () => {
  it('shows the demo layer and makes, computes and saves a chain from pasted CSV', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await signIn(page, baseUrl, 'editor@gapwise.test');
    await page.getByRole('link', { name: 'Materials' }).first().click();
    await poll(() => page.locator('table.material-table tbody tr').count()).toBeGreaterThan(0);
    await shootBoth(page, 'materials-list');
    await page.getByRole('link', { name: /Herringbone layer/ }).click();
    await poll(() => page.getByTestId('principal').count()).toBe(1);
    expect(await page.getByTestId('monte-carlo').innerText()).toContain('1000 samples');
    expect(await page.locator('.bars').innerText()).toContain('%');
    expect(await page.locator('svg.chart polyline').count()).toBe(1);
    await shootBoth(page, 'material-demo');

    await page.goto(page.url().replace(/materials\/[^/]+$/, 'materials/new'));
    await page.getByLabel('Name').fill('Chain from CSV');
    await page.getByLabel('Reorganization energy λ (eV)').fill('0.2');
    await page.getByLabel('Temperature (K)').fill('300');
    await page.getByText('Paste or upload CSV').click();
    await page
      .getByLabel('Neighbour CSV', { exact: true })
      .fill('label,x,y,z,coupling\nright,5,0,0,0.005\nleft,-5,0,0,0.005\n');
    await page.getByRole('button', { name: 'Use CSV' }).click();
    await page.getByLabel('Dimensions n').click();
    await page.getByRole('option', { name: '1 (chain)' }).click();
    await page.getByRole('button', { name: 'Compute' }).click();
    await poll(() => page.getByTestId('diffusion').count()).toBe(1);
    const k = marcus(0.005, 0.2, 300);
    const D = first(await page.getByTestId('diffusion').innerText());
    expect(D / (5e-8 ** 2 * k)).toBeCloseTo(1, 2);
    const mu = first(await page.getByTestId('mobility').innerText());
    expect(mu / (D / (KB * 300))).toBeCloseTo(1, 2);
    await page.getByRole('button', { name: 'Save' }).click();
    await poll(() => page.url()).toMatch(/materials\/[0-9a-f-]{36}$/);
    await poll(() => page.locator('header.head').innerText()).toContain('version 1');

    // A class III coupling (2|J| ≥ λ) is refused by the core, named by the neighbour's label.
    await page.getByLabel('Neighbour 2 coupling J').fill('0.15');
    await page.getByRole('button', { name: 'Compute' }).click();
    await poll(() => page.getByRole('alert').innerText()).toContain('Neighbour 2 coupling J');
    await shootBoth(page, 'material-chain');
    await context.close();
  });
});
