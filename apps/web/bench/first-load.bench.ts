/**
 * First load in Debian's chromium (playwright-core, headless), each run in a fresh browser
 * context (empty cache and storage, as a fresh profile): the production web build served by
 * the real server (`test/e2e/global-setup.ts`: demo data, compression on). Per run:
 *   - bytes over the wire (encoded, compressed where the server compressed) from opening the
 *     sign-in page, signing in as the demo editor, to the pairs table shown;
 *   - time from navigating to the pairs page (signed in, cold cache) to the table visible;
 *   - time from navigating to a pair's page (signed in, cold cache) to its plots drawn.
 * Prints every run and the median of N (default 5), with the targets: transfer < 500 kB,
 * pairs table < 1.0 s, pair page with plots < 1.0 s.
 *
 *   GAPWISE_TEST_DATABASE_URL=… npx tsx apps/web/bench/first-load.bench.ts [runs]
 */
import { loadavg } from 'node:os';
import type { BrowserContext, Page } from 'playwright-core';
import type { TestProject } from 'vitest/node';
import setup from '../../../test/e2e/global-setup';
import { launchChromium, signIn } from '../../../test/e2e/support/browser';

const runs = Number(process.argv[2] ?? 5);
const provided = new Map<string, string>();
const teardown = await setup({
  provide: (key: string, value: string) => provided.set(key, value),
} as unknown as TestProject);
const baseUrl = provided.get('baseUrl')!;
const gw = await launchChromium();

/** Sums the encoded (on-the-wire) size of every response the page loads. */
async function countTransfer(context: BrowserContext, page: Page): Promise<() => number> {
  const cdp = await context.newCDPSession(page);
  await cdp.send('Network.enable');
  let bytes = 0;
  cdp.on('Network.loadingFinished', (e: { encodedDataLength: number }) => {
    bytes += e.encodedDataLength;
  });
  return () => bytes;
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
};

const transfers: number[] = [];
const tableMs: number[] = [];
const pairMs: number[] = [];
try {
  for (let run = 1; run <= runs; run++) {
    // Sign-in page, sign in, pairs table: everything over the wire.
    const signInContext = await gw.context();
    const page = await signInContext.newPage();
    const transferred = await countTransfer(signInContext, page);
    await signIn(page, baseUrl, 'editor@gapwise.test');
    await page.waitForURL(/\/pairs$/);
    await page.locator('a.pair-link').first().waitFor({ state: 'visible', timeout: 30_000 });
    await page.waitForLoadState('networkidle');
    transfers.push(transferred());
    const pairsUrl = page.url();
    const pairUrl = new URL(
      (await page.locator('a.pair-link').first().getAttribute('href'))!,
      baseUrl,
    ).href;
    const cookies = await signInContext.cookies();
    await signInContext.close();

    // Pairs page, signed in, cold cache.
    const tableContext = await gw.context();
    await tableContext.addCookies(cookies);
    const tablePage = await tableContext.newPage();
    let started = performance.now();
    await tablePage.goto(pairsUrl, { waitUntil: 'commit' });
    await tablePage.locator('a.pair-link').first().waitFor({ state: 'visible', timeout: 30_000 });
    tableMs.push(performance.now() - started);
    await tableContext.close();

    // A pair's page with its plots, signed in, cold cache.
    const pairContext = await gw.context();
    await pairContext.addCookies(cookies);
    const pairPage = await pairContext.newPage();
    started = performance.now();
    await pairPage.goto(pairUrl, { waitUntil: 'commit' });
    await pairPage
      .locator('gw-parabola-plot path.curve.reactant')
      .first()
      .waitFor({ state: 'visible', timeout: 30_000 });
    pairMs.push(performance.now() - started);
    await pairContext.close();
    console.log(
      `run ${run}: transfer ${(transfers.at(-1)! / 1024).toFixed(0)} kB, pairs table ` +
        `${tableMs.at(-1)!.toFixed(0)} ms, pair page with plots ${pairMs.at(-1)!.toFixed(0)} ms`,
    );
  }
  const verdict = (ok: boolean) => (ok ? 'met' : 'NOT met');
  console.log(
    `first load, chromium headless, fresh context per run, median of ${runs} ` +
      `(load average at the end ${loadavg()[0]!.toFixed(2)} on a shared machine):`,
  );
  const kb = median(transfers) / 1024;
  console.log(
    `  sign-in + pairs page transfer ${kb.toFixed(0)} kB (target < 500 kB: ${verdict(kb < 500)})`,
  );
  const t = median(tableMs);
  console.log(
    `  pairs table visible ${(t / 1000).toFixed(2)} s (target < 1.0 s: ${verdict(t < 1000)})`,
  );
  const p = median(pairMs);
  console.log(
    `  pair page with plots ${(p / 1000).toFixed(2)} s (target < 1.0 s: ${verdict(p < 1000)})`,
  );
  if (gw.offLoopback.length) throw new Error(`requests off loopback: ${gw.offLoopback.join(', ')}`);
} finally {
  await gw.close();
  await teardown();
}
