/**
 * Writes the demo mediator screen of this folder (committed; rerun to regenerate it byte for
 * byte): 200 invented "Med-n" donor–acceptor pairs of a photo-charged flow-cell mediator study,
 * from a seeded linear congruential generator. Values are made up but plausible: potentials vs
 * Fc⁺/Fc, E₀₀ 2.2–2.7 eV, R from contact to 4 Å beyond, λ_inner in kcal/mol, half the rows with a coupling, the
 * others with a distance decay, a third with a quantum mode.
 *
 *   npx tsx db/seed/screens/generate.ts
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';

export const DEMO_SCREEN_FILE = 'demo-mediator-screen.csv';
export const DEMO_SCREEN_ROWS = 200;

const HEADER =
  'donor,acceptor,donorOxidation [V],acceptorReduction [V],excitationEnergy [eV],distance [A],' +
  'radiusDonor [A],radiusAcceptor [A],solvent,lambdaInner [kcal/mol],coupling [cm-1],' +
  'coupling0 [cm-1],distance0 [A],beta [A-1],hbarOmega [eV],temperature [K]';

const SOLVENTS = ['acetonitrile', 'acetonitrile', 'propylene carbonate', 'DMF'];

/** The CSV text (same seed, same bytes). */
export function demoScreenCsv(rows = DEMO_SCREEN_ROWS, seed = 20261): string {
  let state = seed >>> 0;
  const rand = () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
  const lines = [HEADER];
  for (let i = 0; i < rows; i++) {
    const donor = `Med-${1 + Math.floor(rand() * 60)}`;
    const acceptor = `Med-${61 + Math.floor(rand() * 60)}`;
    const eox = (0.25 + 0.9 * rand()).toFixed(3);
    const ered = (-1.85 + 0.9 * rand()).toFixed(3);
    const e00 = (2.2 + 0.5 * rand()).toFixed(2);
    const ra = 3.2 + 1.2 * rand();
    const rb = 3.2 + 1.2 * rand();
    // Centre-to-centre distance from contact (a_D + a_A) to 4 Å beyond it.
    const r = (ra + rb + 0.1 + 4 * rand()).toFixed(2);
    const solvent = SOLVENTS[Math.floor(rand() * SOLVENTS.length)];
    const li = (2.5 + 4.5 * rand()).toFixed(2);
    const direct = i % 2 === 0;
    const h = direct ? (15 + 180 * rand()).toFixed(1) : '';
    const h0 = direct ? '' : (600 + 400 * rand()).toFixed(0);
    const r0 = direct ? '' : '3.5';
    const beta = direct ? '' : (0.9 + 0.4 * rand()).toFixed(2);
    const mode = i % 3 === 0 ? (0.15 + 0.05 * rand()).toFixed(3) : '';
    lines.push(
      [
        donor,
        acceptor,
        eox,
        ered,
        e00,
        r,
        ra.toFixed(2),
        rb.toFixed(2),
        solvent,
        li,
        h,
        h0,
        r0,
        beta,
        mode,
        '298.15',
      ].join(','),
    );
  }
  return `${lines.join('\n')}\n`;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const here = fileURLToPath(new URL('.', import.meta.url));
  writeFileSync(join(here, DEMO_SCREEN_FILE), demoScreenCsv());
  console.log(`wrote ${DEMO_SCREEN_FILE} (${DEMO_SCREEN_ROWS} rows)`);
}
