import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import type { Router } from 'express';
import type { HealthInfo } from '@gapwise/contracts';
import { migrationState } from '@gapwise/db';
import type { AppDeps } from '../http/context';
import { REPO_ROOT } from '../config';

export const APP_VERSION: string = JSON.parse(
  readFileSync(resolve(REPO_ROOT, 'package.json'), 'utf8'),
).version;

export function registerHealthRoutes(router: Router, deps: AppDeps): void {
  /** Version, database reachability and migration state; 503 when the database is down. */
  router.get('/health', async (_req, res) => {
    let reachable = false;
    let migrations: HealthInfo['migrations'] = null;
    try {
      await deps.dataSource.query('SELECT 1');
      reachable = true;
      const state = await migrationState(deps.dataSource);
      migrations = { applied: state.applied.length, pending: state.pending };
    } catch {
      // reported below; details stay out of the answer
    }
    const ok = reachable && migrations !== null && migrations.pending.length === 0;
    const body: HealthInfo = {
      status: ok ? 'ok' : 'degraded',
      version: APP_VERSION,
      database: { reachable },
      migrations,
    };
    res.status(reachable ? 200 : 503).json(body);
  });
}
