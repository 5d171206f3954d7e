/**
 * The bundle launcher, run for real on a small TypeScript entry of its own (in a scratch folder
 * inside the repository, so tsconfig.json and node_modules apply as for the real entries): it
 * builds on first use, reuses the bundle while nothing changed, rebuilds when an imported file
 * is newer, passes arguments through, and reports a syntax error with exit code 70.
 */
import { execFile } from 'node:child_process';
import { mkdirSync, rmSync, statSync, utimesSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';

const root = fileURLToPath(new URL('..', import.meta.url));
const launcher = join(root, 'docker-free-scripts', 'run-bundled.mjs');
const scratchName = `run-bundled-spec-${process.pid}`;
const scratch = join(root, '.cache', scratchName);
const entry = `.cache/${scratchName}/entry.ts`;
const bundle = join(root, '.cache', 'bundles', `.cache-${scratchName}-entry.mjs`);

function run(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    execFile(
      process.execPath,
      [launcher, ...args],
      { cwd: root, timeout: 60_000 },
      (error, stdout, stderr) =>
        resolve({ code: error ? Number(error.code ?? 1) : 0, stdout, stderr }),
    );
  });
}

function writeSources(energyEv: string): void {
  mkdirSync(scratch, { recursive: true });
  writeFileSync(join(scratch, 'energy.ts'), `export const lambdaEv: number = ${energyEv};\n`);
  writeFileSync(
    join(scratch, 'entry.ts'),
    [
      "import { lambdaEv } from './energy';",
      "import { BOLTZMANN_EV_PER_K } from '@gapwise/calc';",
      'const args: string[] = process.argv.slice(2);',
      'console.log(JSON.stringify({ lambdaEv, args, boltzmann: BOLTZMANN_EV_PER_K > 0 }));',
      '',
    ].join('\n'),
  );
}

afterAll(() => {
  rmSync(scratch, { recursive: true, force: true });
  for (const suffix of ['', '.map', '.inputs.json']) rmSync(bundle + suffix, { force: true });
});

describe('run-bundled.mjs', () => {
  it('builds on first use, reuses the bundle, and rebuilds when an imported file changes', async () => {
    writeSources('0.8');
    const first = await run([entry, '--temperature', '298.15']);
    expect(first.stderr).toBe('');
    expect(JSON.parse(first.stdout)).toEqual({
      lambdaEv: 0.8,
      args: ['--temperature', '298.15'],
      boltzmann: true,
    });
    const builtAt = statSync(bundle).mtimeMs;

    const again = await run([entry]);
    expect(JSON.parse(again.stdout).lambdaEv).toBe(0.8);
    expect(statSync(bundle).mtimeMs).toBe(builtAt);

    writeSources('1.1');
    // A second later than the bundle, whatever the file system's timestamp resolution.
    const later = new Date(builtAt + 1000);
    utimesSync(join(scratch, 'energy.ts'), later, later);
    const changed = await run([entry]);
    expect(JSON.parse(changed.stdout).lambdaEv).toBe(1.1);
    expect(statSync(bundle).mtimeMs).toBeGreaterThan(builtAt);
  });

  it('reports a source that does not compile, with exit code 70', async () => {
    writeSources('0.8 +');
    const later = new Date(Date.now() + 2000);
    utimesSync(join(scratch, 'energy.ts'), later, later);
    const broken = await run([entry]);
    expect(broken.code).toBe(70);
    expect(broken.stderr).toMatch(/entry\.ts: could not build from its sources: .*energy\.ts/s);
  });
});
