/**
 * The test command: `npm test` runs every suite in order, keeps going after a failure so the
 * counts are complete, and ends with one plain line `N passed, N failed` (exit code 1 when
 * anything failed).
 *
 *   npx tsx test/run-all.ts                 all suites
 *   npx tsx test/run-all.ts api e2e         only these (lint, typecheck, calc, web, api, e2e)
 *
 * Lint and type-check count as one test each; vitest suites count their tests (read from
 * vitest's JSON report in test-output/). The API and browser suites get a PostgreSQL test
 * cluster from docker-free-scripts/postgres-start.sh --test (or GAPWISE_TEST_DATABASE_URL when
 * already set); a cluster started here is stopped at the end.
 */
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';

const root = fileURLToPath(new URL('..', import.meta.url));
const outputDir = join(root, 'test-output');
const minute = 60_000;

interface Outcome {
  readonly passed: number;
  readonly failed: number;
  /** Why the suite did not run (counts nothing). */
  readonly skipped?: string;
  readonly note?: string;
}

interface Step {
  readonly key: StepKey;
  readonly title: string;
  readonly run: () => Promise<Outcome>;
}

const stepKeys = ['lint', 'typecheck', 'calc', 'web', 'api', 'e2e'] as const;
type StepKey = (typeof stepKeys)[number];

// ---------------------------------------------------------------------------------------------
// Running commands

interface CommandResult {
  readonly code: number;
  readonly output: string;
  readonly timedOut: boolean;
}

let current: ReturnType<typeof spawn> | null = null;

/** Runs a command from the repo root, streaming its output and keeping a copy (last 2 MB). */
function runCommand(
  command: string,
  args: readonly string[],
  options: { env?: Record<string, string>; timeoutMs?: number; quiet?: boolean } = {},
): Promise<CommandResult> {
  if (!options.quiet) console.log(`$ ${[command, ...args].join(' ')}`);
  return new Promise((resolve) => {
    const child = spawn(command, args, {
      cwd: root,
      env: {
        ...process.env,
        ...(process.stdout.isTTY ? { FORCE_COLOR: '1' } : {}),
        NG_CLI_ANALYTICS: 'false',
        ...options.env,
      },
      stdio: ['ignore', 'pipe', 'pipe'],
      detached: true, // own process group, so a timeout or Ctrl-C can end the whole tree
    });
    current = child;
    let output = '';
    const keep = (chunk: Buffer, stream: NodeJS.WriteStream) => {
      if (!options.quiet) stream.write(chunk);
      output = (output + chunk.toString('utf8')).slice(-2_000_000);
    };
    child.stdout.on('data', (chunk: Buffer) => keep(chunk, process.stdout));
    child.stderr.on('data', (chunk: Buffer) => keep(chunk, process.stderr));
    let timedOut = false;
    const timer = setTimeout(
      () => {
        timedOut = true;
        console.error(
          `\n!! ${command} exceeded ${(options.timeoutMs ?? 0) / minute} min; stopping it`,
        );
        killTree(child.pid);
      },
      options.timeoutMs ?? 20 * minute,
    );
    child.on('error', (error) => {
      output += `\n${error.message}`;
    });
    child.on('close', (code, signal) => {
      clearTimeout(timer);
      current = null;
      resolve({ code: code ?? (signal ? 128 : 1), output, timedOut });
    });
  });
}

function killTree(pid: number | undefined): void {
  if (pid === undefined) return;
  try {
    process.kill(-pid, 'SIGTERM');
  } catch {
    // already gone
  }
}

function bin(name: string): string {
  const path = join(root, 'node_modules', '.bin', name);
  if (!existsSync(path)) throw new Error(`${path} is missing: run npm install first`);
  return path;
}

// ---------------------------------------------------------------------------------------------
// Counting

/** One check that passes or fails as a whole (lint, type-check). */
async function singleCheck(command: string, args: readonly string[]): Promise<Outcome> {
  const result = await runCommand(command, args, { timeoutMs: 15 * minute });
  return result.code === 0
    ? { passed: 1, failed: 0 }
    : { passed: 0, failed: 1, note: exitNote(result) };
}

function exitNote(result: CommandResult): string {
  return result.timedOut ? 'timed out' : `exit code ${result.code}`;
}

interface VitestJson {
  numTotalTests: number;
  numPassedTests: number;
  numFailedTests: number;
  numFailedTestSuites: number;
  numTotalTestSuites: number;
}

const ansi = new RegExp(String.raw`\u001b\[[0-9;]*m`, 'g');

/** Falls back to vitest's closing "Tests  3 passed | 1 failed (4)" line. */
function countsFromText(output: string): { passed: number; failed: number } | null {
  const lines = output.replace(ansi, '').split('\n');
  const line = lines.reverse().find((l) => /^\s*Tests\s+.*\(\d+\)\s*$/.test(l));
  if (!line) return null;
  const count = (word: string) => Number(new RegExp(`(\\d+) ${word}`).exec(line)?.[1] ?? 0);
  return { passed: count('passed'), failed: count('failed') };
}

/** Turns a vitest run into counts; a non-zero exit always counts at least one failure. */
function vitestOutcome(result: CommandResult, jsonFile: string): Outcome {
  let passed = 0;
  let failed = 0;
  let note: string | undefined;
  let counted = false;
  if (existsSync(jsonFile)) {
    try {
      const report = JSON.parse(readFileSync(jsonFile, 'utf8')) as VitestJson;
      passed = report.numPassedTests;
      failed = report.numFailedTests;
      counted = true;
      if (result.code !== 0 && failed === 0) {
        failed = Math.max(1, report.numFailedTestSuites);
        note = `${failed} test file(s) or run-level error(s) failed outside any test`;
      } else if (report.numTotalTests === 0) {
        failed = 1;
        note = 'no tests found';
      }
    } catch (error) {
      note = `unreadable report ${jsonFile}: ${(error as Error).message}`;
    }
  }
  if (!counted) {
    const fromText = countsFromText(result.output);
    if (fromText) {
      ({ passed, failed } = fromText);
      counted = true;
    }
    if (result.code !== 0 && failed === 0) {
      failed = 1;
      note ??= counted ? 'failed outside any test' : 'no test report';
    } else if (!counted) {
      failed = 1;
      note ??= 'no test report and no summary line';
    }
  }
  if (result.timedOut) note = `timed out${note ? `; ${note}` : ''}`;
  return { passed, failed, ...(note ? { note } : {}) };
}

async function vitest(
  name: string,
  args: readonly string[],
  env?: Record<string, string>,
  timeoutMs = 20 * minute,
) {
  const jsonFile = join(outputDir, `${name}.json`);
  rmSync(jsonFile, { force: true });
  const result = await runCommand(
    bin('vitest'),
    ['run', ...args, '--reporter=default', '--reporter=json', `--outputFile.json=${jsonFile}`],
    { env, timeoutMs },
  );
  return vitestOutcome(result, jsonFile);
}

// ---------------------------------------------------------------------------------------------
// Shared resources: the PostgreSQL test cluster

let testDatabase: Promise<{ url: string } | { error: string }> | null = null;
let stopTestClusterAtEnd = false;

function ensureTestDatabase() {
  testDatabase ??= (async () => {
    const preset = process.env['GAPWISE_TEST_DATABASE_URL'];
    if (preset) {
      console.log('Using GAPWISE_TEST_DATABASE_URL from the environment.');
      return { url: preset };
    }
    const result = await runCommand(
      'bash',
      [join(root, 'docker-free-scripts/postgres-start.sh'), '--test'],
      {
        timeoutMs: 15 * minute,
      },
    );
    const value = (key: string) => new RegExp(`^${key}=(.*)$`, 'm').exec(result.output)?.[1];
    const url = value('GAPWISE_TEST_DATABASE_URL');
    if (result.code !== 0 || !url) {
      return { error: `the PostgreSQL test cluster did not start (${exitNote(result)})` };
    }
    stopTestClusterAtEnd = value('GAPWISE_PG_STATUS') === 'started';
    return { url };
  })();
  return testDatabase;
}

/**
 * Stops the test cluster when this run started it and no one else (another test run in this
 * checkout) is connected to it at the moment.
 */
async function stopTestClusterIfIdle(): Promise<void> {
  if (!stopTestClusterAtEnd || !testDatabase) return;
  const database = await testDatabase;
  if ('error' in database) return;
  let others = 0;
  const client = new pg.Client({ connectionString: database.url });
  try {
    await client.connect();
    const { rows } = await client.query<{ n: number }>(
      `SELECT count(*)::int AS n FROM pg_stat_activity
        WHERE backend_type = 'client backend' AND pid <> pg_backend_pid()`,
    );
    others = rows[0]?.n ?? 0;
  } catch {
    // Not reachable: nothing to keep alive.
  } finally {
    await client.end().catch(() => undefined);
  }
  if (others > 0) {
    console.log(`\nLeaving the PostgreSQL test cluster running: ${others} other connection(s).`);
    return;
  }
  console.log('\nStopping the PostgreSQL test cluster started by this run.');
  await runCommand('bash', [join(root, 'docker-free-scripts/postgres-stop.sh'), '--test'], {
    quiet: true,
  });
}

// ---------------------------------------------------------------------------------------------
// The suites

const eslintConfigs = [
  'eslint.config.js',
  'eslint.config.mjs',
  'eslint.config.cjs',
  'eslint.config.ts',
];
const prettierConfigs = [
  '.prettierrc',
  '.prettierrc.json',
  '.prettierrc.yaml',
  '.prettierrc.yml',
  '.prettierrc.json5',
  '.prettierrc.js',
  '.prettierrc.mjs',
  '.prettierrc.cjs',
  '.prettierrc.toml',
  'prettier.config.js',
  'prettier.config.mjs',
  'prettier.config.cjs',
];

function missingConfig(names: readonly string[], what: string): Outcome | null {
  if (names.some((name) => existsSync(join(root, name)))) return null;
  console.error(`!! ${what} configuration is missing (expected one of: ${names.join(', ')}).`);
  console.error('!! The lint step cannot run without it, so it counts as failed.');
  return { passed: 0, failed: 1, note: `no ${what} configuration` };
}

const e2eConfig = 'test/e2e/vitest.e2e.config.ts';

const steps: Step[] = [
  {
    key: 'lint',
    title: 'lint: ESLint',
    run: async () => missingConfig(eslintConfigs, 'ESLint') ?? singleCheck(bin('eslint'), ['.']),
  },
  {
    key: 'lint',
    title: 'lint: Prettier',
    run: async () =>
      missingConfig(prettierConfigs, 'Prettier') ?? singleCheck(bin('prettier'), ['--check', '.']),
  },
  {
    key: 'typecheck',
    title: 'type-check',
    run: () => singleCheck(bin('tsc'), ['-p', 'tsconfig.json', '--noEmit']),
  },
  {
    key: 'calc',
    title: 'unit: libs/calc and the CLI (vitest project calc)',
    run: () => vitest('calc', ['--project', 'calc']),
  },
  {
    key: 'web',
    title: 'web components (ng test)',
    run: async () => {
      if (!existsSync(join(root, 'angular.json')))
        return { passed: 0, failed: 0, skipped: 'no angular.json yet' };
      const jsonFile = join(outputDir, 'web.json');
      rmSync(jsonFile, { force: true });
      const result = await runCommand(
        bin('ng'),
        [
          'test',
          '--watch=false',
          '--reporters=json',
          '--reporters=default',
          `--output-file=${jsonFile}`,
        ],
        { timeoutMs: 20 * minute },
      );
      return vitestOutcome(result, jsonFile);
    },
  },
  {
    key: 'api',
    title: 'API and services against PostgreSQL (vitest project api)',
    run: async () => {
      const database = await ensureTestDatabase();
      if ('error' in database) return { passed: 0, failed: 1, note: database.error };
      return vitest('api', ['--project', 'api'], { GAPWISE_TEST_DATABASE_URL: database.url });
    },
  },
  {
    key: 'e2e',
    title: 'end to end in headless chromium',
    run: async () => {
      if (!existsSync(join(root, e2eConfig)))
        return { passed: 0, failed: 0, skipped: `no ${e2eConfig} yet` };
      const chromium = await runCommand(
        'bash',
        [join(root, 'docker-free-scripts/chromium-ensure.sh')],
        {
          timeoutMs: 15 * minute,
        },
      );
      const chromeBin = chromium.output.trim().split('\n').at(-1)?.trim() ?? '';
      if (chromium.code !== 0 || !chromeBin.startsWith('/')) {
        return { passed: 0, failed: 1, note: 'chromium is not available' };
      }
      const database = await ensureTestDatabase();
      if ('error' in database) return { passed: 0, failed: 1, note: database.error };
      return vitest(
        'e2e',
        ['--config', e2eConfig],
        { GAPWISE_TEST_DATABASE_URL: database.url, CHROME_BIN: chromeBin },
        30 * minute,
      );
    },
  },
];

// ---------------------------------------------------------------------------------------------
// Main

function seconds(ms: number): string {
  return `${(ms / 1000).toFixed(1)} s`;
}

function describeOutcome(outcome: Outcome): string {
  if (outcome.skipped) return `skipped (${outcome.skipped})`;
  return `${outcome.passed} passed, ${outcome.failed} failed${outcome.note ? ` (${outcome.note})` : ''}`;
}

async function main(): Promise<number> {
  const wanted = process.argv.slice(2);
  const unknown = wanted.filter((key) => !(stepKeys as readonly string[]).includes(key));
  if (unknown.length > 0) {
    console.error(`Unknown suite(s): ${unknown.join(', ')}. Known: ${stepKeys.join(', ')}.`);
    return 2;
  }
  const selected = steps.filter((step) => wanted.length === 0 || wanted.includes(step.key));
  mkdirSync(outputDir, { recursive: true });

  const results: { step: Step; outcome: Outcome; ms: number }[] = [];
  const started = Date.now();
  for (const [index, step] of selected.entries()) {
    const heading = `[${index + 1}/${selected.length}] ${step.title}`;
    console.log(`\n━━ ${heading} ${'━'.repeat(Math.max(3, 96 - heading.length))}`);
    const t0 = Date.now();
    let outcome: Outcome;
    try {
      outcome = await step.run();
    } catch (error) {
      console.error(error);
      outcome = { passed: 0, failed: 1, note: (error as Error).message };
    }
    const ms = Date.now() - t0;
    results.push({ step, outcome, ms });
    const mark = outcome.skipped ? '○' : outcome.failed > 0 ? '✗' : '✓';
    console.log(`── ${mark} ${step.title}: ${describeOutcome(outcome)} in ${seconds(ms)}`);
  }

  await stopTestClusterIfIdle();

  const passed = results.reduce((sum, r) => sum + r.outcome.passed, 0);
  const failed = results.reduce((sum, r) => sum + r.outcome.failed, 0);
  const width = Math.max(...results.map((r) => r.step.title.length));
  console.log(`\n━━ Summary (${seconds(Date.now() - started)}) ${'━'.repeat(70)}`);
  for (const { step, outcome, ms } of results) {
    const mark = outcome.skipped ? '○' : outcome.failed > 0 ? '✗' : '✓';
    console.log(
      `${mark} ${step.title.padEnd(width)}  ${seconds(ms).padStart(8)}  ${describeOutcome(outcome)}`,
    );
  }
  console.log('');
  console.log(`${passed} passed, ${failed} failed`);
  return failed > 0 ? 1 : 0;
}

const interrupt = (signal: NodeJS.Signals) => {
  console.error(`\nInterrupted (${signal}).`);
  killTree(current?.pid);
  // Give the killed suite a moment to close its connections, then stop the cluster if idle.
  const stop = new Promise((resolve) => setTimeout(resolve, 1_000)).then(stopTestClusterIfIdle);
  void stop.finally(() => process.exit(130));
};
process.once('SIGINT', interrupt);
process.once('SIGTERM', interrupt);

process.exitCode = await main();
