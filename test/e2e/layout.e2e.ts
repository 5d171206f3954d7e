/**
 * Responsive layout: at 390 px (a phone) no signed-in page scrolls sideways
 * (document.documentElement.scrollWidth ≤ innerWidth), the sections fold behind a menu button,
 * and every page is photographed at 390 and 1440 px for a look (test-output/screenshots/).
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
  expect(gw.offLoopback).toEqual([]);
  await gw?.close();
});

/** The signed-in pages, as paths under the workspace (`{w}`) or absolute, once ids are known. */
async function signedInPages(page: Page): Promise<Array<[string, string]>> {
  await signIn(page, baseUrl, 'owner@gapwise.test');
  await page.waitForURL(/\/w\/[0-9a-f-]{36}\/pairs$/);
  const wid = /\/w\/([0-9a-f-]{36})\//.exec(page.url())![1];
  await expect
    .poll(() => page.locator('a.pair-link').count(), { timeout: 15_000 })
    .toBeGreaterThan(0);
  const pairHref = await page.locator('a.pair-link').first().getAttribute('href');
  await page.goto(`${baseUrl}/w/${wid}/reports`);
  await expect
    .poll(() => page.locator('a[href*="/reports/"]').count(), { timeout: 15_000 })
    .toBeGreaterThan(0);
  const reportHref = await page
    .locator('a[href*="/reports/"]:not([href$="/new"])')
    .first()
    .getAttribute('href');
  return [
    ['pairs', `/w/${wid}/pairs`],
    ['pair-new', `/w/${wid}/pairs/new`],
    ['pair', pairHref!],
    ['pair-history', `${pairHref}/history`],
    ['screens', `/w/${wid}/screens`],
    ['series', `/w/${wid}/series`],
    ['reports', `/w/${wid}/reports`],
    ['report-new', `/w/${wid}/reports/new`],
    ['report', reportHref!],
    ['traces', `/w/${wid}/traces`],
    ['members', `/w/${wid}/members`],
    ['audit', `/w/${wid}/audit`],
    ['account', '/account'],
    ['reviews', '/reviews'],
  ];
}

async function horizontalOverflow(
  page: Page,
): Promise<{ scrollWidth: number; culprits: string[] }> {
  return page.evaluate(() => {
    const width = window.innerWidth;
    const culprits: string[] = [];
    for (const el of Array.from(document.querySelectorAll<HTMLElement>('body *'))) {
      const r = el.getBoundingClientRect();
      if (r.right > width + 1 && r.width > 0 && culprits.length < 8) {
        culprits.push(
          `${el.tagName.toLowerCase()}.${el.className.toString().split(' ').slice(0, 2).join('.')} → ${Math.round(r.right)}`,
        );
      }
    }
    return { scrollWidth: document.documentElement.scrollWidth, culprits };
  });
}

async function settle(page: Page, path: string) {
  await page.goto(`${baseUrl}${path}`, { waitUntil: 'networkidle' });
  await page.locator('main > :not(router-outlet)').first().waitFor({ timeout: 15_000 });
  await page.waitForTimeout(800);
}

describe('responsive layout', () => {
  it('has no horizontal scroll at 390 px on any signed-in page (shot at 390 px)', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    const pages = await signedInPages(page);
    const overflowing: string[] = [];
    await page.setViewportSize({ width: 390, height: 844 });
    for (const [name, path] of pages) {
      await settle(page, path);
      const { scrollWidth, culprits } = await horizontalOverflow(page);
      if (scrollWidth > 390)
        overflowing.push(`${name}: ${scrollWidth} px (${culprits.join('; ')})`);
      await shoot(page, `layout-${name}-390`);
    }
    expect(overflowing).toEqual([]);
    await context.close();
  }, 600_000);

  it('shoots every signed-in page at 1440 px for a look', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    const pages = await signedInPages(page);
    await page.setViewportSize({ width: 1440, height: 900 });
    for (const [name, path] of pages) {
      await settle(page, path);
      await shoot(page, `layout-${name}-1440`);
    }
    await context.close();
  }, 600_000);

  it('folds the sections behind a menu button at 390 px that opens, navigates and closes', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await page.setViewportSize({ width: 390, height: 844 });
    await signIn(page, baseUrl, 'owner@gapwise.test');
    await page.waitForURL(/\/pairs$/);
    const menu = page.getByRole('button', { name: 'Open the navigation' });
    expect(await page.getByRole('link', { name: 'Screens' }).isVisible()).toBe(false);
    // The brand does not overlap the navigation button or the workspace switcher.
    const boxes = await page.evaluate(() =>
      ['.nav-button', '.brand', '.workspace-switch'].map((s) => {
        const r = document.querySelector(s)!.getBoundingClientRect();
        return { left: r.left, right: r.right };
      }),
    );
    expect(boxes[0].right).toBeLessThanOrEqual(boxes[1].left + 1);
    expect(boxes[1].right).toBeLessThanOrEqual(boxes[2].left + 1);
    await menu.click();
    await page.getByRole('link', { name: 'Screens' }).click();
    await page.waitForURL(/\/screens$/);
    // The app renders without zone.js: a change shows at the next frame, so poll.
    await expect.poll(() => page.getByRole('link', { name: 'Screens' }).isVisible()).toBe(false);
    await menu.click();
    await expect.poll(() => page.getByRole('link', { name: 'Screens' }).isVisible()).toBe(true);
    await shoot(page, 'layout-menu-open-390');
    await page.keyboard.press('Escape');
    await expect.poll(() => page.getByRole('link', { name: 'Screens' }).isVisible()).toBe(false);
    expect(
      await page.evaluate(() => document.activeElement?.classList.contains('nav-button')),
    ).toBe(true);
    await context.close();
  });
});
