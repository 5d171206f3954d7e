/**
 * Screenshots of every page at 1440 and 390 px against a running Gapwise with the demo seed,
 * for a look before a UI change is called done. Also prints, per page at 390 px, whether the
 * document scrolls sideways and which elements stick out (ignoring those inside a box that
 * scrolls or clips them).
 *
 *   npx tsx scripts/shoot-pages.ts http://127.0.0.1:4280 [out-dir] [page-name-filter]
 *
 * Uses Debian's chromium (CHROME_BIN, default /usr/bin/chromium) through playwright-core.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { chromium, type Page } from 'playwright-core';

const baseUrl = process.argv[2] ?? 'http://127.0.0.1:4280';
const outDir = process.argv[3] ?? 'test-output/page-shots';
const only = process.argv[4] ? new RegExp(process.argv[4]) : null;

async function signIn(page: Page, email: string): Promise<string> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill('gapwise-demo');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/w\/[0-9a-f-]{36}\/pairs$/, { timeout: 30_000 });
  return /\/w\/([0-9a-f-]{36})\//.exec(page.url())![1];
}

async function firstHref(page: Page, path: string, selector: string): Promise<string | null> {
  await page.goto(`${baseUrl}${path}`, { waitUntil: 'networkidle' });
  await page.waitForTimeout(1000);
  const link = page.locator(selector).first();
  return (await link.count()) ? link.getAttribute('href') : null;
}

/** Elements past the right edge that no scrolling or clipping ancestor holds in. */
function sticksOut(page: Page) {
  // A string, not a function: tsx would wrap a function's inner names in a helper the page lacks.
  return page.evaluate<{ scrollWidth: number; out: string[] }>(`(() => {
    const width = window.innerWidth;
    const out = [];
    for (const el of Array.from(document.querySelectorAll('body *'))) {
      const r = el.getBoundingClientRect();
      if (!(r.right > width + 1 && r.width > 0) || out.length >= 12) continue;
      let clipped = false;
      for (let p = el.parentElement; p && p !== document.body; p = p.parentElement) {
        const o = getComputedStyle(p).overflowX;
        if (o === 'auto' || o === 'scroll' || o === 'hidden' || o === 'clip') clipped = true;
      }
      if (!clipped) {
        out.push(el.tagName.toLowerCase() + '.' + el.className.toString().split(' ').slice(0, 3).join('.') + ' → ' + Math.round(r.right));
      }
    }
    return { scrollWidth: document.documentElement.scrollWidth, out };
  })()`);
}

async function main() {
  mkdirSync(outDir, { recursive: true });
  const browser = await chromium.launch({
    executablePath: process.env['CHROME_BIN'] ?? '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu'],
  });
  const context = await browser.newContext({ viewport: { width: 1440, height: 900 } });
  const page = await context.newPage();
  const consoleErrors: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') consoleErrors.push(`${page.url()}: ${m.text()}`);
  });
  const signedOut: Array<[string, string]> = [
    ['sign-in', '/sign-in'],
    ['register', '/register'],
    ['forgot-password', '/forgot-password'],
  ];
  const shots: Array<[string, string]> = [...signedOut];
  const wid = await signIn(page, 'owner@gapwise.test');
  const w = `/w/${wid}`;
  const pair = await firstHref(page, `${w}/pairs`, 'a.pair-link');
  const report = await firstHref(page, `${w}/reports`, 'a[href*="/reports/"]:not([href$="/new"])');
  const screen = await firstHref(
    page,
    `${w}/screens`,
    'a[href^="/w/"][href*="/screens/"]:not([href$="/new"])',
  );
  const series = await firstHref(
    page,
    `${w}/series`,
    'a[href^="/w/"][href*="/series/"]:not([href$="/new"])',
  );
  const analysis = await firstHref(page, `${w}/traces`, 'a[href*="/trace-analyses/"]');
  shots.push(
    ['pairs', `${w}/pairs`],
    ['pair-new', `${w}/pairs/new`],
    ...(pair
      ? ([
          ['pair', pair],
          ['pair-history', `${pair}/history`],
        ] as Array<[string, string]>)
      : []),
    ['screens', `${w}/screens`],
    ['screen-new', `${w}/screens/new`],
    ...(screen ? ([['screen', screen]] as Array<[string, string]>) : []),
    ['series', `${w}/series`],
    ...(series ? ([['series-one', series]] as Array<[string, string]>) : []),
    ['reports', `${w}/reports`],
    ['report-new', `${w}/reports/new`],
    ...(report ? ([['report', report]] as Array<[string, string]>) : []),
    ['traces', `${w}/traces`],
    ...(analysis ? ([['trace-analysis', analysis]] as Array<[string, string]>) : []),
    ['members', `${w}/members`],
    ['audit', `${w}/audit`],
    ['account', '/account'],
    ['reviews', '/reviews'],
  );
  for (const width of [1440, 390]) {
    await page.setViewportSize({ width, height: width === 390 ? 844 : 900 });
    for (const [name, path] of shots) {
      if (only && !only.test(name)) continue;
      const signedOutPage = signedOut.some(([n]) => n === name);
      const target = signedOutPage
        ? await browser.newContext({ viewport: { width, height: 900 } })
        : null;
      const p = target ? await target.newPage() : page;
      if (target) {
        p.on('console', (m) => {
          if (m.type() === 'error') consoleErrors.push(`${p.url()}: ${m.text()}`);
        });
      }
      await p.goto(`${baseUrl}${path}`, { waitUntil: 'networkidle' });
      await p.waitForTimeout(1200);
      await p.screenshot({ path: join(outDir, `${name}-${width}.png`), fullPage: true });
      if (width === 390) {
        const { scrollWidth, out } = await sticksOut(p);
        if (scrollWidth > 390 || out.length)
          console.log(`${name}: ${scrollWidth} px ${out.join('; ')}`);
      }
      await target?.close();
    }
  }
  if (consoleErrors.length) console.log(`console errors:\n${consoleErrors.join('\n')}`);
  await browser.close();
}

void main();
