import { existsSync } from 'node:fs';
import { join } from 'node:path';
import express, { type Express } from 'express';

const NOT_BUILT = `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Gapwise — web app not built</title></head>
<body style="font-family: sans-serif; max-width: 40rem; margin: 4rem auto; line-height: 1.5">
<h1>The web app has not been built</h1>
<p>The API is running (see <a href="/api/health">/api/health</a> and <a href="/api/docs">/api/docs</a>),
but there is no built web app in <code>dist/web/browser</code>.</p>
<p>Build it with <code>npx ng build</code> (or start everything with <code>npm start</code>) and reload this page.</p>
</body></html>`;

/**
 * Serves the built Angular app: static files, then `index.html` for every other GET outside
 * /api (client-side routes). Without a build, a clear 503 page says so.
 */
export function serveWeb(app: Express, webDist: string): void {
  app.use(express.static(webDist, { index: false, maxAge: '1h', fallthrough: true }));
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
