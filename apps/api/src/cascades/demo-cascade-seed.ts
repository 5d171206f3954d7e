/**
 * Demo cascades (invented) for the photoredox lab: one sensitiser (S) with singlet and triplet
 * channels, an acceptor (A), and the same pair with a bridge (B) between them. Story: the direct
 * S → A step is long-range (|H_AB| 2 cm⁻¹) and loses a third of the singlets to fluorescence and
 * intersystem crossing; with the bridge, S⁺B⁻A forms in ~10 ps and relays to S⁺BA⁻, so the same
 * microsecond charge separation forms with yield ≈ 1.0 instead of ≈ 0.67. Recombination goes to
 * the ground state and to the triplet (inverted region, weak coupling). Idempotent (matched by
 * name in the workspace); written through the cascade use-case, computed in this process.
 */
import { CascadeEntity, UserEntity, WorkspaceEntity } from '@gapwise/db';
import type { DataSource } from 'typeorm';
import { inlineCompute } from '../compute/compute-tasks';
import { createCascade } from './cascade-use-case';

export const DEMO_TRIAD_NAME = 'Sensitiser–bridge–acceptor triad (demo)';
export const DEMO_DYAD_NAME = 'Sensitiser–acceptor dyad without bridge (demo)';

const sensitiserStates = [
  { id: 'S0', label: 'Ground state S–B–A', energy: 0, kind: 'ground' },
  { id: 'S1', label: 'Singlet ¹S*', energy: { value: 590, unit: 'nm' }, kind: 'excited' },
  { id: 'T1', label: 'Triplet ³S*', energy: 1.3, kind: 'excited' },
];
const sensitiserDecays = [
  { from: 'S1', to: 'S0', lifetime: { value: 3000, unit: 'ps' } },
  { from: 'S1', to: 'T1', k: 1e8 },
  { from: 'T1', to: 'S0', k: 5e4 },
];

/** The triad: S1 → S⁺B⁻A → S⁺BA⁻, recombination from both charge-separated states. */
export const DEMO_TRIAD_NETWORK = {
  states: [
    ...sensitiserStates,
    { id: 'CS1', label: 'S⁺–B⁻–A', energy: 1.8, kind: 'chargeSeparated' },
    { id: 'CS2', label: 'S⁺–B–A⁻', energy: 1.45, kind: 'chargeSeparated' },
  ],
  links: [
    ...sensitiserDecays,
    { from: 'S1', to: 'CS1', lambda: 0.55, coupling: { value: 30, unit: 'cm-1' } },
    { from: 'CS1', to: 'CS2', lambda: 0.6, coupling: { value: 25, unit: 'cm-1' } },
    { from: 'CS1', to: 'S0', lambda: 0.7, coupling: { value: 25, unit: 'cm-1' } },
    { from: 'CS2', to: 'S0', lambda: 0.8, coupling: { value: 0.4, unit: 'cm-1' } },
    { from: 'CS2', to: 'T1', lambda: 0.8, coupling: { value: 0.15, unit: 'cm-1' } },
  ],
  temperature: 298.15,
};

/** The same sensitiser and acceptor without the bridge: one long-range step. */
export const DEMO_DYAD_NETWORK = {
  states: [
    ...sensitiserStates,
    { id: 'CS', label: 'S⁺–A⁻', energy: 1.45, kind: 'chargeSeparated' },
  ],
  links: [
    ...sensitiserDecays,
    { from: 'S1', to: 'CS', lambda: 0.8, coupling: { value: 2, unit: 'cm-1' } },
    { from: 'CS', to: 'S0', lambda: 0.8, coupling: { value: 0.4, unit: 'cm-1' } },
    { from: 'CS', to: 'T1', lambda: 0.8, coupling: { value: 0.15, unit: 'cm-1' } },
  ],
  temperature: 298.15,
};

/** Adds the two demo cascades to the lab when missing; answers how many it added. */
export async function seedDemoCascades(
  db: DataSource,
  options: { labName: string; editorEmail: string },
): Promise<number> {
  const workspace = await db.getRepository(WorkspaceEntity).findOne({
    where: { name: options.labName },
    order: { createdAt: 'ASC' },
  });
  const editor = await db.getRepository(UserEntity).findOneBy({ email: options.editorEmail });
  if (!workspace || !editor) return 0;
  let added = 0;
  for (const [name, network, notes] of [
    [
      DEMO_DYAD_NAME,
      DEMO_DYAD_NETWORK,
      'Direct long-range charge separation: competes with fluorescence and ISC.',
    ],
    [
      DEMO_TRIAD_NAME,
      DEMO_TRIAD_NETWORK,
      'The bridge relays the electron in two short steps: compare the long-lived yield with the dyad.',
    ],
  ] as const) {
    const exists = await db.getRepository(CascadeEntity).existsBy({
      workspaceId: workspace.id,
      name,
    });
    if (exists) continue;
    await createCascade(db, inlineCompute, editor.id, workspace.id, {
      name,
      notes,
      network: JSON.parse(JSON.stringify(network)) as Record<string, unknown>,
    });
    added++;
  }
  return added;
}
