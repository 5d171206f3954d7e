#!/usr/bin/env node
// Runs a TypeScript entry (the API server, the standalone worker, the `gapwise` command) from
// one JavaScript bundle of its sources, built by esbuild on first use and rebuilt whenever a
// file that went into it (per esbuild's metafile), tsconfig.json or package-lock.json is newer
// than the bundle. Compared with compiling each source file on load, a bundle starts in a
// fraction of the time and the server idles about 50 MB lighter — figures in the README.
//
//   node docker-free-scripts/run-bundled.mjs apps/api/src/main.ts [args…]
//
// Bundles live in .cache/bundles/ (three levels below the repository root, and inside it, so
// packages resolve from the root node_modules). Nothing is published from there.
import { mkdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { basename, dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const repoRoot = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const bundleDir = join(repoRoot, '.cache', 'bundles');

function mtimeMs(path) {
  try {
    return statSync(path).mtimeMs;
  } catch {
    return Number.POSITIVE_INFINITY; // a missing input (deleted or moved) means: rebuild
  }
}

function isFresh(bundlePath, inputsPath) {
  let builtAt;
  let inputs;
  try {
    builtAt = statSync(bundlePath).mtimeMs;
    inputs = JSON.parse(readFileSync(inputsPath, 'utf8'));
  } catch {
    return false;
  }
  const watched = [...inputs, 'tsconfig.json', 'package-lock.json'];
  return watched.every((input) => mtimeMs(join(repoRoot, input)) <= builtAt);
}

async function build(entryPath, bundlePath, inputsPath, { bundlePackages }) {
  const esbuild = await import('esbuild');
  // Written into a folder of this process and renamed into place (map first), so two processes
  // starting at once never load a half-written bundle.
  const scratch = join(bundleDir, `.building-${process.pid}`);
  mkdirSync(scratch, { recursive: true });
  const temporary = join(scratch, basename(bundlePath));
  const result = await esbuild.build({
    absWorkingDir: repoRoot,
    entryPoints: [entryPath],
    outfile: temporary,
    bundle: true,
    // Packages stay in node_modules unless asked for: the server's packages load as published.
    packages: bundlePackages ? undefined : 'external',
    platform: 'node',
    format: 'esm',
    target: 'node20',
    tsconfig: join(repoRoot, 'tsconfig.json'),
    // A map file beside the bundle; `NODE_OPTIONS=--enable-source-maps` makes stack traces name
    // the TypeScript files. Off by default: with maps on, a trace upload took a quarter more CPU
    // in one run (most likely from stack traces of errors made inside the S3 client).
    sourcemap: 'linked',
    sourcesContent: false,
    metafile: true,
    logLevel: 'error',
    // CommonJS code inside an ES module bundle still calls require() for Node built-ins.
    banner: {
      js: "import { createRequire as __gapwiseCreateRequire } from 'node:module'; const require = __gapwiseCreateRequire(import.meta.url);",
    },
  });
  writeFileSync(inputsPath, JSON.stringify(Object.keys(result.metafile.inputs)));
  renameSync(`${temporary}.map`, `${bundlePath}.map`);
  renameSync(temporary, bundlePath);
  rmSync(scratch, { recursive: true, force: true });
}

/**
 * Imports the bundle of `entry` (a path relative to the repository root), building it first when
 * missing or stale. `bundlePackages` also inlines packages (fastest start for a short command).
 */
export async function importBundled(entry, { bundlePackages = false } = {}) {
  return import(pathToFileURL(await bundledPath(entry, { bundlePackages })).href);
}

/**
 * The path of the fresh bundle of `entry`, built first when missing or stale. The server asks
 * for the bundle of its compute-pool worker (apps/api/src/compute/compute-worker.ts) this way.
 */
export async function bundledPath(entry, { bundlePackages = false } = {}) {
  const entryPath = resolve(repoRoot, entry);
  const name = relative(repoRoot, entryPath)
    .replace(/\.[cm]?tsx?$/, '')
    .replace(/[\\/]/g, '-');
  const bundlePath = join(bundleDir, `${name}${bundlePackages ? '.standalone' : ''}.mjs`);
  const inputsPath = `${bundlePath}.inputs.json`;
  if (!isFresh(bundlePath, inputsPath)) {
    try {
      await build(entryPath, bundlePath, inputsPath, { bundlePackages });
    } catch (error) {
      const reason = error instanceof Error ? error.message : String(error);
      process.stderr.write(`${basename(entry)}: could not build from its sources: ${reason}\n`);
      process.exit(70);
    }
  }
  return bundlePath;
}

// Used as a command: run the entry with the remaining arguments.
if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const [entry, ...rest] = process.argv.slice(2);
  if (!entry) {
    process.stderr.write('Usage: node docker-free-scripts/run-bundled.mjs <entry.ts> [args…]\n');
    process.exit(1);
  }
  process.argv = [process.argv[0], resolve(repoRoot, entry), ...rest];
  await importBundled(entry);
}
