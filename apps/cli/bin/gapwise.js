#!/usr/bin/env node
// Runs the TypeScript entry through tsx so the command and the server share one source tree.
import { register } from 'tsx/esm/api';
import { fileURLToPath } from 'node:url';
import { dirname, join } from 'node:path';

const here = dirname(fileURLToPath(import.meta.url));
register({ tsconfig: join(here, '..', '..', '..', 'tsconfig.json') });
await import('../src/main.ts');
