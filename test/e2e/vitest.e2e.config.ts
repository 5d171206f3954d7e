import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';
import { alias } from '../../vitest.config';

/**
 * Browser tests: `npx vitest run --config test/e2e/vitest.e2e.config.ts [file]` with
 * GAPWISE_TEST_DATABASE_URL set (`npm run test:e2e` does it). The global setup builds the web app
 * when stale, seeds a fresh database with the demo, and starts the real server with mail capture
 * and the S3-API store on loopback; each spec drives Debian's chromium through playwright-core.
 */
export default defineConfig({
  root: fileURLToPath(new URL('../..', import.meta.url)),
  resolve: { alias },
  test: {
    name: 'e2e',
    include: ['test/e2e/**/*.e2e.ts'],
    environment: 'node',
    globalSetup: ['test/e2e/global-setup.ts'],
    fileParallelism: false,
    testTimeout: 180_000,
    hookTimeout: 300_000,
  },
});
