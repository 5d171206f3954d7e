/**
 * Both rates of a pair in chromium: the pairs table lists log10 k_CR and the ratio, and the pair
 * page shows k_CS beside k_CR with their regimes, the ratio in words and which model
 * recombination used (demo DA-3 carries ħω, so recombination is Marcus–Levich–Jortner). The
 * strings must be the pair model's for the pair the API returns; k_CR is also checked against
 * the core's own MLJ rate for the pair's inputs. Screenshots at 1440 and 390 px.
 */
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { calculate } from '@gapwise/calc';
import {
  computePairResults,
  formatLog10,
  pairRatesView,
  plainText,
  type Pair,
  type PairListItem,
} from '@gapwise/contracts';
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

async function pairsTable(page: Page, wid: string): Promise<void> {
  await page.goto(`${baseUrl}/w/${wid}/pairs`);
  await expect
    .poll(() => page.getByRole('link', { name: 'DA-3', exact: true }).count(), {
      timeout: 15_000,
    })
    .toBeGreaterThan(0);
}

describe('charge separation and recombination', () => {
  it('shows k_CR, its regime and the ratio in the table and on the pair page', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await page.setViewportSize({ width: 1440, height: 900 });
    await signIn(page, baseUrl, 'editor@gapwise.test');
    const workspaces = (await (await page.request.get(`${baseUrl}/api/workspaces`)).json()) as {
      id: string;
    }[];
    const wid = workspaces[0].id;
    await pairsTable(page, wid);

    // The table row of DA-3 against the API's list item.
    const list = (await (
      await page.request.get(`${baseUrl}/api/workspaces/${wid}/pairs?q=DA-3`)
    ).json()) as { items: PairListItem[] };
    const item = list.items.find((i) => i.name === 'DA-3')!;
    expect(item.log10kCr).not.toBeNull();
    const row = page.locator('tr', { has: page.getByRole('link', { name: 'DA-3', exact: true }) });
    await expect
      .poll(() => row.locator('[data-testid="ratio"]').innerText())
      .toBe(item.log10Ratio!.toFixed(1).replace('-', '\u2212'));
    await expect.poll(() => row.innerText()).toContain(formatLog10(item.log10kCr!));
    await shoot(page, 'pair-rates-table-1440');

    await page.getByRole('link', { name: 'DA-3', exact: true }).click();
    await page.waitForURL(/\/pairs\/[0-9a-f-]{36}$/);
    const id = /\/pairs\/([0-9a-f-]{36})$/.exec(page.url())![1];
    const pair = (await (await page.request.get(`${baseUrl}/api/pairs/${id}`)).json()) as Pair;
    const shown = pairRatesView(computePairResults(pair));
    const steps = page.getByTestId('steps');
    await expect.poll(() => steps.count(), { timeout: 15_000 }).toBe(1);
    await expect.poll(() => page.getByTestId('k-cr').innerText()).toBe(shown.recombination!.rate);
    expect(await page.getByTestId('log10k-cr').innerText()).toBe(shown.recombination!.log10k);
    expect(await page.getByTestId('regime-cr').innerText()).toBe('Inverted');
    // The page draws the subscripts (k_CS as k<sub>CS</sub>): compare the text read.
    expect(await page.getByTestId('ratio').innerText()).toBe(plainText(shown.ratio!));
    expect(shown.ratio).toMatch(/outpaces/);
    expect(await page.getByTestId('cr-note').innerText()).toMatch(
      /Marcus–Levich–Jortner because ħω is given/,
    );

    // k_CR is the core's MLJ rate for ΔG°_CR with the pair's λ parts, ħω and |H_AB|.
    const v = (kind: string) => pair.parameters.find((p) => p.kind === kind)!.value;
    const core = calculate({
      method: 'rate.mlj',
      inputs: {
        deltaG0: v('deltaG0Recombination'),
        lambdaSolvent: v('lambdaOuter'),
        lambdaVib: v('lambdaInner'),
        hbarOmega: v('hbarOmega'),
        coupling: v('coupling'),
        temperature: pair.temperature,
      },
    });
    expect(core.ok).toBe(true);
    if (core.ok) {
      expect(await page.getByTestId('log10k-cr').innerText()).toBe(
        formatLog10(core.outputs.log10k),
      );
    }
    await shoot(page, 'pair-rates-page-1440');

    await page.setViewportSize({ width: 390, height: 844 });
    await expect.poll(() => page.getByTestId('k-cr').isVisible()).toBe(true);
    await shoot(page, 'pair-rates-page-390');
    await pairsTable(page, wid);
    await shoot(page, 'pair-rates-table-390');
    await context.close();
  });
});
