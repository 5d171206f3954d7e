import { existsSync } from 'node:fs';
import { basename, join } from 'node:path';
import express, { type Express } from 'express';

const NOT_BUILT = `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Gapwise — web app not built</title></head>
<body style="font-family: sans-serif; max-width: 40rem; margin: 4rem auto; line-height: 1.5">
<h1>The web app has not been built</h1>
<p>The API is running (see <a href="/api/health">/api/health</a> and <a href="/api/docs">/api/docs</a>),
but there is no built web app in <code>dist/web/browser</code>.</p>
<p>Build it with <code>npx ng build</code> (or start everything with <code>npm start</code>) and reload this page.</p>
</body></html>`;

/**
 * A file name the Angular build stamps with its content hash (`main-ABCDEF12.js`,
 * `chunk-…js`, `styles-….css`, `media/…-….woff2`): a new build gives it a new name, so the
 * browser may keep it for a year without asking again.
 */
const HASHED_ASSET = /-[A-Z0-9]{8}\.[a-z0-9]+$/;

/** One year: the longest lifetime caches honour. */
export const HASHED_ASSET_CACHE_CONTROL = 'public, max-age=31536000, immutable';

/**
 * Serves the built Angular app: static files (hashed bundles cached for a year, the rest
 * revalidated on every use), then `index.html` for every other GET outside /api (client-side
 * routes), revalidated too so a new release is picked up at the next load. Without a build, a
 * clear 503 page says so.
 */
export function serveWeb(app: Express, webDist: string): void {
  app.use(
    express.static(webDist, {
      index: false,
      fallthrough: true,
      setHeaders(res, path) {
        res.setHeader(
          'Cache-Control',
          HASHED_ASSET.test(basename(path)) ? HASHED_ASSET_CACHE_CONTROL : 'no-cache',
        );
      },
    }),
  );
  app.use((req, res, next) => {
    if (
      (req.method !== 'GET' && req.method !== 'HEAD') ||
      req.path === '/api' ||
      req.path.startsWith('/api/')
    ) {
      next();
      return;
    }
    const index = join(webDist, 'index.html');
    if (!existsSync(index)) {
      res.status(503).type('html').set('Cache-Control', 'no-store').send(NOT_BUILT);
      return;
    }
    res.set('Cache-Control', 'no-cache').sendFile(index);
  });
}
