/**
 * Material-case use-cases (charge transport, issue 18): create, list, read, update (optimistic
 * version), delete, versions and compute. Every save computes the case in the compute pool first
 * (a refused case is a 400 naming the field by its label, nothing saved), then writes the
 * material, an immutable version row and an audit event in one transaction.
 */
import { canEdit, type MaterialInput, type MaterialResults } from '@gapwise/contracts';
import type { DataSource, EntityManager } from 'typeorm';
import { MaterialEntity, MaterialVersionEntity } from '@gapwise/db';
import { recordAudit } from '../audit/audit-repository';
import type { ComputeRunner } from '../compute/compute-tasks';
import { AppError, notFound, validationFailed } from '../http/app-error';
import { isUuid } from '../http/validate';
import { requireRole } from '../workspaces/workspace-access';
import type { MaterialInputDto, MaterialUpdateDto } from './material-dto';

/** A material case as the API answers it. */
export interface Material extends MaterialInput {
  readonly id: string;
  readonly workspaceId: string;
  readonly notes: string;
  readonly results: MaterialResults | null;
  readonly mobility: number | null;
  readonly version: number;
  readonly createdAt: string;
  readonly updatedAt: string;
}

export type MaterialListItem = Omit<Material, 'neighbours' | 'results'> & {
  readonly neighbourCount: number;
};

const ADVICE = 'Give fewer neighbours or drop the σ (Monte Carlo) and try again.';

function inputOf(row: MaterialEntity): MaterialInput {
  return {
    name: row.name,
    notes: row.notes,
    lambdaEv: row.lambdaEv,
    lambdaSigmaEv: row.lambdaSigmaEv,
    temperatureK: row.temperatureK,
    dimensions: row.dimensions as 1 | 2 | 3,
    neighbours: row.neighbours as unknown as MaterialInput['neighbours'],
  };
}

function toMaterial(row: MaterialEntity): Material {
  return {
    id: row.id,
    workspaceId: row.workspaceId,
    ...inputOf(row),
    notes: row.notes,
    results: (row.results as unknown as MaterialResults | null) ?? null,
    mobility: row.mobilityCm2PerVs,
    version: row.version,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

function listItem(row: MaterialEntity): MaterialListItem {
  const { neighbours, results: _r, ...item } = toMaterial(row);
  return { ...item, neighbourCount: neighbours.length };
}

/** Plain copy of the DTO (class instances do not cross the worker boundary as such). */
function plainInput(dto: MaterialInputDto): MaterialInput {
  return {
    name: dto.name.trim(),
    notes: dto.notes ?? '',
    lambdaEv: dto.lambdaEv,
    lambdaSigmaEv: dto.lambdaSigmaEv ?? null,
    temperatureK: dto.temperatureK,
    dimensions: dto.dimensions,
    neighbours: dto.neighbours.map((n) => ({
      label: n.label,
      distanceAngstrom: n.distanceAngstrom ?? null,
      vectorAngstrom: n.vectorAngstrom ? [...n.vectorAngstrom] : null,
      couplingEv: n.couplingEv,
      couplingSigmaEv: n.couplingSigmaEv ?? null,
      deltaG0Ev: n.deltaG0Ev ?? null,
    })),
  };
}

/** The case computed in the pool; a refusal becomes a 400 naming the field by its label. */
export async function computeMaterial(
  compute: ComputeRunner,
  input: MaterialInput,
): Promise<MaterialResults> {
  const answer = await compute.run('materialResults', [input], {
    budget: 'interactive',
    advice: ADVICE,
  });
  if (!answer.ok) throw validationFailed(answer.errors);
  return answer.results;
}

/** The material's row after checking the caller's role (404 for non-members). */
export async function materialForCaller(
  db: EntityManager,
  id: string,
  userId: string,
  allowed: Parameters<typeof requireRole>[3] = () => true,
): Promise<MaterialEntity> {
  const row = isUuid(id) ? await db.getRepository(MaterialEntity).findOneBy({ id }) : null;
  if (!row) throw notFound('material');
  await requireRole(db, row.workspaceId, userId, allowed, 'material');
  return row;
}

async function writeVersion(
  tx: EntityManager,
  row: MaterialEntity,
  userId: string,
  summary: string,
): Promise<void> {
  await tx.getRepository(MaterialVersionEntity).insert({
    materialId: row.id,
    version: row.version,
    snapshot: {
      name: row.name,
      notes: row.notes,
      lambdaEv: row.lambdaEv,
      // jsonb: a missing σ is stored as an absent key.
      ...(row.lambdaSigmaEv !== null ? { lambdaSigmaEv: row.lambdaSigmaEv } : {}),
      temperatureK: row.temperatureK,
      dimensions: row.dimensions,
      neighbours: row.neighbours,
    },
    summary,
    createdBy: userId,
  });
}

function columns(input: MaterialInput, results: MaterialResults) {
  return {
    name: input.name,
    notes: input.notes ?? '',
    lambdaEv: input.lambdaEv,
    lambdaSigmaEv: input.lambdaSigmaEv ?? null,
    temperatureK: input.temperatureK,
    dimensions: input.dimensions,
    neighbours: input.neighbours as unknown as Record<string, unknown>[],
    results: results as unknown as Record<string, unknown>,
    mobilityCm2PerVs: results.mobility,
  };
}

export async function createMaterial(
  db: DataSource,
  compute: ComputeRunner,
  userId: string,
  workspaceId: string,
  dto: MaterialInputDto,
): Promise<Material> {
  await requireRole(db.manager, workspaceId, userId, canEdit);
  const input = plainInput(dto);
  // Compute before the transaction opens: no transaction waits on a calculation.
  const results = await computeMaterial(compute, input);
  const saved = await db.transaction(async (tx) => {
    await requireRole(tx, workspaceId, userId, canEdit);
    const repo = tx.getRepository(MaterialEntity);
    const row = await repo.save(
      repo.create({
        workspaceId,
        ...columns(input, results),
        version: 1,
        createdBy: userId,
        updatedBy: userId,
      }),
    );
    const summary = `material ${row.name} v1`;
    await writeVersion(tx, row, userId, summary);
    await recordAudit(tx, {
      workspaceId,
      actorId: userId,
      action: 'material.created',
      entityType: 'material',
      entityId: row.id,
      summary,
    });
    return row.id;
  });
  return toMaterial((await db.getRepository(MaterialEntity).findOneBy({ id: saved }))!);
}

export async function listMaterials(
  db: DataSource,
  userId: string,
  workspaceId: string,
): Promise<MaterialListItem[]> {
  await requireRole(db.manager, workspaceId, userId);
  const rows = await db
    .getRepository(MaterialEntity)
    .find({ where: { workspaceId }, order: { updatedAt: 'DESC', name: 'ASC' } });
  return rows.map(listItem);
}

export async function readMaterial(db: DataSource, userId: string, id: string): Promise<Material> {
  return toMaterial(await materialForCaller(db.manager, id, userId));
}

/** Saves a new version from `dto.version`; a stale version answers 409. */
export async function updateMaterial(
  db: DataSource,
  compute: ComputeRunner,
  userId: string,
  id: string,
  dto: MaterialUpdateDto,
): Promise<Material> {
  await materialForCaller(db.manager, id, userId, canEdit);
  const input = plainInput(dto);
  const results = await computeMaterial(compute, input);
  await db.transaction(async (tx) => {
    const current = await materialForCaller(tx, id, userId, canEdit);
    const locked = await tx
      .getRepository(MaterialEntity)
      .createQueryBuilder('m')
      .setLock('pessimistic_write')
      .where('m.id = :id', { id })
      .getOneOrFail();
    if (locked.version !== dto.version) {
      throw new AppError(
        409,
        'version-conflict',
        `This material was changed by someone else (now version ${locked.version}).`,
        { current: toMaterial(locked) },
      );
    }
    const next = Object.assign(locked, {
      ...columns(input, results),
      version: locked.version + 1,
      updatedBy: userId,
    });
    const row = await tx.getRepository(MaterialEntity).save(next);
    const summary = `material ${row.name} v${row.version}`;
    await writeVersion(tx, row, userId, summary);
    await recordAudit(tx, {
      workspaceId: current.workspaceId,
      actorId: userId,
      action: 'material.updated',
      entityType: 'material',
      entityId: id,
      summary,
    });
  });
  return readMaterial(db, userId, id);
}

export async function deleteMaterial(db: DataSource, userId: string, id: string): Promise<void> {
  await db.transaction(async (tx) => {
    const row = await materialForCaller(tx, id, userId, canEdit);
    await tx.getRepository(MaterialEntity).delete({ id });
    await recordAudit(tx, {
      workspaceId: row.workspaceId,
      actorId: userId,
      action: 'material.deleted',
      entityType: 'material',
      entityId: id,
      summary: `material ${row.name} deleted at v${row.version}`,
    });
  });
}

export async function listMaterialVersions(
  db: DataSource,
  userId: string,
  id: string,
): Promise<
  { version: number; summary: string; createdAt: string; snapshot: Record<string, unknown> }[]
> {
  await materialForCaller(db.manager, id, userId);
  const rows = await db
    .getRepository(MaterialVersionEntity)
    .find({ where: { materialId: id }, order: { version: 'DESC' } });
  return rows.map((r) => ({
    version: r.version,
    summary: r.summary,
    createdAt: r.createdAt.toISOString(),
    snapshot: r.snapshot,
  }));
}

/**
 * Computes a draft case of the workspace without saving (the page's "Compute" before "Save").
 * Any member may compute, as for pairs.
 */
export async function computeDraftMaterial(
  db: DataSource,
  compute: ComputeRunner,
  userId: string,
  workspaceId: string,
  dto: MaterialInputDto,
): Promise<MaterialResults> {
  await requireRole(db.manager, workspaceId, userId);
  return computeMaterial(compute, plainInput(dto));
}
