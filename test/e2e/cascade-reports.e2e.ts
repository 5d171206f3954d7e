/**
 * Cascade reports in the browser: an editor creates a report for the seeded demo triad from the
 * cascade page, submits it; a reviewer approves it; the view shows the frozen yields and keeps
 * its width on a phone.
 */
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { formatNumber, type ReportView } from '@gapwise/contracts';
import { launchChromium, shoot, signIn, waitForMail, type Gapwise } from './support/browser';

const baseUrl = inject('baseUrl');
const mailUrl = inject('mailUrl');
const EDITOR = 'editor@gapwise.test';
const REVIEWER = 'reviewer@gapwise.test';
const TRIAD = 'Sensitiser–bridge–acceptor triad (demo)';

let gw: Gapwise;
const contexts: BrowserContext[] = [];

beforeAll(async () => {
  gw = await launchChromium();
});
afterAll(async () => {
  for (const c of contexts) await c.close().catch(() => undefined);
  await gw?.close();
});

async function signedIn(email: string): Promise<Page> {
  const context = await gw.context();
  contexts.push(context);
  const page = await context.newPage();
  await page.setViewportSize({ width: 1440, height: 900 });
  await signIn(page, baseUrl, email);
  return page;
}

const eventually = <T>(read: () => Promise<T> | T) => expect.poll(read, { timeout: 30_000 });
const status = (page: Page) => page.locator('header gw-report-status');

describe('cascade reports in chromium', () => {
  it('editor reports on the demo triad from the cascade page, reviewer approves, the view shows the yields', async () => {
    const editor = await signedIn(EDITOR);
    await editor.getByRole('link', { name: 'Cascades', exact: true }).click();
    await editor.getByRole('link', { name: TRIAD }).click();
    await editor.waitForURL(/\/cascades\/[0-9a-f-]{36}$/);
    const cascadeId = editor.url().split('/').pop()!;
    await editor.getByRole('link', { name: 'Create report' }).click();
    await editor.waitForURL(/\/reports\/new\?cascadeId=/);
    // The cascade comes preselected in the subject picker.
    await eventually(() => editor.locator('mat-select[name="subject"]').textContent()).toContain(
      TRIAD,
    );
    await editor.getByRole('button', { name: 'Create report' }).click();
    await editor.waitForURL(/\/reports\/[0-9a-f-]{36}$/);
    const reportUrl = editor.url();
    const reportId = reportUrl.split('/').pop()!;
    await eventually(() => status(editor).textContent()).toBe('Draft');

    const report = (await (
      await editor.request.get(`${baseUrl}/api/reports/${reportId}`)
    ).json()) as ReportView;
    expect(report.kind).toBe('cascade');
    expect(report.snapshot.cascade?.cascadeId).toBe(cascadeId);
    const yields = report.snapshot.cascade!.yields;
    expect(yields.length).toBeGreaterThan(0);

    await editor.getByRole('button', { name: 'Submit for review' }).click();
    await eventually(() => status(editor).textContent()).toBe('Submitted');
    await waitForMail(mailUrl, REVIEWER, /^Review requested: /);

    const reviewer = await signedIn(REVIEWER);
    await reviewer.goto(reportUrl);
    await eventually(() => status(reviewer).textContent()).toBe('Submitted');
    await reviewer.getByRole('button', { name: 'Approve' }).click();
    await eventually(() => status(reviewer).textContent()).toBe('Approved');
    await eventually(() => reviewer.locator('p.frozen').textContent()).toContain(
      'Approved and frozen',
    );

    // The yields of the frozen snapshot, at 3 significant figures, in the key-results table.
    const results = reviewer.getByTestId('cascade-results');
    const text = (await results.innerText()).replace(/\s+/g, ' ');
    for (const y of yields) {
      expect(text).toContain(y.label);
      expect(text).toContain(formatNumber(y.value, 3, true));
    }
    expect(await reviewer.locator('table[aria-label="States"] tbody tr').count()).toBe(
      report.snapshot.cascade!.states.length,
    );
    expect(await reviewer.getByTestId('dominant-pathway').innerText()).toContain('→');

    await shoot(reviewer, 'cascade-report-view-1440');
    await reviewer.setViewportSize({ width: 390, height: 844 });
    await eventually(() => reviewer.evaluate(() => document.documentElement.scrollWidth)).toBe(390);
    await shoot(reviewer, 'cascade-report-view-390');
    expect(gw.offLoopback).toEqual([]);
  });
});
