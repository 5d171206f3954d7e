/**
 * Demo electrode case (invented numbers) for the lab: a ferrocene-terminated monolayer on gold
 * with rate constants k(η) that bend away from Butler–Volmer at large overpotential, so the fit
 * on the page prefers Marcus–Hush–Chidsey (the points fit λ ≈ 0.57 eV, k⁰ ≈ 1.2 s⁻¹, with an
 * invented scatter of a few hundredths in log10 k). The case as typed carries an earlier
 * (invented) estimate, λ = 0.7 eV and k⁰ = 3 s⁻¹, so fitting and applying visibly moves it.
 * Idempotent (matched by name in the workspace); written through the electrode-case use-case.
 */
import { ElectrodeCaseEntity, UserEntity, WorkspaceEntity } from '@gapwise/db';
import type { DataSource } from 'typeorm';
import { createElectrodeCase } from './electrode-use-case';

export const DEMO_ELECTRODE_NAME = 'Ferrocenyl monolayer on gold (demo)';

/** Invented (η / V, log10 k / s⁻¹) points; reduction at η ≤ 0, oxidation above. */
export const DEMO_ELECTRODE_POINTS: readonly [number, number][] = [
  [-0.6, 3.05],
  [-0.5, 2.77],
  [-0.4, 2.4],
  [-0.3, 1.98],
  [-0.2, 1.48],
  [-0.1, 0.97],
  [0.1, 0.95],
  [0.2, 1.5],
  [0.3, 1.96],
  [0.4, 2.42],
  [0.5, 2.74],
  [0.6, 3.08],
];

/** Adds the demo electrode case to the lab when missing; answers how many it added. */
export async function seedDemoElectrodeCases(
  db: DataSource,
  options: { labName: string; editorEmail: string },
): Promise<number> {
  const workspace = await db.getRepository(WorkspaceEntity).findOne({
    where: { name: options.labName },
    order: { createdAt: 'ASC' },
  });
  const editor = await db.getRepository(UserEntity).findOneBy({ email: options.editorEmail });
  if (!workspace || !editor) return 0;
  const exists = await db
    .getRepository(ElectrodeCaseEntity)
    .existsBy({ workspaceId: workspace.id, name: DEMO_ELECTRODE_NAME });
  if (exists) return 0;
  await createElectrodeCase(db, editor.id, workspace.id, {
    name: DEMO_ELECTRODE_NAME,
    redoxCouple: 'Fc⁺/Fc (ferrocenyl alkanethiol)',
    electrode: 'Au, mixed C11/C10 thiol monolayer',
    lambdaEv: 0.7,
    temperatureK: 298.15,
    rateSource: 'k0',
    k0: 3,
    rateUnit: 's-1',
    provenance: 'Demo values (invented).',
    points: DEMO_ELECTRODE_POINTS.map(([overpotentialV, log10k]) => ({
      overpotentialV,
      k: Number((10 ** log10k).toPrecision(3)),
      direction: overpotentialV <= 0 ? 'reduction' : 'oxidation',
    })),
    dataNote:
      'Invented demo points: k in s⁻¹ as a surface-confined couple gives it (k = i/(F·Γ·A) at the ' +
      'start of a potential step).',
    notes: 'Compare MHC and Butler–Volmer: the rates bend over at large |η|.',
  });
  return 1;
}
