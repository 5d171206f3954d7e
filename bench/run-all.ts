/**
 * `npm run bench`: starts the test PostgreSQL cluster, then runs every `*.bench.ts` under
 * apps/ and libs/ one after another with tsx, printing their figures.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

function find(dir: string, out: string[] = []): string[] {
  for (const name of readdirSync(dir)) {
    if (name === 'node_modules' || name.startsWith('.')) continue;
    const path = join(dir, name);
    if (statSync(path).isDirectory()) find(path, out);
    else if (name.endsWith('.bench.ts')) out.push(path);
  }
  return out;
}

const env = { ...process.env };
if (!env['GAPWISE_TEST_DATABASE_URL']) {
  const out = execFileSync('bash', ['docker-free-scripts/postgres-start.sh', '--test'], {
    encoding: 'utf8',
  });
  const line = out.split('\n').find((l) => l.startsWith('GAPWISE_TEST_DATABASE_URL='));
  if (line) env['GAPWISE_TEST_DATABASE_URL'] = line.slice('GAPWISE_TEST_DATABASE_URL='.length);
}
const files = [...find('apps'), ...find('libs')].sort();
let failed = 0;
for (const file of files) {
  console.log(`\n# ${file}`);
  const r = spawnSync(process.execPath, ['--import', 'tsx', file, ...process.argv.slice(2)], {
    stdio: 'inherit',
    env,
  });
  if (r.status !== 0) failed++;
}
console.log(`\n${files.length - failed} bench file(s) ran, ${failed} failed`);
process.exit(failed ? 1 : 0);
