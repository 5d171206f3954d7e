import { randomBytes } from 'node:crypto';
import { availableParallelism } from 'node:os';
import { isIP } from 'node:net';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { DEFAULT_DATABASE_URL } from '@gapwise/db';

/**
 * Repository root: the nearest folder above this module whose package.json is Gapwise's. Found by
 * walking up rather than by a fixed `../../..`, because the server also runs from a bundle in
 * .cache/bundles (docker-free-scripts/run-bundled.mjs).
 */
export const REPO_ROOT = findRepoRoot(dirname(fileURLToPath(import.meta.url)));

function findRepoRoot(start: string): string {
  for (let dir = start; ; dir = dirname(dir)) {
    const manifest = resolve(dir, 'package.json');
    if (
      existsSync(manifest) &&
      (JSON.parse(readFileSync(manifest, 'utf8')) as { name?: string }).name === 'gapwise'
    )
      return dir;
    if (dirname(dir) === dir) throw new Error(`no Gapwise package.json above ${start}`);
  }
}

/** The whole configuration of the API process, validated once at start-up. */
export interface Config {
  readonly port: number;
  readonly host: string;
  readonly databaseUrl: string;
  readonly jwtSecret: string;
  /** Base of links in e-mails, without a trailing slash. */
  readonly publicUrl: string;
  readonly smtpHost: string;
  readonly smtpPort: number;
  readonly mailFrom: string;
  /** Origins allowed by CORS; empty = CORS off. */
  readonly corsOrigins: readonly string[];
  /** bcrypt cost factor (tests use 4). */
  readonly bcryptCost: number;
  /**
   * Failed sign-ins allowed per client address and, separately, per account per 15 minutes (also
   * the limit on registration, confirmation and password-reset requests per address).
   */
  readonly signInRateLimit: number;
  /**
   * Express 'trust proxy': false (direct), a number of proxy hops, or a list of proxy addresses /
   * subnets, so the client address (rate limits) comes from X-Forwarded-For behind a proxy.
   */
  readonly trustProxy: boolean | number | readonly string[];
  readonly accessTokenSeconds: number;
  readonly refreshTokenSeconds: number;
  readonly invitationDays: number;
  /** Set the Secure flag on cookies (behind HTTPS). */
  readonly cookieSecure: boolean;
  readonly jsonBodyLimit: string;
  /** Built Angular app (index.html and assets). */
  readonly webDist: string;
  readonly logRequests: boolean;
  /** Largest decompressed size of a gzip trace upload (bytes): a small file may inflate to gigabytes. */
  readonly traceMaxDecompressedBytes: number;
  /**
   * Largest ratio of decompressed to compressed bytes of a gzip trace, checked once it has
   * inflated past 16 MiB: numeric text compresses 3–10×, a decompression bomb by hundreds.
   */
  readonly traceMaxGzipRatio: number;
  /** Largest screen upload (bytes of CSV, file, body or paste). */
  readonly screenMaxBytes: number;
  /** Most data rows of one screen. */
  readonly screenMaxRows: number;
  /** Worker threads of the calculation pool (compute/compute-pool.ts). */
  readonly calcThreads: number;
  /** Calculations waiting for a thread at most; beyond it 503 with Retry-After. */
  readonly calcQueue: number;
  /** Budget (ms of a worker's time) of a calculation a person waits for; over it 422. */
  readonly calcBudgetMs: number;
  /** Budget (ms) of background calculations: screen chunks of the in-server worker. */
  readonly backgroundCalcBudgetMs: number;
  /** Apply pending migrations at start (MIGRATE_ON_START; workers never do). */
  readonly migrateOnStart: boolean;
  /** The S3-API object store of trace files and report PDFs. */
  readonly objectStore: ObjectStoreConfig;
  /** Screens: the `screen-chunk` queue and this process's worker. */
  readonly screens: ScreenSettings;
  /** Energy-gap traces: the `trace-analysis` queue and this process's worker. */
  readonly traces: TraceSettings;
}

/** S3_*: where trace files and report PDFs are stored (default: the local fake, `npm run s3:start`). */
export interface ObjectStoreConfig {
  readonly endpoint: string;
  readonly region: string;
  readonly bucket: string;
  readonly accessKeyId: string;
  readonly secretAccessKey: string;
  /** Path-style URLs (required by s3rver and most self-hosted stores). */
  readonly forcePathStyle: boolean;
  /**
   * S3_ENDPOINT was set: report PDFs are kept in the store. Unset, they are regenerated on each
   * download (traces still use the default endpoint).
   */
  readonly endpointSet: boolean;
}

/** GAPWISE_SCREEN_*: undefined numbers take the queue's defaults (screens/screen-queue.ts). */
export interface ScreenSettings {
  /** GAPWISE_SCREEN_WORKER: a worker inside this process (default true). */
  readonly runWorker: boolean;
  readonly jobExpireSeconds: number | undefined;
  /** How often pg-boss expires lost jobs (default 60 s). */
  readonly maintenanceSeconds: number;
  /** GAPWISE_SCREEN_TEST_CHUNK_DELAY_MS: a pause per chunk, for tests of running screens. */
  readonly testChunkDelayMs: number | undefined;
}

/** GAPWISE_TRACE_* and TRACE_JOB_*: undefined numbers take the queue's defaults. */
export interface TraceSettings {
  /** GAPWISE_TRACE_WORKER: a worker inside this process (default true). */
  readonly runWorker: boolean;
  readonly jobExpireSeconds: number | undefined;
  readonly jobRetryLimit: number | undefined;
  /** How often pg-boss expires lost jobs (pg-boss's default when undefined). */
  readonly maintenanceSeconds: number | undefined;
}

export class ConfigError extends Error {
  constructor(readonly problems: string[]) {
    super(`invalid configuration:\n  ${problems.join('\n  ')}`);
    this.name = 'ConfigError';
  }
}

type Env = Record<string, string | undefined>;

/**
 * Reads and validates the configuration from the environment. Every problem is reported at
 * once, and a bad value stops the process. When JWT_SECRET is unset, a secret is generated on
 * first start into `.data/secrets/jwt-secret` (git-ignored) and reused afterwards.
 */
export function loadConfig(env: Env = process.env, overrides: Partial<Config> = {}): Config {
  const read = envReader(env);
  const { int, bool, url, problems } = read;

  const port = int('PORT', 4280, 0, 65535);
  const host = env['HOST'] || '127.0.0.1';
  const corsOrigins = (env['CORS_ORIGINS'] ?? '')
    .split(',')
    .map((s) => s.trim())
    .filter(Boolean);
  for (const origin of corsOrigins) {
    if (!/^https?:\/\/[^/]+$/.test(origin))
      problems.push(`CORS_ORIGINS: "${origin}" is not an origin`);
  }
  const trustProxy = parseTrustProxy(env['TRUST_PROXY'], problems);
  let jwtSecret = env['JWT_SECRET'] ?? '';
  if (jwtSecret && jwtSecret.length < 32)
    problems.push('JWT_SECRET must be at least 32 characters');
  const config: Config = {
    port,
    host,
    databaseUrl: url('DATABASE_URL', DEFAULT_DATABASE_URL, ['postgres:', 'postgresql:']),
    jwtSecret,
    publicUrl: url('PUBLIC_URL', `http://127.0.0.1:${port || 4280}`, ['http:', 'https:']),
    smtpHost: env['SMTP_HOST'] || '127.0.0.1',
    smtpPort: int('SMTP_PORT', 2525, 1, 65535),
    mailFrom: env['MAIL_FROM'] || 'Gapwise <no-reply@gapwise.test>',
    corsOrigins,
    bcryptCost: int('BCRYPT_COST', 12, 4, 15),
    signInRateLimit: int('SIGN_IN_RATE_LIMIT', 10, 1, 1_000_000),
    trustProxy,
    accessTokenSeconds: int('ACCESS_TOKEN_SECONDS', 15 * 60, 10, 24 * 3600),
    refreshTokenSeconds: int('REFRESH_TOKEN_SECONDS', 14 * 24 * 3600, 60, 365 * 24 * 3600),
    invitationDays: int('INVITATION_DAYS', 7, 1, 90),
    cookieSecure: bool('COOKIE_SECURE', false),
    jsonBodyLimit: env['JSON_BODY_LIMIT'] || '256kb',
    webDist: resolve(REPO_ROOT, env['WEB_DIST'] || 'dist/web/browser'),
    logRequests: bool('LOG_REQUESTS', false),
    traceMaxDecompressedBytes: int('TRACE_MAX_DECOMPRESSED_BYTES', 4 * 1024 ** 3, 1024, 2 ** 50),
    traceMaxGzipRatio: int('TRACE_MAX_GZIP_RATIO', 100, 2, 100_000),
    screenMaxBytes: int('SCREEN_MAX_BYTES', 512 * 1024 ** 2, 1024, 2 ** 40),
    screenMaxRows: int('SCREEN_MAX_ROWS', 1_000_000, 1, 100_000_000),
    // One CPU is left to the thread that answers HTTP (and to PostgreSQL on a small machine).
    calcThreads: int('CALC_THREADS', Math.max(1, availableParallelism() - 1), 1, 256),
    calcQueue: int('CALC_QUEUE', 64, 0, 100_000),
    calcBudgetMs: int('CALC_BUDGET_MS', 10_000, 10, 3_600_000),
    backgroundCalcBudgetMs: int('BACKGROUND_CALC_BUDGET_MS', 300_000, 10, 24 * 3_600_000),
    migrateOnStart: bool('MIGRATE_ON_START', true),
    objectStore: readObjectStore(read),
    screens: readScreenSettings(read, true),
    traces: readTraceSettings(read),
    ...overrides,
  };
  if (problems.length > 0) throw new ConfigError(problems);
  if (!config.jwtSecret) {
    jwtSecret = readOrCreateSecret(resolve(REPO_ROOT, '.data', 'secrets', 'jwt-secret'));
    return { ...config, jwtSecret };
  }
  return config;
}

interface EnvReader {
  readonly env: Env;
  /** Every problem found so far ("NAME must be …"), reported together. */
  readonly problems: string[];
  int(name: string, fallback: number, min: number, max: number): number;
  /** An integer, or undefined when the variable is unset (the consumer's default applies). */
  optionalInt(name: string, min: number, max: number): number | undefined;
  bool(name: string, fallback: boolean): boolean;
  url(name: string, fallback: string, protocols: string[]): string;
}

/** The one set of parsers for environment variables; each refusal names the variable. */
function envReader(env: Env): EnvReader {
  const problems: string[] = [];
  const optionalInt = (name: string, min: number, max: number): number | undefined => {
    const raw = env[name];
    if (raw === undefined || raw === '') return undefined;
    const value = Number(raw);
    if (!Number.isInteger(value) || value < min || value > max) {
      problems.push(`${name} must be an integer from ${min} to ${max} (got "${raw}")`);
      return undefined;
    }
    return value;
  };
  return {
    env,
    problems,
    optionalInt,
    int: (name, fallback, min, max) => optionalInt(name, min, max) ?? fallback,
    bool: (name, fallback) => {
      const raw = env[name];
      if (raw === undefined || raw === '') return fallback;
      if (['1', 'true', 'yes'].includes(raw.toLowerCase())) return true;
      if (['0', 'false', 'no'].includes(raw.toLowerCase())) return false;
      problems.push(`${name} must be true or false (got "${raw}")`);
      return fallback;
    },
    url: (name, fallback, protocols) => {
      const raw = env[name] || fallback;
      try {
        const parsed = new URL(raw);
        if (!protocols.includes(parsed.protocol)) throw new Error();
      } catch {
        problems.push(`${name} must be a ${protocols.join(' or ')} URL`);
      }
      return raw.replace(/\/+$/, '');
    },
  };
}

function readObjectStore(read: EnvReader): ObjectStoreConfig {
  const { env } = read;
  const port = read.int('S3_PORT', 4568, 1, 65535);
  return {
    endpoint: read.url('S3_ENDPOINT', `http://127.0.0.1:${port}`, ['http:', 'https:']),
    region: env['S3_REGION'] || 'us-east-1',
    bucket: env['S3_BUCKET'] || 'gapwise',
    accessKeyId: env['S3_ACCESS_KEY_ID'] || 'S3RVER',
    secretAccessKey: env['S3_SECRET_ACCESS_KEY'] || 'S3RVER',
    forcePathStyle: read.bool('S3_FORCE_PATH_STYLE', true),
    endpointSet: Boolean(env['S3_ENDPOINT']),
  };
}

function readScreenSettings(read: EnvReader, runWorkerDefault: boolean): ScreenSettings {
  return {
    runWorker: read.bool('GAPWISE_SCREEN_WORKER', runWorkerDefault),
    jobExpireSeconds: read.optionalInt('GAPWISE_SCREEN_JOB_EXPIRE_SECONDS', 1, 86_400),
    maintenanceSeconds: read.int('GAPWISE_SCREEN_MAINTENANCE_SECONDS', 60, 1, 86_400),
    testChunkDelayMs: read.optionalInt('GAPWISE_SCREEN_TEST_CHUNK_DELAY_MS', 0, 60_000),
  };
}

function readTraceSettings(read: EnvReader): TraceSettings {
  return {
    runWorker: read.bool('GAPWISE_TRACE_WORKER', true),
    jobExpireSeconds: read.optionalInt('TRACE_JOB_EXPIRE_SECONDS', 1, 24 * 3600),
    jobRetryLimit: read.optionalInt('TRACE_JOB_RETRY_LIMIT', 0, 100),
    maintenanceSeconds: read.optionalInt('GAPWISE_TRACE_MAINTENANCE_SECONDS', 1, 86_400),
  };
}

/** The object-store settings alone (the demo seed and the browser tests' set-up). */
export function loadObjectStoreConfig(env: Env = process.env): ObjectStoreConfig {
  const read = envReader(env);
  const store = readObjectStore(read);
  if (read.problems.length > 0) throw new ConfigError(read.problems);
  return store;
}

/**
 * The configuration of a standalone screen worker (`npm run worker`): DATABASE_URL and the
 * GAPWISE_SCREEN_* settings, its worker always on.
 */
export function loadWorkerConfig(env: Env = process.env): {
  readonly databaseUrl: string;
  readonly screens: ScreenSettings;
} {
  const read = envReader(env);
  const databaseUrl = read.url('DATABASE_URL', DEFAULT_DATABASE_URL, ['postgres:', 'postgresql:']);
  const screens = { ...readScreenSettings(read, true), runWorker: true };
  if (read.problems.length > 0) throw new ConfigError(read.problems);
  return { databaseUrl, screens };
}

const PROXY_NAMES = new Set(['loopback', 'linklocal', 'uniquelocal']);

/**
 * TRUST_PROXY: empty or `false` (no proxy), a hop count 1–10, or a comma-separated list of proxy
 * addresses, subnets (`10.0.0.0/8`) or the names loopback, linklocal, uniquelocal. `true` is
 * refused: trusting every hop lets any client choose its address and walk past the rate limits.
 */
function parseTrustProxy(
  raw: string | undefined,
  problems: string[],
): boolean | number | readonly string[] {
  const value = (raw ?? '').trim();
  if (value === '' || value.toLowerCase() === 'false' || value === '0') return false;
  if (/^\d+$/.test(value)) {
    const hops = Number(value);
    if (hops <= 10) return hops;
  } else if (value.toLowerCase() !== 'true') {
    const entries = value.split(',').map((s) => s.trim());
    const bad = entries.filter((entry) => {
      if (PROXY_NAMES.has(entry)) return false;
      const [address, bits, extra] = entry.split('/');
      const family = isIP(address ?? '');
      if (!family || extra !== undefined) return true;
      if (bits === undefined) return false;
      const n = Number(bits);
      return !/^\d+$/.test(bits) || n > (family === 4 ? 32 : 128);
    });
    if (bad.length === 0) return entries;
    problems.push(
      `TRUST_PROXY: ${bad.map((b) => `"${b}"`).join(', ')} is not an address, subnet or one of loopback, linklocal, uniquelocal`,
    );
    return false;
  }
  problems.push(
    `TRUST_PROXY must be false, a number of proxy hops from 1 to 10, or a list of proxy addresses (got "${value}")`,
  );
  return false;
}

function readOrCreateSecret(file: string): string {
  if (existsSync(file)) {
    const value = readFileSync(file, 'utf8').trim();
    if (value.length >= 32) return value;
  }
  mkdirSync(dirname(file), { recursive: true, mode: 0o700 });
  const value = randomBytes(48).toString('base64url');
  writeFileSync(file, value + '\n', { mode: 0o600 });
  return value;
}
