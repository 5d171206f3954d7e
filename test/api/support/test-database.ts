import { randomBytes } from 'node:crypto';
import pg from 'pg';

/** Connection URL of the test cluster (docker-free-scripts/postgres-start.sh --test). */
export function testClusterUrl(): string {
  const url = process.env['GAPWISE_TEST_DATABASE_URL'];
  if (!url) {
    throw new Error(
      'GAPWISE_TEST_DATABASE_URL is not set: run the API tests through `npm test` (or `npm run test:api`), ' +
        'or start the test cluster with `bash docker-free-scripts/postgres-start.sh --test` and export the URL it prints.',
    );
  }
  return url;
}

export interface TestDatabase {
  readonly url: string;
  readonly name: string;
  drop(): Promise<void>;
}

/** Creates `test_<pid>_<random>` on the test cluster; `drop()` removes it WITH (FORCE). */
export async function createTestDatabase(): Promise<TestDatabase> {
  const base = testClusterUrl();
  const name = `test_${process.pid}_${randomBytes(4).toString('hex')}`;
  const admin = new pg.Client({ connectionString: base });
  await admin.connect();
  try {
    await admin.query(`CREATE DATABASE "${name}"`);
  } finally {
    await admin.end();
  }
  const url = new URL(base);
  url.pathname = `/${name}`;
  return {
    url: url.toString(),
    name,
    async drop() {
      const c = new pg.Client({ connectionString: base });
      await c.connect();
      try {
        // A busy autovacuum worker can refuse FORCE briefly on a cluster without
        // pg_signal_backend for our role: retry a few times before giving up.
        for (let attempt = 1; ; attempt++) {
          try {
            await c.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
            break;
          } catch (error) {
            if (attempt >= 10) throw error;
            await new Promise((resolve) => setTimeout(resolve, 500));
          }
        }
      } finally {
        await c.end();
      }
    },
  };
}
