/**
 * One running Gapwise for the browser tests, as `npm start` runs it but isolated: a fresh
 * database on the test cluster (migrated, demo seed with the submitted demo report), mail capture
 * and the S3-API store on free loopback ports, the production web build (rebuilt into
 * test-output/e2e-web when a web or library source is newer), and `apps/api/src/main.ts` as a
 * child process. Specs read the addresses with `inject('baseUrl')` and `inject('mailUrl')`.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, statSync } from 'node:fs';
import { readdir } from 'node:fs/promises';
import { createServer } from 'node:net';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { TestProject } from 'vitest/node';
import { createDataSource } from '../../db/data-source';
import { DEMO_LAB, DEMO_MEDIATORS, seedDemo } from '../../apps/api/src/seed/demo-data';
import { seedDemoReport } from '../../apps/api/src/reports/demo-report-seed';
import { seedDemoScreensAndSeries } from '../../apps/api/src/screens/demo-screen-seed';
import { seedDemoCascades } from '../../apps/api/src/cascades/demo-cascade-seed';
import { seedDemoElectrodeCases } from '../../apps/api/src/electrodes/demo-electrode-seed';
import { seedDemoMaterials } from '../../apps/api/src/materials/demo-material-seed';
import { seedDemoTraces } from '../../apps/api/src/traces/demo-trace-seed';
import { TraceObjectStore } from '../../apps/api/src/traces/trace-object-store';
import { loadObjectStoreConfig } from '../../apps/api/src/config';
import { startMailCapture } from '../../docker-free-scripts/mail/mail-capture-server';
import { startObjectStore } from '../../docker-free-scripts/s3/object-store';
import { createTestDatabase } from '../api/support/test-database';

declare module 'vitest' {
  export interface ProvidedContext {
    /** http://127.0.0.1:<port> of the server under test. */
    baseUrl: string;
    /** The mail capture's listing (`GET /messages`, `DELETE /messages`). */
    mailUrl: string;
  }
}

const root = fileURLToPath(new URL('../..', import.meta.url));

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      server.close(() => resolve(port));
    });
  });
}

async function newestMtime(dir: string): Promise<number> {
  let newest = 0;
  for (const entry of await readdir(dir, { withFileTypes: true, recursive: true })) {
    if (!entry.isFile()) continue;
    newest = Math.max(newest, statSync(join(entry.parentPath, entry.name)).mtimeMs);
  }
  return newest;
}

/** The production web build for the tests: GAPWISE_E2E_WEB_DIST, or a fresh build of our own. */
async function webBuild(): Promise<string> {
  const preset = process.env['GAPWISE_E2E_WEB_DIST'];
  if (preset) return preset;
  const out = join(root, 'test-output', 'e2e-web');
  const index = join(out, 'browser', 'index.html');
  const sources = Math.max(
    await newestMtime(join(root, 'apps/web/src')),
    await newestMtime(join(root, 'libs')),
    statSync(join(root, 'angular.json')).mtimeMs,
  );
  if (!existsSync(index) || statSync(index).mtimeMs < sources) {
    console.log('[e2e] building the web app into test-output/e2e-web…');
    const code = await new Promise<number>((resolve) => {
      const child = spawn(
        join(root, 'node_modules/.bin/ng'),
        ['build', '--configuration', 'production', '--output-path', out],
        { cwd: root, stdio: 'inherit', env: { ...process.env, NG_CLI_ANALYTICS: 'false' } },
      );
      child.on('close', (c) => resolve(c ?? 1));
    });
    if (code !== 0) throw new Error(`ng build failed (exit code ${code})`);
  }
  return join(out, 'browser');
}

async function waitForHealth(baseUrl: string, server: ChildProcess, log: () => string) {
  const deadline = Date.now() + 90_000;
  while (Date.now() < deadline) {
    if (server.exitCode !== null) throw new Error(`the server exited early:\n${log()}`);
    try {
      const res = await fetch(`${baseUrl}/api/health`);
      if (res.ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`the server did not answer /api/health within 90 s:\n${log()}`);
}

export default async function setup(project: TestProject) {
  const webDist = await webBuild();
  const database = await createTestDatabase();
  const mail = await startMailCapture({ smtpPort: 0, httpPort: 0 });
  const s3Dir = join(root, 'test-output', 'e2e-s3', database.name);
  mkdirSync(s3Dir, { recursive: true });
  const store = await startObjectStore({ port: 0, directory: s3Dir });
  let server: ChildProcess | null = null;
  const teardown = async () => {
    if (server && server.exitCode === null) {
      const exited = new Promise((r) => server!.once('close', r));
      server.kill('SIGTERM');
      await Promise.race([exited, new Promise((r) => setTimeout(r, 10_000))]);
    }
    await mail.stop().catch(() => undefined);
    await store.stop().catch(() => undefined);
    await database.drop().catch(() => undefined);
  };
  try {
    const dataSource = createDataSource({ url: database.url, poolSize: 2 });
    await dataSource.initialize();
    try {
      await dataSource.runMigrations({ transaction: 'each' });
      await seedDemo(dataSource);
      await seedDemoReport(dataSource, { labName: DEMO_LAB, editorEmail: 'editor@gapwise.test' });
      await seedDemoScreensAndSeries(dataSource, {
        mediatorsName: DEMO_MEDIATORS,
        labName: DEMO_LAB,
        ownerEmail: 'owner@gapwise.test',
        editorEmail: 'editor@gapwise.test',
      });
      await seedDemoCascades(dataSource, { labName: DEMO_LAB, editorEmail: 'editor@gapwise.test' });
      await seedDemoElectrodeCases(dataSource, {
        labName: DEMO_LAB,
        editorEmail: 'editor@gapwise.test',
      });
      await seedDemoMaterials(dataSource, {
        labName: DEMO_LAB,
        editorEmail: 'editor@gapwise.test',
      });
      // The demo traces go into this run's S3 store (started above), as npm start's seed does.
      const traceStore = new TraceObjectStore(
        loadObjectStoreConfig({ S3_ENDPOINT: store.endpoint, S3_BUCKET: store.bucket }),
      );
      try {
        await seedDemoTraces(dataSource, traceStore, {
          labName: DEMO_LAB,
          editorEmail: 'editor@gapwise.test',
        });
      } finally {
        traceStore.destroy();
      }
    } finally {
      await dataSource.destroy();
    }

    const port = await freePort();
    const baseUrl = `http://127.0.0.1:${port}`;
    let output = '';
    server = spawn(
      process.execPath,
      ['docker-free-scripts/run-bundled.mjs', 'apps/api/src/main.ts'],
      {
        cwd: root,
        stdio: ['ignore', 'pipe', 'pipe'],
        env: {
          ...process.env,
          DATABASE_URL: database.url,
          HOST: '127.0.0.1',
          PORT: String(port),
          PUBLIC_URL: baseUrl,
          JWT_SECRET: 'e2e-secret-e2e-secret-e2e-secret-0123456789',
          SMTP_HOST: '127.0.0.1',
          SMTP_PORT: String(mail.smtpPort),
          S3_ENDPOINT: store.endpoint,
          S3_BUCKET: store.bucket,
          WEB_DIST: webDist,
          BCRYPT_COST: '4',
          SIGN_IN_RATE_LIMIT: '100000',
        },
      },
    );
    const keep = (chunk: Buffer) => (output = (output + chunk.toString()).slice(-20_000));
    server.stdout?.on('data', keep);
    server.stderr?.on('data', keep);
    await waitForHealth(baseUrl, server, () => output);
    project.provide('baseUrl', baseUrl);
    project.provide('mailUrl', `http://127.0.0.1:${mail.httpPort}`);
  } catch (error) {
    await teardown();
    throw error;
  }
  return teardown;
}
