import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

const here = (path: string) => fileURLToPath(new URL(path, import.meta.url));

/** Path aliases shared by every Node-side test project (the web app has its own builder). */
export const alias = {
  '@gapwise/calc': here('./libs/calc/src/index.ts'),
  '@gapwise/contracts': here('./libs/contracts/src/index.ts'),
  '@gapwise/plots': here('./libs/plots/src/index.ts'),
  '@gapwise/traces': here('./libs/traces/src/index.ts'),
  '@gapwise/db': here('./db/index.ts'),
};

export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: {
          name: 'calc',
          // Generous: CI shares 2 cores with the other suites' servers.
          testTimeout: 30_000,
          include: ['libs/**/*.spec.ts', 'apps/cli/**/*.spec.ts', 'test/lint/**/*.spec.ts'],
          environment: 'node',
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'api',
          include: [
            'apps/api/**/*.spec.ts',
            'db/**/*.spec.ts',
            'test/api/**/*.spec.ts',
            'docker-free-scripts/**/*.spec.ts',
          ],
          environment: 'node',
          testTimeout: 60_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
