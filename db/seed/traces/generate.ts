/**
 * Writes the two small demo trace files of this folder (committed; rerun to regenerate them
 * byte for byte): energy-gap samples of an invented dyad from a seeded AR(1) generator with
 * known parameters λ = 0.62 eV, ΔG° = −0.35 eV at 300 K (σ² = 2λk_BT), written in kcal/mol
 * with a frame column, a header and comment lines.
 *
 *   npx tsx db/seed/traces/generate.ts
 */
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';
import { marcusGapMoments, writeSyntheticTrace } from '@gapwise/traces';

export const DEMO_TRACE = {
  lambdaEv: 0.62,
  deltaG0Ev: -0.35,
  temperatureK: 300,
  samples: 6000,
  phi: 0.8,
} as const;
/** 1 eV in kcal/mol (CODATA 2018: e·N_A/4184). */
const KCAL_PER_EV = (1.602176634e-19 * 6.02214076e23) / 4184;

const here = fileURLToPath(new URL('.', import.meta.url));
const m = marcusGapMoments(DEMO_TRACE.lambdaEv, DEMO_TRACE.deltaG0Ev, DEMO_TRACE.temperatureK);
for (const [state, mean] of [
  ['reactant', m.reactantMeanEv],
  ['product', m.productMeanEv],
] as const) {
  await writeSyntheticTrace(
    join(here, `demo-dyad-${state}.csv`),
    {
      count: DEMO_TRACE.samples,
      meanEv: mean,
      sdEv: m.sdEv,
      phi: DEMO_TRACE.phi,
      seed: `demo-dyad-${state}`,
    },
    {
      header: `# Demo energy-gap samples, ${state} state (synthetic, seeded; dE = E_P - E_R in kcal/mol)\nframe,dE_kcal`,
      frameColumn: true,
      evPerUnit: 1 / KCAL_PER_EV,
      digits: 4,
    },
  );
}
