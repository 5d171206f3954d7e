/**
 * Debian's chromium through playwright-core for the browser tests: headless, profile and cache
 * under test-output/, every request that does not go to 127.0.0.1 aborted and recorded.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

const root = fileURLToPath(new URL('../../..', import.meta.url));
export const screenshotDir = join(root, 'test-output', 'screenshots');

export interface Gapwise {
  readonly browser: Browser;
  /** Hosts other than loopback that a page tried to reach (must stay empty). */
  readonly offLoopback: string[];
  /** A fresh signed-out browser context with the loopback guard. */
  context(): Promise<BrowserContext>;
  close(): Promise<void>;
}

export async function launchChromium(): Promise<Gapwise> {
  const home = join(root, 'test-output', 'e2e-chromium');
  mkdirSync(home, { recursive: true });
  mkdirSync(screenshotDir, { recursive: true });
  const browser = await chromium.launch({
    executablePath: process.env['CHROME_BIN'] ?? '/usr/bin/chromium',
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
    env: {
      ...process.env,
      XDG_CONFIG_HOME: join(home, 'config'),
      XDG_CACHE_HOME: join(home, 'cache'),
    } as Record<string, string>,
  });
  const offLoopback: string[] = [];
  return {
    browser,
    offLoopback,
    async context() {
      const context = await browser.newContext({
        viewport: { width: 1360, height: 900 },
        acceptDownloads: true,
        locale: 'en-GB',
      });
      await context.route('**/*', (route) => {
        const url = new URL(route.request().url());
        if (url.protocol === 'data:' || url.protocol === 'blob:' || url.hostname === '127.0.0.1') {
          return route.continue();
        }
        offLoopback.push(url.href);
        return route.abort();
      });
      return context;
    },
    close: () => browser.close(),
  };
}

/** Signs in through the sign-in page and waits until the app has left it. */
export async function signIn(
  page: Page,
  baseUrl: string,
  email: string,
  password = 'gapwise-demo',
) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'), { timeout: 30_000 });
}

/**
 * A full-page screenshot under the git-ignored test-output/screenshots/, taken from the top of
 * the page: scrolled, the sticky app bar would be drawn across the middle of the image (over the
 * form) although on screen it stays at the top of the viewport.
 */
export async function shoot(page: Page, name: string): Promise<void> {
  await page.evaluate(() => window.scrollTo(0, 0));
  await page.screenshot({ path: join(screenshotDir, `${name}.png`), fullPage: true });
}

/** One captured e-mail as the mail capture lists it. */
export interface Mail {
  readonly id: string;
  readonly envelopeTo: readonly string[];
  readonly subject: string;
  readonly text: string;
}

/** Waits for an e-mail to `to` whose subject matches. */
export async function waitForMail(
  mailUrl: string,
  to: string,
  subject: RegExp,
  timeoutMs = 20_000,
): Promise<Mail> {
  const deadline = Date.now() + timeoutMs;
  let seen: Mail[] = [];
  while (Date.now() < deadline) {
    seen = (await (await fetch(`${mailUrl}/messages`)).json()) as Mail[];
    const found = seen.find((m) => m.envelopeTo.includes(to) && subject.test(m.subject));
    if (found) return found;
    await new Promise((r) => setTimeout(r, 250));
  }
  const list = seen.map((m) => `"${m.subject}" to ${m.envelopeTo.join(', ')}`).join('; ');
  throw new Error(`no e-mail to ${to} matching ${subject} within ${timeoutMs} ms; seen: ${list}`);
}

/** A write to the API with the page's session cookies and its CSRF token (as the app sends). */
export async function apiWrite(
  page: Page,
  baseUrl: string,
  method: 'post' | 'patch' | 'put' | 'delete',
  path: string,
  data?: unknown,
) {
  const me = (await (await page.request.get(`${baseUrl}/api/auth/me`)).json()) as {
    csrfToken: string;
  };
  return page.request[method](`${baseUrl}${path}`, {
    data: data as object,
    headers: { 'X-CSRF-Token': me.csrfToken },
  });
}
