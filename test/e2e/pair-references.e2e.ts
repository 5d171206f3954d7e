/**
 * The pair editor's reference electrodes and helpers in Debian's chromium against the real server:
 * a pair whose potentials were saved vs SCE and vs Fc⁺/Fc in MeCN opens with those references,
 * shows the stored SHE value and the mixed-reference warning, keeps E₀₀ in nm, offers thermal MLJ
 * for a low-frequency mode and, being strongly coupled, the Landau–Zener κ_el and the adiabatic
 * barrier beside the rate; the normal-modes helper fills λᵢ and ħω. The demo screen's results
 * table shows the coupling-regime column. Every page is photographed at 1440 and 390 px.
 */
import type { Page } from 'playwright-core';
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

const poll = <T>(read: () => T | Promise<T>) => expect.poll(read, { timeout: 20_000 });

const measured = { kind: 'measured' };
const param = (kind: string, value: number, unit: string) => ({
  kind,
  value,
  unit,
  uncertainty: null,
  provenance: measured,
});

async function both(page: Page, name: string): Promise<void> {
  await page.setViewportSize({ width: 1440, height: 900 });
  await shoot(page, `${name}-1440`);
  await page.setViewportSize({ width: 390, height: 844 });
  await shoot(page, `${name}-390`);
  await page.setViewportSize({ width: 1440, height: 900 });
}

describe('pair references and helpers in chromium', () => {
  it('reopens potentials on their references, warns, and offers the adiabatic and thermal helpers', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await signIn(page, baseUrl, 'owner@gapwise.test');
    const ws = await apiWrite(page, baseUrl, 'post', '/api/workspaces', { name: 'References' });
    const wid = ((await ws.json()) as { id: string }).id;
    // E_ox = 1.10 V vs SCE (+0.241 V vs SHE) and E_red = −0.40 V vs Fc⁺/Fc in MeCN (+0.621 V vs
    // SHE), stored vs SHE; E₀₀ typed as 450 nm; H = 0.05 eV, λ = 0.8 eV: intermediate coupling.
    const created = await apiWrite(page, baseUrl, 'post', `/api/workspaces/${wid}/pairs`, {
      name: 'Referenced pair',
      donor: 'D',
      acceptor: 'A',
      medium: 'acetonitrile',
      temperature: 298.15,
      model: 'mlj',
      parameters: [
        param('deltaG0', -0.3, 'eV'),
        param('lambdaInner', 0.1, 'eV'),
        param('lambdaOuter', 0.7, 'eV'),
        param('coupling', 0.05, 'eV'),
        param('hbarOmega', 0.05, 'eV'),
        param('donorOxidation', 1.1 + 0.241, 'V vs SCE'),
        param('acceptorReduction', -0.4 + 0.621, 'V vs Fc in MeCN'),
        param('excitationEnergy', 1239.84198 / 450, 'nm'),
      ],
    });
    expect(created.status()).toBe(201);
    const pairId = ((await created.json()) as { id: string }).id;
    await page.goto(`${baseUrl}/w/${wid}/pairs/${pairId}`);
    await poll(() => page.locator('[data-testid="k"]').innerText()).toMatch(/10/);

    await page.locator('mat-expansion-panel.context mat-expansion-panel-header').click();
    const donor = page.locator('gw-parameter-field[data-kind="donorOxidation"]');
    await poll(() => donor.locator('.reference-select').innerText()).toContain('SCE');
    expect(await donor.locator('input.value-input').inputValue()).toBe('1.1');
    expect(await donor.locator('.she-echo').innerText()).toBe('= 1.341 V vs SHE');
    const acceptor = page.locator('gw-parameter-field[data-kind="acceptorReduction"]');
    expect(await acceptor.locator('.reference-select').innerText()).toContain('Fc⁺/Fc in MeCN');
    expect(await acceptor.locator('input.value-input').inputValue()).toBe('-0.4');
    expect(await page.locator('.reference-warning').innerText()).toContain('SCE');
    const e00 = page.locator('gw-parameter-field[data-kind="excitationEnergy"]');
    expect(await e00.locator('.unit-select').innerText()).toBe('nm');
    expect(Number(await e00.locator('input.value-input').inputValue())).toBeCloseTo(450, 4); // the test used hc/e = 1239.84198, the core the CODATA value

    // ħω = 0.05 eV < 4 k_BT = 0.103 eV: thermal MLJ is offered.
    expect(await page.locator('.thermal-hint').innerText()).toContain('4 k_BT');
    // Strongly coupled: κ_el and the adiabatic barrier beside the rate.
    expect(await page.locator('gw-adiabatic-side h2').innerText()).toContain('intermediate');
    expect(await page.locator('gw-adiabatic-side .barrier').innerText()).toContain('eV');
    await both(page, 'pair-references');

    await page.locator('.use-thermal').click();
    await poll(() => page.locator('.thermal-hint').count()).toBe(0);

    // Same reference on both sides: the warning goes.
    await acceptor.locator('.reference-select').click();
    await page.locator('mat-option', { hasText: 'SCE' }).first().click();
    await poll(() => page.locator('.reference-warning').count()).toBe(0);

    // Normal modes fill λᵢ and ħω as derived.
    await page.locator('gw-parameter-field[data-kind="lambdaInner"] button.derive').click();
    await page.locator('.derive-option', { hasText: 'normal modes' }).click();
    const dialog = page.locator('gw-normal-modes-dialog');
    await dialog.locator('.mode[data-mode="1"] .omega-input').fill('1600');
    await dialog.locator('.mode[data-mode="1"] .weight-input').fill('1.1');
    await dialog.locator('.mode[data-mode="2"] .omega-input').fill('400');
    await dialog.locator('.mode[data-mode="2"] .weight-input').fill('0.32');
    await poll(() => dialog.locator('.lambda-vib').innerText()).toBe('0.2341 eV');
    await both(page, 'pair-normal-modes');
    await dialog.locator('.use-value').click();
    const inner = page.locator('gw-parameter-field[data-kind="lambdaInner"]');
    await poll(() => inner.locator('.derived-badge').innerText()).toContain('normal-mode');
    expect(Number(await inner.locator('input.value-input').inputValue())).toBeCloseTo(
      1888 / 8065.543937, // Σ S_j ħω_j in cm⁻¹ over 1 eV = 8065.543937 cm⁻¹ (CODATA 2018)
      4, // shown to 4 significant figures (no uncertainty); stored in full
    );
    await context.close();
  });

  it('shows the coupling regime column in the screen results', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await signIn(page, baseUrl, 'owner@gapwise.test');
    const list = (await (await page.request.get(`${baseUrl}/api/workspaces`)).json()) as Array<{
      id: string;
      name: string;
    }>;
    const wid = list.find((w) => w.name === 'Tidewater Flow-Cell Mediator Screen')!.id;
    await page.goto(`${baseUrl}/w/${wid}/screens`);
    await page.locator('table.screens tbody tr a').first().click();
    await poll(() => page.locator('td[data-coupling-regime]').count()).toBeGreaterThan(0);
    expect(await page.locator('th', { hasText: 'Coupling regime' }).count()).toBe(1);
    const cells = await page.locator('td[data-coupling-regime]').allInnerTexts();
    for (const c of cells) expect(c.trim()).toMatch(/^(nonadiabatic|intermediate|adiabatic|—)$/);
    await both(page, 'screen-coupling-regime');
    // The column sits right of the table's fold: scrolled into view for a look.
    await page.locator('th', { hasText: 'Coupling regime' }).scrollIntoViewIfNeeded();
    await page.screenshot({ path: 'test-output/screenshots/screen-coupling-regime-column.png' });
    await context.close();
  });
});
