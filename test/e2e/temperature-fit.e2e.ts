/**
 * The rate-vs-temperature plot on the pair page takes measured k(T) and shows the
 * analysis.temperature fit, at 1440 and 390 px wide.
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

describe('measured k(T) on the pair page', () => {
  it('draws the measured points and the Arrhenius fit with E_a ± SE at 1440 and 390 px', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await page.setViewportSize({ width: 1440, height: 900 });
    await signIn(page, baseUrl, 'editor@gapwise.test');
    await page.getByRole('link', { name: 'DA-1', exact: true }).click();
    await page.waitForURL(/\/pairs\/[0-9a-f-]{36}$/);
    await page.getByRole('tab', { name: 'Rate vs temperature' }).click();
    const area = page.locator('gw-temperature-plot textarea');
    await area.fill('260 3.1e8\n280 6.0e8\n300 1.05e9\n320 1.7e9\n340 2.6e9');
    await expect.poll(() => page.locator('gw-temperature-plot circle.measured').count()).toBe(5);
    await expect
      .poll(() => page.locator('gw-temperature-plot p.measured-fit').innerText())
      .toContain('Arrhenius fit');
    await page.locator('gw-temperature-plot').scrollIntoViewIfNeeded();
    await page
      .locator('gw-temperature-plot')
      .screenshot({ path: 'test-output/screenshots/temperature-fit-1440.png' });
    await shoot(page, 'pair-temperature-fit-1440');
    await page.setViewportSize({ width: 390, height: 844 });
    await expect.poll(() => page.locator('gw-temperature-plot circle.measured').count()).toBe(5);
    await page
      .locator('gw-temperature-plot')
      .screenshot({ path: 'test-output/screenshots/temperature-fit-390.png' });
    await shoot(page, 'pair-temperature-fit-390');
  });
});
