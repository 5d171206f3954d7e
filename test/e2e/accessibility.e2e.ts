/**
 * axe-core scan of the main pages (sign-in, pairs table, pair editor, members): no serious or
 * critical violation.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchChromium, shoot, signIn, type Gapwise } from './support/browser';

const baseUrl = inject('baseUrl');
const axeSource = readFileSync(
  createRequire(import.meta.url).resolve('axe-core/axe.min.js'),
  'utf8',
);
let gw: Gapwise;

beforeAll(async () => {
  gw = await launchChromium();
});
afterAll(async () => {
  expect(gw.offLoopback).toEqual([]);
  await gw?.close();
});

interface Violation {
  id: string;
  impact: string | null;
  help: string;
  nodes: Array<{ target: string[] }>;
}

async function seriousViolations(page: Page): Promise<string[]> {
  // Evaluated through the DevTools protocol: the app's CSP (rightly) refuses inline scripts.
  await page.evaluate(`${axeSource}\n;true`);
  const violations = (await page.evaluate(async () => {
    const axe = (
      window as unknown as { axe: { run: (ctx: Document) => Promise<{ violations: unknown[] }> } }
    ).axe;
    return (await axe.run(document)).violations;
  })) as Violation[];
  return violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map(
      (v) =>
        `${v.impact} ${v.id}: ${v.help} at ${v.nodes
          .map((n) => n.target.join(' '))
          .slice(0, 3)
          .join(' | ')}`,
    );
}

describe('accessibility of the main pages', () => {
  it('has no serious or critical axe violation on sign-in, pairs, pair editor and members', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await page.goto(`${baseUrl}/sign-in`, { waitUntil: 'networkidle' });
    const found: Record<string, string[]> = { 'sign-in': await seriousViolations(page) };

    await signIn(page, baseUrl, 'owner@gapwise.test');
    await page.waitForURL(/\/pairs$/);
    await expect
      .poll(() => page.locator('a.pair-link').count(), { timeout: 15_000 })
      .toBeGreaterThan(0);
    found['pairs'] = await seriousViolations(page);

    await page.locator('a.pair-link').first().click();
    await page.waitForURL(/\/pairs\/[0-9a-f-]{36}$/);
    await expect
      .poll(() => page.locator('gw-parabola-plot path.curve').count(), { timeout: 15_000 })
      .toBeGreaterThan(0);
    found['pair editor'] = await seriousViolations(page);

    await page.getByRole('link', { name: 'Members' }).click();
    await page.waitForURL(/\/members$/);
    await expect
      .poll(() => page.locator('table tr').count(), { timeout: 15_000 })
      .toBeGreaterThan(1);
    found['members'] = await seriousViolations(page);
    await shoot(page, 'members');

    expect(found).toEqual({ 'sign-in': [], pairs: [], 'pair editor': [], members: [] });
    await context.close();
  });
});
