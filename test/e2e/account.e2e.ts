/**
 * The account page in chromium against the real server, database and mail capture: a new display
 * name shows in the app bar, a password change signs the other browser out, "sign out everywhere"
 * ends every session, an API token is shown once and stops working when revoked, deleting the
 * account says which workspaces went with it, and a forgotten password is reset through the
 * e-mailed link. Screenshots at 1440 and 390 px.
 */
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import {
  apiWrite,
  launchChromium,
  shoot,
  signIn,
  waitForMail,
  type Gapwise,
} from './support/browser';

const baseUrl = inject('baseUrl');
const mailUrl = inject('mailUrl');
let gw: Gapwise;
const contexts: BrowserContext[] = [];

const email = `account-${Date.now()}@example.test`;
let password = 'first long passphrase';

/** Registers and confirms an account through the API and the e-mailed link, as a person does. */
async function registerAccount(address: string, secret: string, displayName: string) {
  const reg = await fetch(`${baseUrl}/api/auth/register`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: address, password: secret, displayName }),
  });
  expect(reg.status).toBe(202);
  const mail = await waitForMail(mailUrl, address, /Confirm your Gapwise account/);
  const token = /\/confirm\/([\w-]+)/.exec(mail.text)![1]!;
  const confirmed = await fetch(`${baseUrl}/api/auth/confirm`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ token }),
  });
  expect(confirmed.status).toBe(200);
}

beforeAll(async () => {
  gw = await launchChromium();
  // A fresh account (the demo accounts are shared with other specs).
  await registerAccount(email, password, 'Account Tester');
});
afterAll(async () => {
  expect(gw.offLoopback, 'requests that left 127.0.0.1').toEqual([]);
  for (const c of contexts) await c.close();
  await gw?.close();
});

async function signedInPage(as = email, secret = password): Promise<Page> {
  const context = await gw.context();
  contexts.push(context);
  const page = await context.newPage();
  await signIn(page, baseUrl, as, secret);
  return page;
}

/** Status lines of the page, joined. */
const statusText = async (page: Page) => (await page.getByRole('status').allInnerTexts()).join(' ');

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
  it('changes the display name, which the app bar shows at once and after a reload', async () => {
    // An account of its own: the password test below counts the other sessions of `email`.
    const address = `name-${Date.now()}@example.test`;
    await registerAccount(address, 'name change passphrase', 'Account Tester');
    const page = await signedInPage(address, 'name change passphrase');
    // Without a workspace the app opens on the page that offers to create one.
    await expect
      .poll(() => page.getByRole('heading', { level: 1 }).first().innerText())
      .toMatch(/workspace/i);
    await shootBoth(page, 'account-no-workspace');
    await page.goto(`${baseUrl}/account`);
    const name = page.getByLabel('Name shown to your team');
    await expect.poll(() => name.inputValue()).toBe('Account Tester');
    await name.fill('Dr. Ada Reyes');
    await page.getByRole('button', { name: 'Save name' }).click();
    await expect.poll(() => statusText(page)).toContain('Name saved.');
    const bar = page.locator('.user-name');
    await expect.poll(() => bar.innerText()).toBe('Dr. Ada Reyes');
    await page.reload();
    await expect.poll(() => bar.innerText()).toBe('Dr. Ada Reyes');
    // A blank name is refused with the field's label.
    await name.fill('   ');
    await page.getByRole('button', { name: 'Save name' }).click();
    await expect
      .poll(async () => (await page.locator('mat-error').allInnerTexts()).join(' '))
      .toMatch(/^Name /);
    await expect.poll(() => bar.innerText()).toBe('Dr. Ada Reyes');
  });

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

    // Shown once: after a reload only its name and prefix are listed, never the secret.
    await page.reload();
    await expect.poll(() => page.locator('.token-list li').count()).toBe(1);
    expect(await page.getByTestId('new-token').count()).toBe(0);
    const listed = await page.locator('.token-list').innerText();
    expect(listed).toContain('nightly import');
    expect(listed).not.toContain(token);
    expect(listed).toContain(token.slice(0, 8));

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

  it('signs out everywhere: this browser and the other one are back at sign-in', async () => {
    const address = `everywhere-${Date.now()}@example.test`;
    await registerAccount(address, 'everywhere passphrase', 'Everywhere Tester');
    const here = await signedInPage(address, 'everywhere passphrase');
    const elsewhere = await signedInPage(address, 'everywhere passphrase');
    await here.goto(`${baseUrl}/account`);
    await here.getByRole('button', { name: 'Sign out everywhere' }).click();
    await here.waitForURL(/\/sign-in/, { timeout: 20_000 });
    // The other browser's next request is refused; its refresh cookie is dead too.
    await elsewhere.goto(`${baseUrl}/account`);
    await elsewhere.waitForURL(/\/sign-in\?/, { timeout: 20_000 });
    await here.goto(`${baseUrl}/account`);
    await here.waitForURL(/\/sign-in\?/, { timeout: 20_000 });
  });

  it('deletes the account and says which of its workspaces went with it', async () => {
    const address = `delete-${Date.now()}@example.test`;
    await registerAccount(address, 'delete me passphrase', 'Delete Tester');
    const page = await signedInPage(address, 'delete me passphrase');
    const made = await apiWrite(page, baseUrl, 'post', '/api/workspaces', {
      name: 'Solo notebook',
    });
    expect(made.status()).toBe(201);
    await page.goto(`${baseUrl}/account`);
    const rules = await page.locator('section.danger .rules').innerText();
    expect(rules).toContain('Workspaces where you are the only member are deleted');
    // A wrong password is refused on its field; nothing is deleted.
    await page.getByLabel('Your password, to confirm').fill('not my password');
    await page.getByRole('button', { name: 'Delete my account' }).click();
    await expect
      .poll(async () => (await page.locator('mat-error').allInnerTexts()).join(' '))
      .toMatch(/^Password /);
    await page.getByLabel('Your password, to confirm').fill('delete me passphrase');
    await page.getByRole('button', { name: 'Delete my account' }).click();
    await page.waitForURL(/\/sign-in$/, { timeout: 20_000 });
    await expect
      .poll(() => page.getByTestId('sign-in-notice').innerText())
      .toBe(
        'Your account was deleted, and with it the workspace where you were the only member: “Solo notebook”.',
      );
    await shootBoth(page, 'account-deleted');
    // The account is gone: signing in is refused.
    const again = await fetch(`${baseUrl}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ email: address, password: 'delete me passphrase' }),
    });
    expect(again.status).toBe(401);
  });
});
