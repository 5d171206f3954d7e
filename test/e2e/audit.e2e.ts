/**
 * The workspace's audit trail in chromium against the real server and database: an owner sees
 * who changed what, filters by person, pair and day, and exports the filtered trail as CSV
 * written by the product's one CSV rule (a formula-looking name is neutralised); an editor is
 * told the trail is for owners and reviewers. Screenshots at 1440 and 390 px.
 */
import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { pairBody } from '../api/support/fixtures';
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

const stamp = Date.now();
const ownerPair = `=AUDIT-${stamp}`;
const editorPair = `AUDIT-ED-${stamp}`;

async function workspaceOf(page: Page): Promise<string> {
  await page.waitForURL(/\/w\/[0-9a-f-]{36}\/pairs$/);
  return /\/w\/([0-9a-f-]{36})\//.exec(page.url())![1]!;
}

async function pick(page: Page, field: string, option: string) {
  await page.locator(`mat-form-field:has(mat-label:text-is("${field}"))`).click();
  await page.getByRole('option', { name: option, exact: true }).click();
}

const rows = (page: Page) => page.locator('table.audit tbody tr');

describe('the audit trail page', () => {
  it('filters by person, pair and day and exports the filtered trail as CSV', async () => {
    const editorContext = await gw.context();
    const editor = await editorContext.newPage();
    await signIn(editor, baseUrl, 'editor@gapwise.test');
    const wid = await workspaceOf(editor);
    const created = await apiWrite(editor, baseUrl, 'post', `/api/workspaces/${wid}/pairs`, {
      ...pairBody({ name: editorPair }),
    });
    expect(created.status()).toBe(201);
    await editorContext.close();

    const context = await gw.context();
    const page = await context.newPage();
    await signIn(page, baseUrl, 'owner@gapwise.test');
    expect(await workspaceOf(page)).toBe(wid);
    const mine = await apiWrite(page, baseUrl, 'post', `/api/workspaces/${wid}/pairs`, {
      ...pairBody({ name: ownerPair }),
    });
    expect(mine.status()).toBe(201);

    // Reached from the Members page, which shows the same two workspace tabs.
    await page.getByRole('link', { name: 'Members' }).click();
    await page.getByRole('link', { name: 'Audit trail' }).click();
    await page.waitForURL(/\/audit$/);
    await expect.poll(() => rows(page).count(), { timeout: 15_000 }).toBeGreaterThan(1);
    // Newest first: the owner's pair was created last.
    expect(await rows(page).first().innerText()).toContain(`${ownerPair} v1`);
    expect(await rows(page).first().innerText()).toContain('Orla Brandt');
    await shoot(page, 'audit-1440');

    // Person: only the editor's events.
    await pick(page, 'Person', 'Emil Sandoval');
    await expect
      .poll(async () => (await rows(page).allInnerTexts()).some((t) => t.includes(ownerPair)))
      .toBe(false);
    const editorRows = await rows(page).allInnerTexts();
    expect(editorRows.length).toBeGreaterThan(0);
    for (const text of editorRows) expect(text).toContain('Emil Sandoval');
    expect(editorRows.some((t) => t.includes(`${editorPair} v1`))).toBe(true);

    // Pair (with everyone): only that pair's events, linked to the pair.
    await pick(page, 'Person', 'Everyone');
    await pick(page, 'Pair', ownerPair);
    await expect.poll(() => rows(page).count()).toBe(1);
    expect(await rows(page).first().innerText()).toContain('created a pair');
    expect(await rows(page).first().locator('a').getAttribute('href')).toMatch(
      new RegExp(`/w/${wid}/pairs/[0-9a-f-]{36}$`),
    );

    // The CSV export carries the same filter; the name that looks like a formula is quoted.
    const download = page.waitForEvent('download');
    await page.getByRole('link', { name: 'Export CSV' }).click();
    const csv = readFileSync(await (await download).path(), 'utf8').split('\r\n');
    expect(csv[0]).toBe('time (UTC),person,action,record type,record id,summary');
    expect(csv.filter((l) => l !== '')).toHaveLength(2);
    expect(csv[1]).toContain(',Orla Brandt,pair.created,pair,');
    expect(csv[1]).toMatch(new RegExp(`,'${ownerPair} v1: `));

    // Days (UTC): a range starting tomorrow has nothing; one ending before it starts is said.
    const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
    const today = new Date().toISOString().slice(0, 10);
    await page.getByRole('button', { name: 'Clear filters' }).click();
    await page.locator('input[name="from"]').fill(tomorrow);
    await page.locator('input[name="from"]').dispatchEvent('change');
    await expect
      .poll(() => page.locator('.count').innerText())
      .toBe('No events match these filters.');
    await page.locator('input[name="to"]').fill(today);
    await page.locator('input[name="to"]').dispatchEvent('change');
    await expect
      .poll(() => page.getByRole('alert').first().innerText())
      .toBe('To (last day) must not be before From (first day).');
    await page.locator('input[name="from"]').fill(today);
    await page.locator('input[name="from"]').dispatchEvent('change');
    await expect.poll(() => rows(page).count()).toBeGreaterThan(1);

    await page.setViewportSize({ width: 390, height: 844 });
    await page.waitForTimeout(300);
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
      390,
    );
    await shoot(page, 'audit-390');
    await context.close();
  });

  it('tells an editor the trail is for owners and reviewers (and the API refuses)', async () => {
    const context = await gw.context();
    const page = await context.newPage();
    await signIn(page, baseUrl, 'editor@gapwise.test');
    const wid = await workspaceOf(page);
    await page.goto(`${baseUrl}/w/${wid}/audit`);
    await expect
      .poll(() => page.getByRole('status').first().innerText())
      .toMatch(/open to the workspace's owners and reviewers; your role is editor/);
    expect(await page.locator('table.audit').count()).toBe(0);
    const refused = await page.request.get(`${baseUrl}/api/workspaces/${wid}/audit/export.csv`);
    expect(refused.status()).toBe(403);
    await context.close();
  });
});
