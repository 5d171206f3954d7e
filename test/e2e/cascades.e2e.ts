/**
 * Cascades in the browser (issue 17): build a demo-like sensitiser–bridge–acceptor cascade from
 * scratch (states with typed, E₀₀-in-nm and step-derived energies; decays and ET steps), save it,
 * change a λ and see the long-lived yield move, export both pictures (the SVG carries the levels,
 * the PNG is a PNG), open the seeded demo triad; the list and page at 1440 and 390 px.
 */
import { readFileSync } from 'node:fs';
import type { Locator, Page } from 'playwright-core';
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

async function choose(page: Page, scope: Locator, label: string, option: string) {
  // The previous select's panel closes with an animation; its backdrop must be gone first.
  await page.locator('.cdk-overlay-backdrop').waitFor({ state: 'detached' });
  await scope.getByRole('combobox', { name: label, exact: true }).click({ force: true });
  await page.getByRole('option', { name: option, exact: true }).click();
}

async function type(scope: Locator, label: string, value: string) {
  const input = scope.getByLabel(label, { exact: true });
  await input.fill(value);
  await input.press('Tab');
}

/** Adds a state and fills it; `energy` decides the mode. */
async function addState(
  page: Page,
  id: string,
  label: string,
  kind: string,
  energy:
    | { mode: 'typed'; g: string }
    | { mode: 'e00'; value: string; unit: string }
    | { mode: 'step'; from: string; dg: string },
) {
  await page.getByRole('button', { name: 'Add a state' }).click();
  const row = page.locator('fieldset.state-row').last();
  await type(row, 'Id', id);
  await type(row, 'Label', label);
  await choose(page, row, 'Kind', kind);
  if (energy.mode === 'typed') {
    await choose(page, row, 'Free energy', 'Typed free energy');
    await type(row, 'G', energy.g);
  } else if (energy.mode === 'e00') {
    await choose(page, row, 'Free energy', 'Excited state from E₀₀');
    await type(row, 'E₀₀', energy.value);
    await choose(page, row, 'Unit', energy.unit);
  } else {
    await choose(page, row, 'Free energy', 'Another state plus a step ΔG°');
    await choose(page, row, 'Starting state', energy.from);
    await type(row, 'Step ΔG°', energy.dg);
  }
}

async function addStep(
  page: Page,
  from: string,
  to: string,
  step: { k: string } | { tauPs: string } | { lambda: string; h: string },
) {
  await page.getByRole('button', { name: 'Add a step' }).click();
  const row = page.locator('fieldset.link-row').last();
  await choose(page, row, 'From', from);
  await choose(page, row, 'To', to);
  if ('k' in step) {
    await choose(page, row, 'Type', 'Decay: fixed rate k');
    await type(row, 'Rate k (s⁻¹)', step.k);
  } else if ('tauPs' in step) {
    await choose(page, row, 'Type', 'Decay: lifetime τ');
    await type(row, 'Lifetime τ', step.tauPs);
  } else {
    await type(row, 'λ', step.lambda);
    await type(row, '|H_AB|', step.h);
  }
}

async function noHorizontalScroll(page: Page) {
  return page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth + 1);
}

describe('cascades', () => {
  it('builds a triad from scratch, saves it, moves the yield with λ, exports both pictures', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await page.setViewportSize({ width: 1440, height: 900 });
    await signIn(page, baseUrl, 'editor@gapwise.test');
    await page.getByRole('link', { name: 'Cascades', exact: true }).click();
    await page.waitForURL(/\/cascades$/);
    await expect
      .poll(() =>
        page.getByRole('link', { name: 'Sensitiser–bridge–acceptor triad (demo)' }).count(),
      )
      .toBe(1);
    await shoot(page, 'cascade-list-1440');
    await page.setViewportSize({ width: 390, height: 844 });
    await shoot(page, 'cascade-list-390');
    expect(await noHorizontalScroll(page), 'no horizontal scroll at 390 px (list)').toBe(true);
    await page.setViewportSize({ width: 1440, height: 900 });

    await page.getByRole('link', { name: 'New cascade' }).click();
    await page.waitForURL(/\/cascades\/new$/);
    await page.getByLabel('Name', { exact: true }).fill('Triad built in the browser');
    // The ground state S0 is there from the start (G = 0).
    await addState(page, 'S1', 'Singlet', 'Locally excited singlet', {
      mode: 'e00',
      value: '590',
      unit: 'nm',
    });
    await addState(page, 'T1', 'Triplet', 'Locally excited triplet', { mode: 'typed', g: '1.3' });
    // 590 nm = 2.1014 eV; CS1 = S1 − 0.3014 eV = 1.80 eV.
    await addState(page, 'CS1', 'Bridge CS', 'Charge-separated intermediate', {
      mode: 'step',
      from: 'Singlet',
      dg: '-0.3014',
    });
    await addState(page, 'CS2', 'Final CS', 'Final charge-separated state', {
      mode: 'typed',
      g: '1.45',
    });
    await expect
      .poll(() => page.locator('fieldset.state-row').nth(3).locator('.resolved .g').innerText())
      .toContain('1.8');
    await addStep(page, 'Singlet', 'Ground state', { tauPs: '3000' });
    await addStep(page, 'Singlet', 'Triplet', { k: '1e8' });
    await addStep(page, 'Triplet', 'Ground state', { k: '5e4' });
    await addStep(page, 'Singlet', 'Bridge CS', { lambda: '0.55', h: '30' });
    await addStep(page, 'Bridge CS', 'Final CS', { lambda: '0.6', h: '25' });
    await addStep(page, 'Bridge CS', 'Ground state', { lambda: '0.7', h: '25' });
    await addStep(page, 'Final CS', 'Ground state', { lambda: '0.8', h: '0.4' });
    await addStep(page, 'Final CS', 'Triplet', { lambda: '0.8', h: '0.15' });

    const yieldText = page.locator('.ll-yield');
    await expect.poll(() => yieldText.count(), { timeout: 15_000 }).toBe(1);
    expect(await page.locator('ul.errors').count()).toBe(0);
    // Each ET step shows its rate, regime and coupling regime.
    const step4 = page.locator('fieldset.link-row').nth(3);
    await expect.poll(() => step4.locator('.rate').innerText()).toMatch(/× 10/);
    expect(await step4.locator('.regime').innerText()).toMatch(/region/);
    expect(await step4.locator('.coupling-regime').innerText()).toMatch(/adiabatic|Intermediate/i);

    await page.getByRole('button', { name: 'Create cascade' }).click();
    await page.waitForURL(/\/cascades\/[0-9a-f-]{36}$/, { timeout: 30_000 });
    await expect.poll(() => yieldText.count(), { timeout: 15_000 }).toBe(1);
    const id = page.url().split('/').pop()!;
    const stored = (await (await page.request.get(`${baseUrl}/api/cascades/${id}`)).json()) as {
      longLivedYield: number;
      version: number;
      design: unknown;
    };
    expect(stored.version).toBe(1);
    expect(stored.design).not.toBeNull();
    // The page computes in the browser what the API computed on save (same core, same request).
    const before = Number(await yieldText.innerText());
    expect(before).toBeCloseTo(stored.longLivedYield, 2);
    expect(before).toBeGreaterThan(0.5);

    // A much larger λ of the first CS step slows it; fewer singlets reach the final CS state.
    await type(page.locator('fieldset.link-row').nth(3), 'λ', '1.6');
    await expect
      .poll(async () => Number(await yieldText.innerText()), { timeout: 15_000 })
      .toBeLessThan(before - 0.05);

    // A σ on λ: Monte Carlo in the worker gives a 95 % interval on the long-lived yield.
    await type(page.locator('fieldset.link-row').nth(3), 'σ of λ', '0.05');
    await expect
      .poll(() => page.locator('.long-lived .interval').count(), { timeout: 30_000 })
      .toBeGreaterThan(0);
    expect(await page.locator('.long-lived .interval').first().innerText()).toMatch(/95 %/);
    expect(await page.locator('.mc-state').innerText()).toContain('2000 Monte Carlo samples');

    // Both pictures export as SVG (with the levels) and PNG.
    for (const what of ['the state-energy diagram', 'the energy landscape tree']) {
      const svgDownload = page.waitForEvent('download');
      await page.getByRole('button', { name: `Export ${what} as SVG` }).click();
      const svg = readFileSync((await (await svgDownload).path())!, 'utf8');
      expect(svg).toContain('<svg');
      expect(svg).toContain('data-state="CS2"');
      expect(svg).toContain('Final CS');
      const pngDownload = page.waitForEvent('download');
      await page.getByRole('button', { name: `Export ${what} as PNG` }).click();
      const png = readFileSync((await (await pngDownload).path())!);
      expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
      expect(png.length).toBeGreaterThan(2000);
    }
    const treeSvg = await page.locator('gw-landscape-tree svg.cascade-svg').innerHTML();
    expect(treeSvg).toContain('Decays (no transition state');

    await page.getByRole('button', { name: 'Save as new version' }).click();
    await expect.poll(() => page.locator('.save-message').innerText()).toContain('version 2');
    await expect.poll(() => page.locator('ul.versions li').count()).toBe(2);
    const v2 = (await (await page.request.get(`${baseUrl}/api/cascades/${id}`)).json()) as {
      longLivedYield: number;
    };
    expect(v2.longLivedYield).toBeLessThan(stored.longLivedYield - 0.05);

    // Someone else saves version 3 meanwhile: this page's save is refused with a conflict.
    const other = await apiWrite(page, baseUrl, 'put', `/api/cascades/${id}`, {
      name: 'Triad built in the browser',
      network: (await (await page.request.get(`${baseUrl}/api/cascades/${id}`)).json()).network,
      version: 2,
    });
    expect(other.status()).toBe(200);
    await page.getByRole('button', { name: 'Save as new version' }).click();
    await expect
      .poll(() => page.locator('.save-message').innerText())
      .toContain('changed by someone else');
    await page.getByRole('button', { name: 'Reload the stored version' }).click();
    await expect.poll(() => page.locator('.version').innerText()).toContain('version 3');

    // Version 1's inputs back into the editor: λ 0.55 eV again, and the yield with it.
    await expect.poll(() => page.locator('ul.versions li').count()).toBe(3);
    await page
      .locator('ul.versions li')
      .last()
      .getByRole('button', { name: 'Load into the editor' })
      .click();
    await expect
      .poll(() =>
        page.locator('fieldset.link-row').nth(3).getByLabel('λ', { exact: true }).inputValue(),
      )
      .toBe('0.55');
    await expect
      .poll(async () => Number(await yieldText.innerText()), { timeout: 15_000 })
      .toBeCloseTo(before, 2);
    await context.close();
  });

  it('opens the seeded demo triad with its results and pictures at 1440 and 390 px', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await page.setViewportSize({ width: 1440, height: 900 });
    await signIn(page, baseUrl, 'editor@gapwise.test');
    await page.getByRole('link', { name: 'Cascades', exact: true }).click();
    await page.getByRole('link', { name: 'Sensitiser–bridge–acceptor triad (demo)' }).click();
    await page.waitForURL(/\/cascades\/[0-9a-f-]{36}$/);
    await expect.poll(() => page.locator('fieldset.state-row').count()).toBe(5);
    await expect.poll(() => page.locator('fieldset.link-row').count()).toBe(8);
    await expect.poll(() => page.locator('.ll-yield').count(), { timeout: 15_000 }).toBe(1);
    const id = page.url().split('/').pop()!;
    const stored = (await (await page.request.get(`${baseUrl}/api/cascades/${id}`)).json()) as {
      longLivedYield: number;
    };
    expect(Number(await page.locator('.ll-yield').innerText())).toBeCloseTo(
      stored.longLivedYield,
      2,
    );
    expect(await page.locator('gw-state-energy-diagram g.level').count()).toBe(5);
    expect(await page.locator('gw-landscape-tree g.minimum').count()).toBe(5);
    expect(await page.locator('.pathway').innerText()).toContain('→');
    await shoot(page, 'cascade-page-1440');
    await page
      .locator('section.pictures')
      .screenshot({ path: 'test-output/screenshots/cascade-page-1440-pictures.png' });
    await page.setViewportSize({ width: 390, height: 844 });
    await page.waitForTimeout(300);
    await shoot(page, 'cascade-page-390');
    for (const part of ['results', 'states', 'links', 'pictures']) {
      await page
        .locator(`section.${part}`)
        .screenshot({ path: `test-output/screenshots/cascade-page-390-${part}.png` });
    }
    expect(await noHorizontalScroll(page), 'no horizontal scroll at 390 px (page)').toBe(true);
    await context.close();
  });
});
