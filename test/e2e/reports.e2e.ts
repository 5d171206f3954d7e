/**
 * Reports and review in the browser: an editor's report through request-changes, revision and
 * approval; and the demo reviewer approving the seeded DA-3 report with the author e-mailed.
 */
import { execFileSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import {
  apiWrite,
  launchChromium,
  screenshotDir,
  shoot,
  signIn,
  waitForMail,
  type Gapwise,
} from './support/browser';

const baseUrl = inject('baseUrl');
const mailUrl = inject('mailUrl');
const EDITOR = 'editor@gapwise.test';
const REVIEWER = 'reviewer@gapwise.test';

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
  await signIn(page, baseUrl, email);
  return page;
}

async function labId(page: Page): Promise<string> {
  const res = await page.request.get(`${baseUrl}/api/workspaces`);
  const list = (await res.json()) as Array<{ id: string; name: string }>;
  const lab = list.find((w) => w.name === 'Halden Photoredox Lab');
  if (!lab) throw new Error(`demo lab not among ${list.map((w) => w.name).join(', ')}`);
  return lab.id;
}

/** expect.poll with time for server work (the approved PDF is rendered and stored on approval). */
const eventually = <T>(read: () => Promise<T> | T) => expect.poll(read, { timeout: 30_000 });

const status = (page: Page) => page.locator('header gw-report-status');

/** Downloads the PDF through the page's button; checks the response and returns its text. */
async function downloadPdf(page: Page, name: string): Promise<string> {
  const href = await page.getByRole('link', { name: 'Download PDF' }).getAttribute('href');
  const res = await page.request.get(`${baseUrl}${href}`);
  expect(res.status()).toBe(200);
  expect(res.headers()['content-type']).toBe('application/pdf');
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    page.getByRole('link', { name: 'Download PDF' }).click(),
  ]);
  const file = join(screenshotDir, `${name}.pdf`);
  await download.saveAs(file);
  const bytes = await res.body();
  expect(bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');
  writeFileSync(file, bytes);
  return execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
}

describe('reports and review in chromium', () => {
  it('editor submits, reviewer asks for changes on the coupling, editor revises, reviewer approves, PDF downloads', async () => {
    const editor = await signedIn(EDITOR);
    const wid = await labId(editor);

    // Create a report from the DA-1 pair page.
    await editor.goto(`${baseUrl}/w/${wid}/pairs`);
    await editor.getByRole('link', { name: 'DA-1', exact: true }).click();
    await editor.getByRole('link', { name: /Create report/ }).click();
    await editor.waitForURL(/\/reports\/[0-9a-f-]{36}$/);
    const reportUrl = editor.url();
    const reportId = reportUrl.split('/').at(-1)!;
    await eventually(() => status(editor).textContent()).toBe('Draft');
    await eventually(() => editor.locator('h1').textContent()).toContain('DA-1');
    await editor.getByRole('button', { name: 'Submit for review' }).click();
    await eventually(() => status(editor).textContent()).toBe('Submitted');
    await waitForMail(mailUrl, REVIEWER, /^Review requested: DA-1/);

    // The reviewer finds it waiting, comments on the coupling and asks for changes.
    const reviewer = await signedIn(REVIEWER);
    await reviewer.goto(`${baseUrl}/reviews`);
    await reviewer.getByRole('link', { name: /^DA-1/ }).click();
    await reviewer.waitForURL(reportUrl);
    await reviewer.getByRole('button', { name: 'Comment on Electronic coupling |HAB|' }).click();
    await reviewer
      .locator('#comment-body')
      .fill('Please give the source of the 45 cm⁻¹ coupling (which DFT functional?).');
    await reviewer.getByRole('button', { name: 'Post comment' }).click();
    const comment = reviewer.locator('li.comment').filter({ hasText: '45 cm⁻¹ coupling' });
    await eventually(() => comment.locator('.anchor').textContent()).toBe(
      'on Electronic coupling |HAB|',
    );
    await eventually(() => reviewer.locator('tr[data-kind="coupling"] .count').textContent()).toBe(
      '1 comment',
    );
    // The author's notice names the parameter by its label, not its code name.
    const notice = await waitForMail(mailUrl, EDITOR, /^New comment: DA-1/);
    expect(notice.text).toContain('on Electronic coupling |H_AB| in the report');
    await reviewer.getByLabel('Note with your decision (optional)').fill('Cite the coupling run.');
    await reviewer.getByRole('button', { name: 'Request changes' }).click();
    await eventually(() => status(reviewer).textContent()).toBe('Changes requested');
    await waitForMail(mailUrl, EDITOR, /^Changes requested: DA-1/);

    // The editor answers in the thread: the reply sits under the question, on the same parameter,
    // and the reviewer is told.
    await editor.reload();
    await editor
      .locator('li.comment')
      .filter({ hasText: '45 cm⁻¹ coupling' })
      .getByRole('button', {
        name: 'Reply',
      })
      .click();
    await eventually(() => editor.locator('p.replying').textContent()).toContain('Replying to');
    await editor
      .locator('#comment-body')
      .fill('B3LYP/def2-TZVP, run gw-calc-032; added to the notes.');
    await editor.getByRole('button', { name: 'Post comment' }).click();
    const reply = editor.locator('li.comment').filter({ hasText: 'B3LYP/def2-TZVP' });
    await eventually(() => reply.getAttribute('style')).toContain('margin-left: 24px');
    expect(await reply.locator('.anchor').textContent()).toBe('on Electronic coupling |HAB|');
    await waitForMail(mailUrl, REVIEWER, /^New comment: DA-1/);

    // The editor changes the pair, takes a new snapshot and resubmits.
    const before = (await (await editor.request.get(`${baseUrl}/api/reports/${reportId}`)).json())
      .snapshotId as string;
    const pairId = (
      (await (await editor.request.get(`${baseUrl}/api/reports/${reportId}`)).json()) as {
        pairIds: string[];
      }
    ).pairIds[0];
    const pair = (await (await editor.request.get(`${baseUrl}/api/pairs/${pairId}`)).json()) as {
      version: number;
    };
    const patched = await apiWrite(editor, baseUrl, 'patch', `/api/pairs/${pairId}`, {
      version: pair.version,
      notes: 'Coupling: fragment-orbital run gw-calc-032, B3LYP.',
    });
    expect(patched.status()).toBe(200);
    await editor.reload();
    await eventually(() => status(editor).textContent()).toBe('Changes requested');
    await editor.getByRole('button', { name: 'Revise from the pair' }).click();
    await eventually(() => editor.locator('p.message').textContent()).toContain('New snapshot');
    const after = (await (await editor.request.get(`${baseUrl}/api/reports/${reportId}`)).json())
      .snapshotId as string;
    expect(after).not.toBe(before);
    await editor.getByRole('button', { name: 'Submit for review' }).click();
    await eventually(() => status(editor).textContent()).toBe('Submitted');

    // The reviewer approves; the page says so and the PDF downloads.
    await reviewer.reload();
    await eventually(() => status(reviewer).textContent()).toBe('Submitted');
    await reviewer.getByRole('button', { name: 'Approve' }).click();
    await eventually(() => status(reviewer).textContent()).toBe('Approved');
    await eventually(() => reviewer.locator('p.frozen').textContent()).toContain(
      'Approved and frozen',
    );
    expect(await reviewer.getByRole('button', { name: 'Post comment' }).count()).toBe(0);
    await waitForMail(mailUrl, EDITOR, /^Approved: DA-1/);
    // Revisions count what the reviewer saw: two submissions, the second of a new snapshot.
    await eventually(() => reviewer.getByTestId('review-status').textContent()).toBe(
      'Approved, revision 2',
    );
    const decisions = await reviewer.locator('td.decision').allTextContents();
    expect(decisions.map((d) => d.trim())).toContain(
      'Changes requested → Submitted (revision 2; snapshot changed since revision 1)',
    );
    const text = await downloadPdf(reviewer, 'e2e-da1-approved');
    expect(text).toContain('DA-1');
    expect(text).toContain(after);
    expect(text.toLowerCase()).toContain('approved');
    expect(text).toContain('Approved, revision 2');
    expect(text).not.toContain('{"');
    await shoot(reviewer, 'report-view-approved');
    await reviewer.setViewportSize({ width: 1440, height: 900 });
    await shoot(reviewer, 'report-view-approved-1440');
    await reviewer.setViewportSize({ width: 390, height: 844 });
    // On a phone the page keeps its width: tables scroll inside their cards, plots shrink.
    await eventually(() => reviewer.evaluate(() => document.documentElement.scrollWidth)).toBe(390);
    await shoot(reviewer, 'report-view-approved-390');
    expect(gw.offLoopback).toEqual([]);
  });

  it('the demo reviewer reads the seeded DA-3 report, comments on the coupling, approves; the author is e-mailed', async () => {
    const reviewer = await signedIn(REVIEWER);
    await reviewer.goto(`${baseUrl}/reviews`);
    await eventually(() =>
      reviewer.getByRole('table', { name: 'Reports waiting for review' }).isVisible(),
    ).toBe(true);
    await shoot(reviewer, 'reviews-waiting');
    await reviewer.getByRole('link', { name: /^DA-3 photoinduced charge separation/ }).click();
    await eventually(() => status(reviewer).textContent()).toBe('Submitted');

    // Inputs with units and provenance.
    const coupling = reviewer.locator('tr[data-kind="coupling"]');
    await eventually(() => coupling.textContent()).toContain('120 cm⁻¹');
    // Provenance as a sentence: the helper by name, its inputs with labels and units, no JSON.
    expect(await coupling.textContent()).toContain(
      'Derived with the generalized Mulliken–Hush helper',
    );
    expect(await reviewer.locator('table[aria-label="Inputs"]').textContent()).not.toContain('{');
    const lambdaInner = reviewer.locator('tr[data-kind="lambdaInner"]');
    expect(await lambdaInner.textContent()).toContain('gw-calc-040');
    // Subscripts as in the PDF, derivation inputs with units, no raw markup in the equations.
    expect(await coupling.locator('th sub').textContent()).toBe('AB');
    expect(await reviewer.locator('tr[data-kind="lambdaOuter"]').textContent()).toContain(
      'centre-to-centre distance R = 10.8 Å',
    );
    const methods = (await reviewer.getByRole('region', { name: 'Methods' }).textContent())!;
    expect(methods).not.toMatch(/_\{|H_AB|λ_s/);
    // The three plots are drawn (SVG with curves), wide enough for their axis labels to read.
    for (const plot of ['gw-parabola-plot', 'gw-driving-force-plot', 'gw-temperature-plot']) {
      await eventually(() => reviewer.locator(`${plot} svg path`).count()).toBeGreaterThan(1);
      const width = await reviewer
        .locator(`${plot} svg`)
        .evaluateAll((svgs) => Math.max(...svgs.map((svg) => svg.getBoundingClientRect().width)));
      expect(width, `${plot} width`).toBeGreaterThanOrEqual(440);
    }
    expect(
      await reviewer.getByRole('complementary', { name: 'Limits of this estimate' }).textContent(),
    ).toMatch(/not measurements/i);
    const keyResult = (await reviewer.getByTestId('key-result').textContent())!.trim();
    await shoot(reviewer, 'report-view-submitted');

    // Comment anchored on the coupling, then approve.
    await reviewer.getByRole('button', { name: 'Comment on Electronic coupling |HAB|' }).click();
    await reviewer
      .locator('#comment-body')
      .fill('The GMH coupling of 120 cm⁻¹ is consistent with the CT band; fine for this estimate.');
    await reviewer.getByRole('button', { name: 'Post comment' }).click();
    await eventually(() => reviewer.locator('li.comment .anchor').first().textContent()).toBe(
      'on Electronic coupling |HAB|',
    );
    await shoot(reviewer, 'report-comments');
    await reviewer.getByRole('button', { name: 'Approve' }).click();
    await eventually(() => status(reviewer).textContent()).toBe('Approved');

    const mail = await waitForMail(mailUrl, EDITOR, /^Approved: DA-3 photoinduced/);
    expect(mail.text).toContain('Rhea Lindqvist approved your report');
    expect(mail.text).toContain(`${baseUrl}/w/`);

    // The downloaded PDF prints the numbers the page shows.
    const pdf = await downloadPdf(reviewer, 'e2e-da3-approved');
    const numbers = keyResult.match(/-?\d+(?:\.\d+)?(?:\s?×\s?10[⁻⁰¹²³⁴⁵⁶⁷⁸⁹]+)?/g) ?? [];
    // k with its power of ten, log10 k and ΔG‡ at least.
    expect(numbers.filter((n) => n.includes('×'))).toHaveLength(1);
    expect(numbers.length).toBeGreaterThanOrEqual(3);
    const flat = pdf.replace(/\s+/g, ' ');
    for (const n of numbers) expect(flat, `PDF should print ${n}`).toContain(n);
    expect(gw.offLoopback).toEqual([]);
  });
});
