import 'reflect-metadata';
import { createHash } from 'node:crypto';
import compression from 'compression';
import cookieParser from 'cookie-parser';
import express, {
  type Express,
  type Request,
  type RequestHandler,
  type Response,
  Router,
} from 'express';
import helmet from 'helmet';
import type { AppDeps } from './http/context';
import { identify } from './http/authenticate';
import { apiNotFound, errorMiddleware } from './http/error-middleware';
import { refusePrototypeKeys } from './http/validate';
import { registerAuditRoutes } from './audit/routes';
import { registerAuthRoutes } from './auth/routes';
import { registerCalcRoutes } from './calc/routes';
import { registerDocsRoutes } from './docs/routes';
import { registerHealthRoutes } from './health/routes';
import { registerInvitationRoutes } from './invitations/routes';
import { registerPairRoutes } from './pairs/routes';
import { registerReportRoutes } from './reports/routes';
import { registerScreenRoutes } from './screens/routes';
import { registerTraceRoutes } from './traces/routes';
import { registerSeriesRoutes } from './series/routes';
import { registerCascadeRoutes } from './cascades/routes';
import { registerElectrodeRoutes } from './electrodes/routes';
import { registerMaterialRoutes } from './materials/routes';
import { registerTokenRoutes } from './tokens/routes';
import { registerWorkspaceRoutes } from './workspaces/routes';
import { serveWeb } from './web/serve-web';

/**
 * The only inline script of the Angular build: the `onload` handler critical-CSS inlining puts on
 * the deferred stylesheet link. Allowed by hash ('unsafe-hashes'), so no other inline script runs.
 */
export const CRITICAL_CSS_HANDLER_HASH = `'sha256-${createHash('sha256').update("this.media='all'").digest('base64')}'`;

/** Content-Security-Policy for the Angular build and the API page (everything from this origin). */
export const CSP_DIRECTIVES = {
  defaultSrc: ["'self'"],
  scriptSrc: ["'self'", "'unsafe-hashes'", CRITICAL_CSS_HANDLER_HASH],
  // Angular Material and critical-CSS inlining write inline <style>s and style attributes.
  styleSrc: ["'self'", "'unsafe-inline'"],
  fontSrc: ["'self'", 'data:'],
  imgSrc: ["'self'", 'data:', 'blob:'],
  connectSrc: ["'self'"],
  workerSrc: ["'self'", 'blob:'],
  objectSrc: ["'none'"],
  baseUri: ["'self'"],
  formAction: ["'self'"],
  frameAncestors: ["'none'"],
  upgradeInsecureRequests: null,
};

function cors(origins: readonly string[]): RequestHandler {
  return (req, res, next) => {
    const origin = req.headers.origin;
    if (origin && origins.includes(origin)) {
      res.setHeader('Access-Control-Allow-Origin', origin);
      res.setHeader('Access-Control-Allow-Credentials', 'true');
      res.setHeader('Vary', 'Origin');
      if (req.method === 'OPTIONS') {
        res.setHeader('Access-Control-Allow-Methods', 'GET,POST,PUT,PATCH,DELETE');
        res.setHeader('Access-Control-Allow-Headers', 'Content-Type,Authorization,X-CSRF-Token');
        res.status(204).end();
        return;
      }
    }
    next();
  };
}

/** Builds every /api route on one router (so tests can list what is mounted). */
export function createApiRouter(deps: AppDeps): Router {
  const router = Router();
  registerHealthRoutes(router, deps);
  registerDocsRoutes(router, deps);
  registerAuthRoutes(router, deps);
  registerWorkspaceRoutes(router, deps);
  registerInvitationRoutes(router, deps);
  registerPairRoutes(router, deps);
  registerReportRoutes(router, deps);
  registerCalcRoutes(router, deps);
  registerAuditRoutes(router, deps);
  registerTokenRoutes(router, deps);
  registerScreenRoutes(router, deps);
  registerTraceRoutes(router, deps);
  registerSeriesRoutes(router, deps);
  registerCascadeRoutes(router, deps);
  registerElectrodeRoutes(router, deps);
  registerMaterialRoutes(router, deps);
  return router;
}

/** The Express app: security headers, JSON API under /api, and the built web app. */
/**
 * The `compression` package's default choice (compressible types over 1 kB), except event
 * streams: a compressor would hold the server-sent events back until its buffer fills.
 */
function shouldCompress(req: Request, res: Response): boolean {
  const type = res.getHeader('Content-Type');
  if (typeof type === 'string' && type.startsWith('text/event-stream')) return false;
  return compression.filter(req, res);
}

export function createApp(deps: AppDeps): Express {
  const log = deps.log ?? ((m: string) => console.error(m));
  const app = express();
  app.locals['config'] = deps.config;
  app.disable('x-powered-by');
  app.set(
    'trust proxy',
    Array.isArray(deps.config.trustProxy) ? [...deps.config.trustProxy] : deps.config.trustProxy,
  );
  app.use(helmet({ contentSecurityPolicy: { useDefaults: false, directives: CSP_DIRECTIVES } }));
  // Brotli or gzip (by Accept-Encoding) for JSON, CSV and the web app's files: 677 kB of
  // JavaScript goes over the wire as ~170 kB. Compressed per response rather than precompressed
  // at build time: one mechanism covers API answers and static files alike, and the hashed
  // bundles are cached for a year (serve-web.ts), so a browser asks for each one once.
  app.use(compression({ filter: shouldCompress }));
  if (deps.config.logRequests) {
    // Method, path and status only: never bodies, cookies or headers (passwords, tokens).
    app.use((req, res, next) => {
      const started = Date.now();
      res.on('finish', () =>
        log(`${req.method} ${req.path} ${res.statusCode} ${Date.now() - started}ms`),
      );
      next();
    });
  }
  if (deps.config.corsOrigins.length) app.use('/api', cors(deps.config.corsOrigins));
  const api = createApiRouter(deps);
  app.locals['apiRouter'] = api;
  app.use(
    '/api',
    (_req, res, next) => {
      res.setHeader('Cache-Control', 'no-store');
      next();
    },
    express.json({ limit: deps.config.jsonBodyLimit, strict: false }),
    refusePrototypeKeys,
    cookieParser(),
    identify(deps),
    api,
    apiNotFound,
  );
  serveWeb(app, deps.config.webDist);
  app.use(errorMiddleware(log));
  return app;
}
