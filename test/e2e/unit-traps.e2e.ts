/**
 * The input traps of the pair editor: a typed value takes the unit picked next (and a confirmed
 * one converts, with a note and Undo), derivation helpers refuse implausible results unless the
 * user overrides, and Rehm–Weller runs with both radii once the measurement solvent is picked.
 */
import type { Page } from 'playwright-core';
import { calculate } from '@gapwise/calc';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchChromium, shoot, signIn, type Gapwise } from './support/browser';

const baseUrl = inject('baseUrl');
let gw: Gapwise;

beforeAll(async () => {
  gw = await launchChromium();
});
afterAll(async () => {
  expect(gw.offLoopback).toEqual([]);
  await gw?.close();
});

const field = (page: Page, kind: string) => page.locator(`gw-parameter-field[data-kind="${kind}"]`);

async function pickOption(page: Page, select: ReturnType<Page['locator']>, name: string) {
  await select.click();
  await page.getByRole('option', { name, exact: true }).click();
}

async function newPair(page: Page, name: string) {
  await signIn(page, baseUrl, 'editor@gapwise.test');
  await page.getByRole('link', { name: 'New pair' }).click();
  await page.waitForURL(/\/pairs\/new$/);
  await page.getByLabel('Name', { exact: true }).fill(name);
  await page.getByLabel('Donor', { exact: true }).fill(`${name} donor`);
  await page.getByLabel('Acceptor', { exact: true }).fill(`${name} acceptor`);
}

describe('unit pickers', () => {
  it('reads a typed temperature in the unit picked next, converts a saved one, and undoes', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await newPair(page, 'E2E-UNIT');
    await field(page, 'deltaG0').locator('input.value-input').fill('-0.3');
    await field(page, 'lambdaOuter').locator('input.value-input').fill('0.8');
    await field(page, 'coupling').locator('input.value-input').fill('100');

    const temperature = page.locator('input.temperature-input');
    await temperature.fill('25');
    await expect.poll(() => page.locator('.t-warning').innerText()).toMatch(/25 K is outside/);
    await pickOption(page, page.getByLabel('Unit of temperature'), '°C');
    // Typed, not confirmed: the number stays and means 25 °C = 298.15 K (no warning any more).
    expect(await temperature.inputValue()).toBe('25');
    await expect
      .poll(() => page.locator('.temperature .unit-change-text').innerText())
      .toBe('25 is now read as 25 °C (= 298.15 K)');
    expect(await page.locator('.t-warning').count()).toBe(0);
    const at298 = calculate({
      method: 'rate.marcus',
      inputs: {
        deltaG0: -0.3,
        lambda: 0.8,
        coupling: { value: 100, unit: 'cm-1' },
        temperature: 298.15,
      },
    });
    const log10k = at298.ok ? (at298.outputs['log10k'] as number) : NaN;
    await expect
      .poll(() => page.locator('[data-testid="log10k"]').innerText())
      .toBe(log10k.toFixed(2));
    await shoot(page, 'unit-trap-typed-then-picked-1440');

    await page.locator('button.save').click();
    await page.waitForURL(/\/pairs\/[0-9a-f-]{36}$/, { timeout: 15_000 });
    await page.reload();
    await expect.poll(() => temperature.inputValue(), { timeout: 15_000 }).toBe('25');

    // Saved: picking K converts the same temperature and says so.
    await pickOption(page, page.getByLabel('Unit of temperature'), 'K');
    await expect.poll(() => temperature.inputValue()).toBe('298.15');
    expect(await page.locator('.temperature .unit-change-text').innerText()).toBe(
      '25 °C → 298.15 K',
    );
    expect(await page.locator('[data-testid="log10k"]').innerText()).toBe(log10k.toFixed(2));
    await page.locator('.temperature .unit-change-undo').click();
    await expect.poll(() => temperature.inputValue()).toBe('25');
    expect(await page.getByLabel('Unit of temperature').innerText()).toBe('°C');

    // A typed value confirmed with Enter (which also saves the pair) converts too.
    await field(page, 'lambdaOuter').locator('input.value-input').fill('1');
    await field(page, 'lambdaOuter').locator('input.value-input').press('Enter');
    await page.waitForLoadState('networkidle');
    await pickOption(page, field(page, 'lambdaOuter').locator('.unit-select'), 'meV');
    await expect
      .poll(() => field(page, 'lambdaOuter').locator('input.value-input').inputValue())
      .toBe('1000');
    expect(await field(page, 'lambdaOuter').locator('.unit-change-text').innerText()).toBe(
      '1 eV → 1000 meV',
    );
    await context.close();
  });
});

describe('derivation helpers', () => {
  it('flags an absurd GMH coupling and enables "Use this value" only after an override', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await newPair(page, 'E2E-GMH');
    await field(page, 'coupling').locator('button.derive').click();
    await page.getByRole('menuitem', { name: /generalized Mulliken–Hush/ }).click();
    const dialog = page.locator('gw-derivation-dialog');
    await dialog.locator('input[name="transitionDipole"]').fill('2');
    await dialog.locator('input[name="dipoleDifference"]').fill('16');
    await dialog.locator('input[name="transitionEnergy"]').fill('15000');
    await expect
      .poll(() => dialog.locator('.implausible-message').innerText())
      .toMatch(/Electronic coupling \|HAB\| = 1819 eV is unusually large/);
    expect(await dialog.locator('button.use-value').isDisabled()).toBe(true);
    await shoot(page, 'helper-implausible-1440');

    await dialog.locator('input[name="transitionEnergy"]').fill('1.5');
    await expect.poll(() => dialog.locator('.implausible-message').count()).toBe(0);
    expect(await dialog.locator('button.use-value').isDisabled()).toBe(false);
    await context.close();
  });

  it('runs Rehm–Weller with both radii once the measurement solvent is picked', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await newPair(page, 'E2E-RW');
    await page.getByText('Geometry, medium and potentials').click();
    const fill = (kind: string, text: string) =>
      field(page, kind).locator('input.value-input').fill(text);
    await fill('distance', '7');
    await fill('radiusDonor', '3.5');
    await fill('radiusAcceptor', '3.5');
    await fill('donorOxidation', '1.2');
    await fill('acceptorReduction', '-0.8');
    await fill('excitationEnergy', '2.5');
    await fill('epsilonStatic', '8.93');

    // Without the measurement solvent the helper says what is missing, in the labels shown.
    await field(page, 'deltaG0').locator('button.derive').click();
    await page.getByRole('menuitem', { name: /Rehm–Weller/ }).click();
    const dialog = page.locator('gw-derivation-dialog');
    await expect
      .poll(() => dialog.innerText())
      .toMatch(/needs the donor radius, the acceptor radius and ε of the solvent/);
    expect(await dialog.innerText()).not.toMatch(/radiusDonor|radiusAcceptor|epsilonReference/);
    await dialog.getByRole('button', { name: 'Cancel' }).click();

    // The floating label covers the empty select, as for a person: click the field.
    await pickOption(
      page,
      page.locator('mat-form-field.measurement-solvent'),
      'Acetonitrile (ε = 35.94)',
    );
    await expect
      .poll(() => field(page, 'epsilonMeasurement').locator('input.value-input').inputValue())
      .toBe('35.94');
    await field(page, 'deltaG0').locator('button.derive').click();
    await page.getByRole('menuitem', { name: /Rehm–Weller/ }).click();
    const expected = calculate({
      method: 'drivingForce.rehmWeller',
      inputs: {
        donorOxidation: 1.2,
        acceptorReduction: -0.8,
        excitationEnergy: 2.5,
        distance: 7,
        epsilon: 8.93,
        radiusDonor: 3.5,
        radiusAcceptor: 3.5,
        epsilonReference: 35.94,
      },
    });
    expect(expected.ok).toBe(true);
    const deltaG0 = expected.ok ? (expected.outputs['deltaG0CS'] as number) : NaN;
    await expect
      .poll(() => dialog.locator('.result-value').innerText())
      .toBe(`${Number(deltaG0.toPrecision(4))} eV`.replace('-', '−'));
    await shoot(page, 'rehm-weller-radii-1440');
    await dialog.locator('button.use-value').click();
    await expect
      .poll(() => field(page, 'deltaG0').locator('input.value-input').inputValue())
      // The field shows what the value supports (4 significant figures without an uncertainty);
      // the full value is what is stored (pair-editor-store.spec checks the save request).
      .toBe(String(Number(deltaG0.toPrecision(4))));
    await context.close();
  });
});
