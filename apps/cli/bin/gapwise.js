#!/usr/bin/env node
// The `gapwise` command runs from one JavaScript bundle of its TypeScript sources and their
// packages, built on first use and rebuilt when a source changes (docker-free-scripts/run-bundled.mjs):
// loading one prebuilt file starts in about a third of the time that compiling the sources on
// load takes, which matters for `gapwise calc` called many times from scripts.
import { importBundled } from '../../../docker-free-scripts/run-bundled.mjs';

await importBundled('apps/cli/src/main.ts', { bundlePackages: true });
