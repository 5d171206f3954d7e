import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig, loadObjectStoreConfig, loadWorkerConfig } from './config';

const SECRET = { JWT_SECRET: 'x'.repeat(40) };

function problemsOf(run: () => unknown): string[] {
  try {
    run();
  } catch (error) {
    if (error instanceof ConfigError) return error.problems;
    throw error;
  }
  throw new Error('the configuration was accepted');
}

describe('configuration', () => {
  it('reads the services’ settings once, with their defaults', () => {
    const config = loadConfig(SECRET);
    expect(config.migrateOnStart).toBe(true);
    expect(config.objectStore).toEqual({
      endpoint: 'http://127.0.0.1:4568',
      region: 'us-east-1',
      bucket: 'gapwise',
      accessKeyId: 'S3RVER',
      secretAccessKey: 'S3RVER',
      forcePathStyle: true,
      endpointSet: false,
    });
    expect(config.screens).toEqual({
      runWorker: true,
      jobExpireSeconds: undefined,
      maintenanceSeconds: 60,
      testChunkDelayMs: undefined,
    });
    expect(config.traces).toEqual({
      runWorker: true,
      jobExpireSeconds: undefined,
      jobRetryLimit: undefined,
      maintenanceSeconds: undefined,
    });
  });

  it('takes the values set', () => {
    const config = loadConfig({
      ...SECRET,
      MIGRATE_ON_START: 'false',
      S3_ENDPOINT: 'http://127.0.0.1:9633/',
      S3_BUCKET: 'pdfs',
      GAPWISE_SCREEN_WORKER: 'no',
      GAPWISE_SCREEN_JOB_EXPIRE_SECONDS: '3',
      GAPWISE_TRACE_WORKER: 'false',
      TRACE_JOB_RETRY_LIMIT: '0',
      GAPWISE_TRACE_MAINTENANCE_SECONDS: '1',
    });
    expect(config.migrateOnStart).toBe(false);
    expect(config.objectStore).toMatchObject({
      endpoint: 'http://127.0.0.1:9633',
      bucket: 'pdfs',
      endpointSet: true,
    });
    expect(config.screens).toMatchObject({ runWorker: false, jobExpireSeconds: 3 });
    expect(config.traces).toMatchObject({
      runWorker: false,
      jobRetryLimit: 0,
      maintenanceSeconds: 1,
    });
  });

  it('refuses every bad value at once, naming each variable', () => {
    const problems = problemsOf(() =>
      loadConfig({
        ...SECRET,
        MIGRATE_ON_START: 'later',
        S3_ENDPOINT: 'ftp://store',
        S3_FORCE_PATH_STYLE: 'perhaps',
        GAPWISE_SCREEN_WORKER: 'maybe',
        GAPWISE_SCREEN_TEST_CHUNK_DELAY_MS: 'soon',
        TRACE_JOB_EXPIRE_SECONDS: '0',
        GAPWISE_TRACE_MAINTENANCE_SECONDS: '1.5',
      }),
    );
    expect(problems).toEqual([
      'MIGRATE_ON_START must be true or false (got "later")',
      'S3_ENDPOINT must be a http: or https: URL',
      'S3_FORCE_PATH_STYLE must be true or false (got "perhaps")',
      'GAPWISE_SCREEN_WORKER must be true or false (got "maybe")',
      'GAPWISE_SCREEN_TEST_CHUNK_DELAY_MS must be an integer from 0 to 60000 (got "soon")',
      'TRACE_JOB_EXPIRE_SECONDS must be an integer from 1 to 86400 (got "0")',
      'GAPWISE_TRACE_MAINTENANCE_SECONDS must be an integer from 1 to 86400 (got "1.5")',
    ]);
  });

  it('gives the standalone worker its database and screen settings, its worker always on', () => {
    const config = loadWorkerConfig({
      DATABASE_URL: 'postgres://u@127.0.0.1:55423/gapwise',
      GAPWISE_SCREEN_WORKER: 'false',
      GAPWISE_SCREEN_MAINTENANCE_SECONDS: '1',
    });
    expect(config.databaseUrl).toBe('postgres://u@127.0.0.1:55423/gapwise');
    expect(config.screens).toMatchObject({ runWorker: true, maintenanceSeconds: 1 });
    expect(problemsOf(() => loadWorkerConfig({ DATABASE_URL: 'mysql://x' }))).toEqual([
      'DATABASE_URL must be a postgres: or postgresql: URL',
    ]);
  });

  it('reads the object store alone for the seed and the browser tests', () => {
    expect(loadObjectStoreConfig({ S3_PORT: '9633' }).endpoint).toBe('http://127.0.0.1:9633');
    expect(problemsOf(() => loadObjectStoreConfig({ S3_PORT: '70000' }))).toEqual([
      'S3_PORT must be an integer from 1 to 65535 (got "70000")',
    ]);
  });
});
