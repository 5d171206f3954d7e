/**
 * Starts the Gapwise server: validates the configuration, connects to PostgreSQL, applies
 * pending migrations, starts the mail queue, and serves the API and the built web app on
 * http://HOST:PORT (127.0.0.1:4280 by default). Ctrl-C (SIGINT) or SIGTERM stop it cleanly.
 */
import type { Server } from 'node:http';
import { createApp } from './app';
import { ConfigError, loadConfig } from './config';
import { startRuntime } from './runtime';

let config;
try {
  config = loadConfig();
} catch (error) {
  console.error(error instanceof ConfigError ? error.message : error);
  process.exit(1);
}

const runtime = await startRuntime(config, {
  migrate: config.migrateOnStart,
}).catch((error: Error) => {
  console.error(`cannot start: ${error.message}`);
  console.error(`(is PostgreSQL running? DATABASE_URL host ${new URL(config.databaseUrl).host})`);
  process.exit(1);
});
const app = createApp(runtime);
const server: Server = app.listen(config.port, config.host, () => {
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.port;
  console.log(`Gapwise is running at http://${config.host}:${port}/`);
});
server.on('error', (error) => {
  console.error(`cannot listen on ${config.host}:${config.port}: ${error.message}`);
  void runtime.close().finally(() => process.exit(1));
});

let stopping = false;
async function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  console.log(`\n${signal}: stopping Gapwise…`);
  const force = setTimeout(() => process.exit(1), 10_000);
  force.unref();
  server.close();
  server.closeIdleConnections();
  await runtime.close().catch((error: Error) => console.error(error.message));
  process.exit(0);
}
process.on('SIGINT', () => void stop('SIGINT'));
process.on('SIGTERM', () => void stop('SIGTERM'));
