/**
 * A demo material case (invented numbers) for the materials group: a herringbone-like organic
 * crystal layer with three neighbour types in the plane (one π-stack partner pair with the larger
 * transfer integral, two diagonal pairs), λ = 0.18 ± 0.02 eV at 300 K. Every number here is
 * invented for the demonstration and describes no real compound. Idempotent (matched by name);
 * written through the material use-case, computed in this process.
 */
import { MaterialEntity, UserEntity, WorkspaceEntity } from '@gapwise/db';
import type { DataSource } from 'typeorm';
import { inlineCompute } from '../compute/compute-tasks';
import { createMaterial } from './material-use-case';

export const DEMO_MATERIAL_NAME = 'Herringbone layer, invented acene (demo)';

export const DEMO_MATERIAL = {
  name: DEMO_MATERIAL_NAME,
  notes:
    'Invented numbers for the demonstration. The π-stack direction a carries most of the mobility; ' +
    'the diagonal pairs are weaker. J of the stack is close to k_BT: see the validity column.',
  lambdaEv: 0.18,
  lambdaSigmaEv: 0.02,
  temperatureK: 300,
  dimensions: 2 as const,
  neighbours: [
    { label: 'a', vectorAngstrom: [6.0, 0, 0], couplingEv: 0.02, couplingSigmaEv: 0.004 },
    { label: '−a', vectorAngstrom: [-6.0, 0, 0], couplingEv: 0.02, couplingSigmaEv: 0.004 },
    { label: '(a+b)/2', vectorAngstrom: [3.0, 3.9, 0], couplingEv: 0.008, couplingSigmaEv: 0.002 },
    {
      label: '−(a+b)/2',
      vectorAngstrom: [-3.0, -3.9, 0],
      couplingEv: 0.008,
      couplingSigmaEv: 0.002,
    },
    { label: '(a−b)/2', vectorAngstrom: [3.0, -3.9, 0], couplingEv: 0.006, couplingSigmaEv: 0.002 },
    {
      label: '−(a−b)/2',
      vectorAngstrom: [-3.0, 3.9, 0],
      couplingEv: 0.006,
      couplingSigmaEv: 0.002,
    },
  ],
};

/** Adds the demo material case to the lab when missing; answers how many it added. */
export async function seedDemoMaterials(
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
    .getRepository(MaterialEntity)
    .existsBy({ workspaceId: workspace.id, name: DEMO_MATERIAL_NAME });
  if (exists) return 0;
  await createMaterial(
    db,
    inlineCompute,
    editor.id,
    workspace.id,
    JSON.parse(JSON.stringify(DEMO_MATERIAL)),
  );
  return 1;
}
