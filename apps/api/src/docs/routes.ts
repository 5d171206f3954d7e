import { createRequire } from 'node:module';
import express, { type Router } from 'express';
import type { AppDeps } from '../http/context';
import { APP_VERSION } from '../health/routes';
import { buildOpenApi } from './openapi';

const SWAGGER_DIR: string = (
  createRequire(import.meta.url)('swagger-ui-dist') as { getAbsoluteFSPath(): string }
).getAbsoluteFSPath();

const PAGE = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>Gapwise API</title>
<link rel="stylesheet" href="/api/docs/assets/swagger-ui.css"></head>
<body><div id="swagger-ui"></div>
<script src="/api/docs/assets/swagger-ui-bundle.js"></script>
<script src="/api/docs/swagger-init.js"></script></body></html>`;

const INIT = `window.ui = SwaggerUIBundle({ url: '/api/docs/openapi.json', dom_id: '#swagger-ui', deepLinking: true });\n`;

/** The API description, and a readable page from our own copy of swagger-ui (no CDN). */
export function registerDocsRoutes(router: Router, _deps: AppDeps): void {
  const spec = buildOpenApi(APP_VERSION);
  router.use('/docs/assets', express.static(SWAGGER_DIR, { index: false, maxAge: '1d' }));
  router.get('/docs', (_req, res) => {
    res.type('html').send(PAGE);
  });
  router.get('/docs/openapi.json', (_req, res) => {
    res.json(spec);
  });
  router.get('/docs/swagger-init.js', (_req, res) => {
    res.type('application/javascript').send(INIT);
  });
}
