import type { Express } from 'express';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import {
  startMailCapture,
  type CapturedMessage,
  type MailCapture,
} from '../../../docker-free-scripts/mail/mail-capture-server';
import { createApp } from '../../../apps/api/src/app';
import { loadConfig, type Config } from '../../../apps/api/src/config';
import { startRuntime, type Runtime } from '../../../apps/api/src/runtime';
import { createTestDatabase, type TestDatabase } from './test-database';

export interface TestApp {
  readonly app: Express;
  readonly config: Config;
  readonly db: DataSource;
  readonly runtime: Runtime;
  readonly mail: MailCapture;
  readonly database: TestDatabase;
  close(): Promise<void>;
}

/** The test app of each Express app, so `registerUser(t.app)` can read its captured e-mail. */
const running = new WeakMap<Express, TestApp>();

const SERVICE_VARIABLE = /^(S3_|GAPWISE_SCREEN_|GAPWISE_TRACE_|TRACE_JOB_)/;

function serviceSettings(env: NodeJS.ProcessEnv): Record<string, string> {
  return Object.fromEntries(
    Object.entries(env).filter(
      (entry): entry is [string, string] =>
        SERVICE_VARIABLE.test(entry[0]) && entry[1] !== undefined,
    ),
  );
}

/**
 * A fresh database (migrated), a real SMTP capture on a free port, the pg-boss mail queue and the
 * Express app, configured for tests (bcrypt cost 4, no sign-in throttling unless asked).
 */
export async function startTestApp(
  overrides: Partial<Config> = {},
  env: Record<string, string> = {},
): Promise<TestApp> {
  const database = await createTestDatabase();
  const mail = await startMailCapture({ smtpPort: 0 });
  let runtime: Runtime | null = null;
  try {
    const config = loadConfig(
      {
        // The service settings a test file sets in process.env before starting (S3_ENDPOINT of
        // its S3 fake, GAPWISE_SCREEN_WORKER=false, …): the server reads them the same way.
        ...serviceSettings(process.env),
        DATABASE_URL: database.url,
        JWT_SECRET: 'test-secret-test-secret-test-secret-0123456789',
        PUBLIC_URL: 'http://127.0.0.1:4280',
        SMTP_HOST: '127.0.0.1',
        SMTP_PORT: String(mail.smtpPort),
        BCRYPT_COST: '4',
        SIGN_IN_RATE_LIMIT: '100000',
        WEB_DIST: 'test-output/no-web-build',
        ...env,
      },
      overrides,
    );
    runtime = await startRuntime(config, {
      migrate: true,
      log: () => undefined,
      mailRetryDelaySeconds: 1,
    });
    const app = createApp(runtime);
    const rt = runtime;
    const testApp: TestApp = {
      app,
      config,
      db: runtime.dataSource,
      runtime,
      mail,
      database,
      async close() {
        await rt.close();
        await mail.stop();
        await database.drop();
      },
    };
    running.set(app, testApp);
    return testApp;
  } catch (error) {
    await runtime?.close().catch(() => undefined);
    await mail.stop();
    await database.drop();
    throw error;
  }
}

/** A signed-in browser-like client: cookies plus the CSRF header on writes. */
export interface Session {
  readonly userId: string;
  readonly email: string;
  readonly csrf: string;
  readonly cookies: string[];
  get(path: string): request.Test;
  post(path: string, body?: unknown): request.Test;
  put(path: string, body?: unknown): request.Test;
  patch(path: string, body?: unknown): request.Test;
  delete(path: string): request.Test;
  call(method: string, path: string, body?: unknown): request.Test;
}

export function sessionFrom(app: Express, res: request.Response): Session {
  const raw = res.headers['set-cookie'] as unknown as string[] | string | undefined;
  const cookies = (Array.isArray(raw) ? raw : raw ? [raw] : []).map((c) => c.split(';')[0]!);
  const csrf = res.body.csrfToken as string;
  const call = (method: string, path: string, body?: unknown) => {
    const m = method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
    let t = request(app)[m](path).set('Cookie', cookies.join('; '));
    if (m !== 'get') t = t.set('X-CSRF-Token', csrf);
    if (body !== undefined) t = t.send(body as object);
    return t;
  };
  return {
    userId: res.body.user.id,
    email: res.body.user.email,
    csrf,
    cookies,
    call,
    get: (p) => call('get', p),
    post: (p, b) => call('post', p, b),
    put: (p, b) => call('put', p, b),
    patch: (p, b) => call('patch', p, b),
    delete: (p) => call('delete', p),
  };
}

/** The token of the newest confirmation link e-mailed to `email` (waits for the real SMTP capture). */
export async function confirmationToken(
  mail: MailCapture,
  email: string,
  timeoutMs = 30_000,
): Promise<string> {
  const address = email.toLowerCase();
  const isConfirmation = (m: CapturedMessage) =>
    m.to.includes(address) && CONFIRM_LINK.test(m.text);
  await mail.waitFor(isConfirmation, timeoutMs);
  const newest = mail.messages().filter(isConfirmation).at(-1)!;
  return CONFIRM_LINK.exec(newest.text)![1]!;
}
const CONFIRM_LINK = /http:\/\/127\.0\.0\.1:4280\/confirm\/([\w-]+)/;

let counter = 0;
/**
 * Registers a new user the way a person does: `POST /api/auth/register` (202), the confirmation
 * e-mail through the SMTP capture, then `POST /api/auth/confirm` with its token. Returns the
 * signed-in session of the confirmation.
 */
export async function registerUser(app: Express, name = 'user'): Promise<Session> {
  const t = running.get(app);
  if (!t) throw new Error('registerUser needs an app from startTestApp()');
  counter++;
  const email = `${name}-${counter}-${Date.now()}@example.test`;
  const res = await request(app)
    .post('/api/auth/register')
    .send({ email, password: 'correct horse battery', displayName: `${name} ${counter}` });
  if (res.status !== 202)
    throw new Error(`register failed: ${res.status} ${JSON.stringify(res.body)}`);
  const token = await confirmationToken(t.mail, email);
  const confirmed = await request(app).post('/api/auth/confirm').send({ token });
  if (confirmed.status !== 200)
    throw new Error(`confirm failed: ${confirmed.status} ${JSON.stringify(confirmed.body)}`);
  return sessionFrom(app, confirmed);
}

export async function signIn(app: Express, email: string, password: string): Promise<Session> {
  const res = await request(app).post('/api/auth/sign-in').send({ email, password });
  if (res.status !== 200)
    throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`);
  return sessionFrom(app, res);
}
