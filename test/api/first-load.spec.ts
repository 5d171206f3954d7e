/**
 * First load: the web app's files and API answers go over the wire compressed, hashed bundles
 * are cached for a year, index.html and unhashed files are revalidated on every use.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { get, type IncomingHttpHeaders, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { brotliDecompressSync, gunzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from './support/test-app';

let t: TestApp;
let server: Server;
let base: string;
const webDist = mkdtempSync(join(tmpdir(), 'gapwise-web-'));
// Repetitive but not trivially so: compresses well, as real bundles do.
const bundle = Array.from({ length: 2000 }, (_, i) => `export const v${i} = ${i * 7};`).join('\n');
const index = `<!doctype html><html><head><script src="main-ABCD1234.js" type="module"></script></head><body>${'<p>Gapwise</p>'.repeat(200)}</body></html>`;

beforeAll(async () => {
  writeFileSync(join(webDist, 'main-ABCD1234.js'), bundle);
  writeFileSync(join(webDist, 'index.html'), index);
  writeFileSync(
    join(webDist, 'favicon.svg'),
    `<svg xmlns="http://www.w3.org/2000/svg">${' '.repeat(2000)}</svg>`,
  );
  t = await startTestApp({}, { WEB_DIST: webDist });
  server = t.app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(async () => {
  await new Promise((r) => server?.close(r));
  await t?.close();
});

/** A raw GET (no automatic decompression), so the test sees what goes over the wire. */
function fetchRaw(
  path: string,
  acceptEncoding: string,
): Promise<{ status: number; headers: IncomingHttpHeaders; body: Buffer }> {
  return new Promise((resolve, reject) => {
    get(`${base}${path}`, { headers: { 'Accept-Encoding': acceptEncoding } }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () =>
        resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }),
      );
      res.on('error', reject);
    }).on('error', reject);
  });
}

describe('first load', () => {
  it('sends hashed bundles brotli-compressed, cached for a year as immutable', async () => {
    const res = await fetchRaw('/main-ABCD1234.js', 'gzip, deflate, br');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['vary']).toMatch(/Accept-Encoding/i);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(res.body.length).toBeLessThan(bundle.length / 3);
    expect(brotliDecompressSync(res.body).toString()).toBe(bundle);
  });

  it('falls back to gzip, and to identity when the browser accepts neither', async () => {
    const gz = await fetchRaw('/main-ABCD1234.js', 'gzip');
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(gunzipSync(gz.body).toString()).toBe(bundle);
    const plain = await fetchRaw('/main-ABCD1234.js', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.body.toString()).toBe(bundle);
  });

  it('revalidates index.html (at / and at client-side routes) and unhashed files', async () => {
    for (const path of ['/', '/w/1/pairs']) {
      const res = await fetchRaw(path, 'br');
      expect(res.status).toBe(200);
      expect(res.headers['cache-control']).toBe('no-cache');
      expect(res.headers['content-encoding']).toBe('br');
      expect(brotliDecompressSync(res.body).toString()).toBe(index);
    }
    const icon = await fetchRaw('/favicon.svg', 'gzip');
    expect(icon.headers['cache-control']).toBe('no-cache');
  });

  it('compresses JSON answers of the API, which stay uncacheable', async () => {
    const res = await fetchRaw('/api/docs/openapi.json', 'gzip, br');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/json/);
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['cache-control']).toBe('no-store');
    expect(brotliDecompressSync(res.body).length).toBeGreaterThan(res.body.length);
  });
});
