/**
 * The electrode page: open the demo case, see the MHC/Butler–Volmer plots, paste k(η), fit both
 * models, read λ ± SE and the verdict, apply the fit to the case (a new version with provenance),
 * at 1440 and 390 px (no horizontal scroll at 390).
 */
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

/** MHC rates with λ = 0.6 eV and k⁰ = 5 s⁻¹ at 298.15 K, rounded to 3 figures. */
const PASTED = [
  'eta_V, k_per_s, direction',
  '-0.5, 2980, reduction',
  '-0.4, 1390, reduction',
  '-0.3, 505, reduction',
  '-0.2, 142, reduction',
  '-0.1, 30.5, reduction',
  '0.1, 30.5, oxidation',
  '0.2, 142, oxidation',
  '0.3, 505, oxidation',
  '0.4, 1390, oxidation',
  '0.5, 2980, oxidation',
].join('\n');

describe('electrode page', () => {
  it('opens the demo case, fits pasted k(η) and applies the fit', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await page.setViewportSize({ width: 1440, height: 900 });
    await signIn(page, baseUrl, 'editor@gapwise.test');
    await page.getByRole('link', { name: 'Electrodes', exact: true }).first().click();
    await page.getByRole('link', { name: 'Ferrocenyl monolayer on gold (demo)' }).click();
    await page.waitForURL(/\/electrodes\/[0-9a-f-]{36}$/);
    await expect.poll(() => page.getByTestId('case-lambda').innerText()).toContain('0.7');
    // Six curves on the rate plot, the limiting rate and α(η) near ½ at η = −λ/4.
    await expect
      .poll(() => page.locator('gw-electrode-plot path.curve').count())
      .toBeGreaterThan(8);
    const alpha = Number(await page.getByTestId('alpha-value').first().innerText());
    expect(alpha).toBeGreaterThan(0.3);
    expect(alpha).toBeLessThan(0.5);
    await shoot(page, 'electrode-case-1440');

    await page.getByTestId('points-csv').fill(PASTED);
    await page.getByTestId('fit').click();
    await expect
      .poll(() => page.getByTestId('verdict').innerText())
      .toContain('Marcus–Hush–Chidsey fits better');
    const table = await page.getByTestId('fit-table').innerText();
    expect(table).toMatch(/λ = 0\.6\d* ± /);
    expect(table).toMatch(/α = 0\.\d+ ± /);
    await shoot(page, 'electrode-fit-1440');

    await page.getByTestId('apply').click();
    await expect.poll(() => page.getByTestId('applied').innerText()).toContain('version 2');
    expect(await page.getByTestId('case-provenance').innerText()).toContain('Fit of 10 measured');
    expect(await page.getByTestId('case-lambda').innerText()).toMatch(/^0\.60/);

    await page.setViewportSize({ width: 390, height: 844 });
    await page.waitForTimeout(300);
    const overflow = await page.evaluate(
      () => document.scrollingElement!.scrollWidth - document.scrollingElement!.clientWidth,
    );
    expect(overflow, 'horizontal scroll at 390 px').toBeLessThanOrEqual(0);
    await shoot(page, 'electrode-fit-390');
  });
});
