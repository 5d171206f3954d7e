/**
 * Applies pending migrations: `npx tsx db/migrate.ts` (or `--revert` to undo the last one).
 * DATABASE_URL defaults to the development cluster of docker-free-scripts/postgres-start.sh.
 */
import { createDataSource, DEFAULT_DATABASE_URL } from './data-source';

const url = process.env.DATABASE_URL || DEFAULT_DATABASE_URL;
const dataSource = createDataSource({ url, poolSize: 2 });
try {
  await dataSource.initialize();
  if (process.argv.includes('--revert')) {
    await dataSource.undoLastMigration({ transaction: 'each' });
    console.log('reverted the last migration');
  } else {
    const done = await dataSource.runMigrations({ transaction: 'each' });
    console.log(
      done.length ? `applied: ${done.map((m) => m.name).join(', ')}` : 'no pending migrations',
    );
  }
} catch (error) {
  console.error(`migration failed: ${(error as Error).message}`);
  process.exitCode = 1;
} finally {
  if (dataSource.isInitialized) await dataSource.destroy();
}
