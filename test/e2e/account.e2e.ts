/**
 * The account page in chromium against the real server, database and mail capture: a password
 * change signs the other browser out, an API token is shown once and stops working when revoked,
 * and a forgotten password is reset through the e-mailed link. Screenshots at 1440 and 390 px.
 */
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchChromium, shoot, signIn, waitForMail, type Gapwise } from './support/browser';

const baseUrl = inject('baseUrl');
const mailUrl = inject('mailUrl');
let gw: Gapwise;
const contexts: BrowserContext[] = [];

const email = `account-${Date.now()}@example.test`;
let password = 'first long passphrase';

beforeAll(async () => {
  gw = await launchChromium();
  // A fresh account (the demo accounts are shared with other specs), registered as a person does.
  const reg = await fetch(`${baseUrl}/api/auth/register`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password, displayName: 'Account Tester' }),
  });
  expect(reg.status).toBe(202);
  const mail = await waitForMail(mailUrl, email, /Confirm your Gapwise account/);
  const token = /\/confirm\/([\w-]+)/.exec(mail.text)![1]!;
  const confirmed = await fetch(`${baseUrl}/api/auth/confirm`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ token }),
  });
  expect(confirmed.status).toBe(200);
});
afterAll(async () => {
  expect(gw.offLoopback, 'requests that left 127.0.0.1').toEqual([]);
  for (const c of contexts) await c.close();
  await gw?.close();
});

async function signedInPage(): Promise<Page> {
  const context = await gw.context();
  contexts.push(context);
  const page = await context.newPage();
  await signIn(page, baseUrl, email, password);
  return page;
}

/** A GET with a bearer token, from outside any browser. */
const withToken = async (token: string) =>
  (await fetch(`${baseUrl}/api/workspaces`, { headers: { Authorization: `Bearer ${token}` } }))
    .status;

async function shootBoth(page: Page, name: string) {
  await page.setViewportSize({ width: 1440, height: 900 });
  await shoot(page, `${name}-1440`);
  await page.setViewportSize({ width: 390, height: 844 });
  await shoot(page, `${name}-390`);
  await page.setViewportSize({ width: 1440, height: 900 });
}

describe('the account page in chromium', () => {
  it('is reached from the account menu; changing the password signs the other browser out', async () => {
    const here = await signedInPage();
    const elsewhere = await signedInPage();
    await here.getByRole('button', { name: /Account:/ }).click();
    await here.getByRole('menuitem', { name: 'Account, password and API tokens' }).click();
    await here.waitForURL(/\/account$/);
    await expect
      .poll(() => here.getByRole('heading', { name: 'Your account', exact: true }).count())
      .toBe(1);
    await shootBoth(here, 'account');

    await here.getByLabel('Current password').fill(password);
    await here.getByLabel('New password').fill('second long passphrase');
    await here.getByRole('button', { name: 'Change password' }).click();
    // The browser above and the confirmation of the registration (beforeAll) are the others.
    await expect
      .poll(async () => (await here.getByRole('status').allInnerTexts()).join(' '))
      .toContain('Password changed. 2 other sessions were signed out.');
    password = 'second long passphrase';

    // The other browser's session is refused on its next request: back to sign-in.
    await elsewhere.goto(`${baseUrl}/account`);
    await elsewhere.waitForURL(/\/sign-in\?/, { timeout: 20_000 });
    // This one stays signed in.
    await here.reload();
    await expect
      .poll(() => here.getByRole('heading', { name: 'Your account', exact: true }).count())
      .toBe(1);
  });

  it('creates a read-only token shown once, which reads until it is revoked', async () => {
    const page = await signedInPage();
    await page.goto(`${baseUrl}/account`);
    await page.getByLabel('Token name').fill('nightly import');
    await page.getByRole('button', { name: 'Create token' }).click();
    const secret = page.getByTestId('new-token');
    await expect.poll(() => secret.count()).toBe(1);
    const token = (await secret.innerText()).trim();
    expect(token).toMatch(/^gw_[\w-]{20,}$/);
    expect(await withToken(token)).toBe(200);
    const write = await fetch(`${baseUrl}/api/workspaces`, {
      method: 'POST',
      headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json' },
      body: JSON.stringify({ name: 'From a read-only token' }),
    });
    expect(write.status).toBe(403);
    await shootBoth(page, 'account-token-created');

    await page.getByRole('button', { name: 'Revoke token nightly import' }).click();
    await expect.poll(() => page.getByTestId('new-token').count()).toBe(0);
    await expect.poll(() => page.locator('.token-list li.ended').count()).toBe(1);
    expect(await withToken(token)).toBe(401);
  });

  it('resets a forgotten password through the e-mailed link; older sessions end', async () => {
    const older = await signedInPage();
    const context = await gw.context();
    contexts.push(context);
    const page = await context.newPage();
    await page.goto(`${baseUrl}/sign-in`);
    await page.getByRole('link', { name: 'Forgot password?' }).click();
    await page.waitForURL(/\/forgot-password$/);
    await shootBoth(page, 'forgot-password');
    await page.getByLabel('E-mail').fill(email);
    await page.getByRole('button', { name: 'Send the link' }).click();
    await expect
      .poll(() => page.getByRole('heading', { name: 'Check your e-mail' }).count())
      .toBe(1);

    const mail = await waitForMail(mailUrl, email, /Choose a new Gapwise password/);
    const link = /(http:\/\/\S+\/reset-password\/[\w-]+)/.exec(mail.text)![1]!;
    expect(link.startsWith(baseUrl)).toBe(true);
    await page.goto(link);
    await expect
      .poll(() => page.getByRole('heading', { name: 'Choose a new password' }).count())
      .toBe(1);
    await shootBoth(page, 'reset-password');
    await page.getByLabel('New password').fill('third long passphrase');
    await page.getByRole('button', { name: 'Save and sign in' }).click();
    await page.waitForURL((url) => !url.pathname.startsWith('/reset-password'), {
      timeout: 20_000,
    });
    password = 'third long passphrase';

    // The link works once.
    await page.goto(link);
    await page.getByLabel('New password').fill('fourth long passphrase');
    await page.getByRole('button', { name: 'Save and sign in' }).click();
    await expect
      .poll(() => page.getByRole('alert').allInnerTexts())
      .toEqual([expect.stringContaining('invalid, expired or already used')]);

    await older.goto(`${baseUrl}/account`);
    await older.waitForURL(/\/sign-in\?/, { timeout: 20_000 });
    const fresh = await signedInPage();
    await fresh.goto(`${baseUrl}/account`);
    await expect
      .poll(() => fresh.getByRole('heading', { name: 'Your account', exact: true }).count())
      .toBe(1);
  });
});
