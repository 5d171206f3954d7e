// ESLint flat config: TypeScript rules plus the dependency rules of the workspace (DEVELOPERS.md).
import js from '@eslint/js';
import tseslint from 'typescript-eslint';

const nodeBuiltins = [
  'node:*',
  'fs',
  'fs/*',
  'path',
  'os',
  'child_process',
  'crypto',
  'http',
  'https',
  'net',
  'stream',
  'stream/*',
  'url',
  'util',
  'zlib',
  'readline',
  'worker_threads',
  'events',
  'buffer',
  'process',
];
const frameworks = [
  '@angular/*',
  'rxjs',
  'rxjs/*',
  'express',
  'express-*',
  'typeorm',
  'pg',
  'pg-boss',
  'passport*',
  'nodemailer',
  'pdfkit',
  'multer',
  '@aws-sdk/*',
  'd3',
  'd3-*',
];
/** No library reaches into another library's files: only `@gapwise/<lib>` (its index). */
const deepLibraryImports = {
  group: ['@gapwise/*/*', '**/libs/*/src/**'],
  message: 'Import a library only through its index alias (@gapwise/<name>).',
};
const appImports = {
  group: ['**/apps/**', '@gapwise/api*', '@gapwise/web*', '@gapwise/cli*'],
  message: 'Libraries never import apps.',
};
const dbImports = {
  group: ['**/db/**', '@gapwise/db'],
  message: 'Libraries never import the database layer.',
};

export default tseslint.config(
  {
    ignores: [
      'node_modules/',
      'dist/',
      '.data/',
      '.angular/',
      '.cache/',
      'test-output/',
      '**/*.d.ts',
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: {
      globals: {
        console: 'readonly',
        process: 'readonly',
        setTimeout: 'readonly',
        clearTimeout: 'readonly',
        setInterval: 'readonly',
        clearInterval: 'readonly',
        URL: 'readonly',
        Buffer: 'readonly',
        performance: 'readonly',
        document: 'readonly',
        window: 'readonly',
        fetch: 'readonly',
        TextEncoder: 'readonly',
        TextDecoder: 'readonly',
        structuredClone: 'readonly',
        setImmediate: 'readonly',
        queueMicrotask: 'readonly',
        AbortController: 'readonly',
      },
    },
    rules: {
      '@typescript-eslint/no-explicit-any': 'off',
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_' },
      ],
      'no-constant-condition': ['error', { checkLoops: false }],
    },
  },
  {
    // The calculation core runs in the browser and on the server alike: no framework, no Node
    // built-in, no database, no app.
    files: ['libs/calc/src/**/*.ts'],
    ignores: ['libs/calc/**/*.spec.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          paths: nodeBuiltins.filter((n) => !n.includes('*')),
          patterns: [
            { group: nodeBuiltins, message: 'libs/calc imports no Node built-in.' },
            { group: frameworks, message: 'libs/calc imports no framework.' },
            {
              group: ['**/contracts/**', '@gapwise/contracts', '@gapwise/plots'],
              message: 'libs/calc depends on no other library.',
            },
            deepLibraryImports,
            appImports,
            dbImports,
          ],
        },
      ],
    },
  },
  {
    files: ['libs/**/*.ts'],
    ignores: ['libs/calc/**', 'libs/traces/**', 'libs/**/*.spec.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: nodeBuiltins,
              message: 'Shared libraries run in the browser: no Node built-in.',
            },
            { group: frameworks, message: 'Shared libraries import no framework.' },
            deepLibraryImports,
            appImports,
            dbImports,
          ],
        },
      ],
    },
  },
  {
    // Trace files are read from streams (uploads, object-store downloads, local files) and the
    // analysis spills to temporary files: this library runs on the server and in the command
    // line only, so Node built-ins are allowed; frameworks, the database and apps are not.
    files: ['libs/traces/**/*.ts'],
    ignores: ['libs/**/*.spec.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: frameworks, message: 'libs/traces imports no framework.' },
            deepLibraryImports,
            appImports,
            dbImports,
          ],
        },
      ],
    },
  },
  {
    files: ['apps/web/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: [
                '**/apps/api/**',
                '**/apps/cli/**',
                '**/api/src/**',
                '**/cli/src/**',
                'express',
                'typeorm',
                'pg',
                '@gapwise/db',
                '**/db/**',
              ],
              message: 'The web app never imports the API, the CLI or the database.',
            },
            deepLibraryImports,
          ],
        },
      ],
    },
  },
  // No app imports another app (apps/web ↔ apps/api ↔ apps/cli) and db imports no app: what two
  // apps share goes into a library (e.g. the trace parser in libs/traces).
  {
    files: ['apps/api/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['**/apps/web/**', '**/web/src/**', '@angular/*'],
              message: 'Server code never imports the web app.',
            },
            {
              group: ['**/apps/cli/**', '**/cli/src/**', '@gapwise/cli', '@gapwise/cli/*'],
              message: 'No app imports another app: the API never imports the CLI.',
            },
            deepLibraryImports,
          ],
        },
      ],
    },
  },
  {
    files: ['apps/cli/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['**/apps/web/**', '**/web/src/**', '@angular/*'],
              message: 'Server code never imports the web app.',
            },
            {
              group: ['**/apps/api/**', '**/api/src/**', '**/api/bench/**'],
              message:
                'No app imports another app: the CLI never imports the API (share code through a library).',
            },
            deepLibraryImports,
          ],
        },
      ],
    },
  },
  {
    files: ['db/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: [
                '**/apps/**',
                '**/api/src/**',
                '**/cli/src/**',
                '**/web/src/**',
                '@angular/*',
              ],
              message: 'The database layer imports no app.',
            },
            deepLibraryImports,
          ],
        },
      ],
    },
  },
);
