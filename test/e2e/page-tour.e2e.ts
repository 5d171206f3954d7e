/**
 * A tour of every page, signed out and signed in, at 1440 and 390 px: each is photographed
 * (test-output/screenshots/tour-<page>-<width>.png, to be looked at), none scrolls sideways at
 * 390 px, and none writes an error to the browser console (a failed request included).
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

/** Console errors of a page, with the path that was open when each was written. */
function recordConsoleErrors(page: Page): string[] {
  const errors: string[] = [];
  const where = () => new URL(page.url()).pathname;
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(`${where()}: ${m.text()}`);
  });
  page.on('pageerror', (e) => errors.push(`${where()}: ${e.message}`));
  return errors;
}

async function settle(page: Page, path: string) {
  await page.goto(`${baseUrl}${path}`, { waitUntil: 'networkidle' });
  await page.locator('h1').first().waitFor({ timeout: 15_000 });
  await page.waitForTimeout(600);
}

/** The page's scroll width and the outermost elements that reach past the viewport. */
async function overflow(page: Page): Promise<{ width: number; culprits: string[] }> {
  return page.evaluate(() => {
    const width = window.innerWidth;
    const culprits: string[] = [];
    for (const el of Array.from(document.querySelectorAll<HTMLElement>('main *'))) {
      const r = el.getBoundingClientRect();
      const parent = el.parentElement?.getBoundingClientRect();
      // Only where the overflow starts: the element sticks out, its parent does not.
      if (r.right > width + 1 && r.width > 0 && parent && parent.right <= width + 1) {
        if (culprits.length < 6) {
          const cls = el.className.toString().split(' ').slice(0, 2).join('.');
          culprits.push(`${el.tagName.toLowerCase()}.${cls} → ${Math.round(r.right)}`);
        }
      }
    }
    return { width: document.documentElement.scrollWidth, culprits };
  });
}

/** Visits each page at both widths: shot, horizontal scroll measured. */
async function tour(page: Page, pages: ReadonlyArray<readonly [string, string]>) {
  const wide: string[] = [];
  for (const [name, path] of pages) {
    await page.setViewportSize({ width: 1440, height: 900 });
    await settle(page, path);
    await shoot(page, `tour-${name}-1440`);
    await page.setViewportSize({ width: 390, height: 844 });
    await page.waitForTimeout(400);
    const { width, culprits } = await overflow(page);
    if (width > 390) wide.push(`${name}: ${width} px (${culprits.join('; ')})`);
    await shoot(page, `tour-${name}-390`);
  }
  return wide;
}

/** GET through the page's session. */
async function get<T>(page: Page, path: string): Promise<T> {
  return page.evaluate(async (p) => (await fetch(p)).json(), path) as Promise<T>;
}

describe('a tour of every page', () => {
  it('signed out: sign-in, register, password reset — shot, no sideways scroll, no console error', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    const errors = recordConsoleErrors(page);
    const wide = await tour(page, [
      ['sign-in', '/sign-in'],
      ['register', '/register'],
      ['forgot-password', '/forgot-password'],
      ['reset-password', '/reset-password/not-a-real-token'],
    ]);
    expect({ wide, errors }).toEqual({ wide: [], errors: [] });
    await context.close();
  }, 300_000);

  it('signed in: every page of both demo workspaces — shot, no sideways scroll, no console error', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    const errors = recordConsoleErrors(page);
    await signIn(page, baseUrl, 'owner@gapwise.test');
    const workspaces = await get<Array<{ id: string; name: string }>>(page, '/api/workspaces');
    const lab = workspaces.find((w) => w.name.startsWith('Halden'))!;
    const flow = workspaces.find((w) => w.name.startsWith('Tidewater'))!;
    expect(lab && flow).toBeTruthy();
    const pairs = await get<{ items: Array<{ id: string }> } | Array<{ id: string }>>(
      page,
      `/api/workspaces/${lab.id}/pairs`,
    );
    const pairList = Array.isArray(pairs) ? pairs : pairs.items;
    const reports = await get<Array<{ id: string }> | { items: Array<{ id: string }> }>(
      page,
      `/api/workspaces/${lab.id}/reports`,
    );
    const reportList = Array.isArray(reports) ? reports : reports.items;
    const screens = await get<Array<{ id: string }>>(page, `/api/workspaces/${flow.id}/screens`);
    const series = await get<Array<{ id: string }>>(page, `/api/workspaces/${lab.id}/series`);
    const analyses = await get<Array<{ id: string }>>(
      page,
      `/api/workspaces/${lab.id}/trace-analyses`,
    );
    expect(pairList.length && reportList.length && screens.length).toBeTruthy();
    expect(series.length && analyses.length).toBeTruthy();
    const w = `/w/${lab.id}`;
    const pages: Array<readonly [string, string]> = [
      ['pairs', `${w}/pairs`],
      ['pair', `${w}/pairs/${pairList[0]!.id}`],
      ['pair-history', `${w}/pairs/${pairList[0]!.id}/history`],
      ['pair-new', `${w}/pairs/new`],
      ['reports', `${w}/reports`],
      ['report', `${w}/reports/${reportList[0]!.id}`],
      ['reviews', '/reviews'],
      ['traces', `${w}/traces`],
      ['trace-analysis', `${w}/trace-analyses/${analyses[0]!.id}`],
      ['series-list', `${w}/series`],
      ['series', `${w}/series/${series[0]!.id}`],
      ['screens', `/w/${flow.id}/screens`],
      ['screen', `/w/${flow.id}/screens/${screens[0]!.id}`],
      ['screen-new', `/w/${flow.id}/screens/new`],
      ['account', '/account'],
      ['audit', `${w}/audit`],
      ['members', `${w}/members`],
    ];
    const wide = await tour(page, pages);
    expect({ wide, errors }).toEqual({ wide: [], errors: [] });

    // A dialog opened from a menu gives focus back to the control that opened the menu.
    await page.setViewportSize({ width: 1440, height: 900 });
    await page.locator('.app-bar .workspace-switch').click();
    await page.getByRole('menuitem', { name: /New workspace/ }).click();
    await expect.poll(() => page.getByRole('dialog').count()).toBe(1);
    await page.keyboard.press('Escape');
    await expect.poll(() => page.getByRole('dialog').count()).toBe(0);
    await expect
      .poll(() =>
        page.evaluate(() => document.activeElement?.classList.contains('workspace-switch')),
      )
      .toBe(true);
    await context.close();
  }, 900_000);
});
