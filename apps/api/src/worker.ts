/**
 * Standalone screen worker: `npm run worker`. Connects to the PostgreSQL of DATABASE_URL (the
 * same one the server uses), takes `screen-chunk` jobs from pg-boss and computes them until
 * SIGINT/SIGTERM. Run any number of these, on this machine or others, to share the load; see
 * apps/api/src/screens/README.md. Migrations are the server's job: the worker never runs them.
 */
import { createDataSource } from '@gapwise/db';
import { ConfigError, loadWorkerConfig } from './config';
import { screenServiceOptions, startScreenService } from './screens/screen-queue';

let config;
try {
  config = loadWorkerConfig();
} catch (error) {
  console.error(error instanceof ConfigError ? error.message : error);
  process.exit(1);
}
const url = config.databaseUrl;
const log = (m: string) => console.error(m);
const dataSource = createDataSource({ url, poolSize: 4 });
await dataSource.initialize();
const service = await startScreenService(dataSource, {
  ...screenServiceOptions(url, config.screens),
  runWorker: true,
  log,
}).catch(async (error: Error) => {
  console.error(`cannot start the screen worker: ${error.message}`);
  await dataSource.destroy();
  process.exit(1);
});
console.log(`screen worker ${service.worker!.id} started (database ${new URL(url).host})`);

let stopping = false;
async function stop(signal: string): Promise<void> {
  if (stopping) return;
  stopping = true;
  console.log(`${signal}: stopping the screen worker after the current chunk…`);
  const force = setTimeout(() => process.exit(1), 15_000);
  force.unref();
  await service.stop().catch((e: Error) => console.error(e.message));
  await dataSource.destroy().catch(() => undefined);
  console.log(`screen worker stopped (${service.worker!.processed()} chunk(s) computed)`);
  process.exit(0);
}
process.on('SIGINT', () => void stop('SIGINT'));
process.on('SIGTERM', () => void stop('SIGTERM'));
