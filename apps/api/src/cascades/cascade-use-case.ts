/**
 * Cascade use-cases: create, list, read, update (optimistic version), delete, versions and
 * compute. Every save computes the network in the compute pool first (a refused network is a
 * 400 naming `network.<field>`, nothing saved), then writes the cascade, an immutable version row
 * and an audit event in one transaction.
 */
import { canEdit } from '@gapwise/contracts';
import type { DataSource, EntityManager } from 'typeorm';
import { CascadeEntity, CascadeVersionEntity } from '@gapwise/db';
import { recordAudit } from '../audit/audit-repository';
import type { ComputeRunner } from '../compute/compute-tasks';
import { AppError, notFound, validationFailed } from '../http/app-error';
import { isUuid } from '../http/validate';
import { requireRole } from '../workspaces/workspace-access';
import type { CascadeInputDto, CascadeUpdateDto } from './cascade-dto';

/** A cascade as the API answers it. */
export interface Cascade {
  readonly id: string;
  readonly workspaceId: string;
  readonly name: string;
  readonly notes: string;
  readonly network: Record<string, unknown>;
  /** The web editor's design (derivations, σ, pair sources); null for a bare network. */
  readonly design: Record<string, unknown> | null;
  readonly results: Record<string, unknown> | null;
  readonly warnings: unknown[];
  readonly longLivedYield: number | null;
  readonly longLivedLifetimeS: number | null;
  readonly version: number;
  readonly createdAt: string;
  readonly updatedAt: string;
}

export type CascadeListItem = Omit<Cascade, 'network' | 'design' | 'results' | 'warnings'>;

const ADVICE = 'Make the network smaller (fewer states or links) or ask for report: yields.';

function toCascade(row: CascadeEntity): Cascade {
  const stored = (row.results ?? null) as {
    outputs?: Record<string, unknown>;
    warnings?: unknown[];
  } | null;
  return {
    id: row.id,
    workspaceId: row.workspaceId,
    name: row.name,
    notes: row.notes,
    network: row.network,
    design: row.design ?? null,
    results: stored?.outputs ?? null,
    warnings: stored?.warnings ?? [],
    longLivedYield: row.longLivedYield,
    longLivedLifetimeS: row.longLivedLifetimeS,
    version: row.version,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

function listItem(row: CascadeEntity): CascadeListItem {
  const { network: _n, design: _d, results: _r, warnings: _w, ...item } = toCascade(row);
  return item;
}

/** The network computed in the pool; a refusal becomes a 400 naming `network.<field>`. */
export async function computeNetwork(
  compute: ComputeRunner,
  network: Record<string, unknown>,
): Promise<{ outputs: Record<string, unknown>; warnings: unknown[] }> {
  const answer = await compute.run('cascadeResults', [network], {
    budget: 'interactive',
    advice: ADVICE,
  });
  if (!answer.ok) {
    throw validationFailed(
      answer.errors.map((e) => ({ field: `network.${e.field}`, message: e.message })),
    );
  }
  return { outputs: answer.outputs, warnings: answer.warnings };
}

function headline(outputs: Record<string, unknown>): {
  longLivedYield: number | null;
  longLivedLifetimeS: number | null;
} {
  const longLived = outputs['longLived'] as { formationYield?: number; lifetime?: number } | null;
  return {
    longLivedYield: longLived?.formationYield ?? null,
    longLivedLifetimeS: longLived?.lifetime ?? null,
  };
}

/** The cascade's workspace after checking the caller's role (404 for non-members). */
export async function cascadeForCaller(
  db: EntityManager,
  id: string,
  userId: string,
  allowed: Parameters<typeof requireRole>[3] = () => true,
): Promise<CascadeEntity> {
  const row = isUuid(id) ? await db.getRepository(CascadeEntity).findOneBy({ id }) : null;
  if (!row) throw notFound('cascade');
  await requireRole(db, row.workspaceId, userId, allowed, 'cascade');
  return row;
}

async function writeVersion(
  tx: EntityManager,
  row: CascadeEntity,
  userId: string,
  summary: string,
): Promise<void> {
  await tx.getRepository(CascadeVersionEntity).insert({
    cascadeId: row.id,
    version: row.version,
    snapshot: {
      name: row.name,
      notes: row.notes,
      network: row.network,
      // Left out (not null) for a bare network: the snapshot type takes no null leaf.
      design: row.design ?? undefined,
    },
    summary,
    createdBy: userId,
  });
}

export async function createCascade(
  db: DataSource,
  compute: ComputeRunner,
  userId: string,
  workspaceId: string,
  dto: CascadeInputDto,
): Promise<Cascade> {
  await requireRole(db.manager, workspaceId, userId, canEdit);
  // Compute before the transaction opens: no transaction waits on a calculation.
  const results = await computeNetwork(compute, dto.network);
  const saved = await db.transaction(async (tx) => {
    await requireRole(tx, workspaceId, userId, canEdit);
    const repo = tx.getRepository(CascadeEntity);
    const row = await repo.save(
      repo.create({
        workspaceId,
        name: dto.name.trim(),
        notes: dto.notes ?? '',
        network: dto.network,
        design: dto.design ?? null,
        results,
        ...headline(results.outputs),
        version: 1,
        createdBy: userId,
        updatedBy: userId,
      }),
    );
    const summary = `cascade ${row.name} v1`;
    await writeVersion(tx, row, userId, summary);
    await recordAudit(tx, {
      workspaceId,
      actorId: userId,
      action: 'cascade.created',
      entityType: 'cascade',
      entityId: row.id,
      summary,
    });
    return row.id;
  });
  return toCascade((await db.getRepository(CascadeEntity).findOneBy({ id: saved }))!);
}

export async function listCascades(
  db: DataSource,
  userId: string,
  workspaceId: string,
): Promise<CascadeListItem[]> {
  await requireRole(db.manager, workspaceId, userId);
  const rows = await db
    .getRepository(CascadeEntity)
    .find({ where: { workspaceId }, order: { updatedAt: 'DESC', name: 'ASC' } });
  return rows.map(listItem);
}

export async function readCascade(db: DataSource, userId: string, id: string): Promise<Cascade> {
  return toCascade(await cascadeForCaller(db.manager, id, userId));
}

/** Saves a new version from `dto.version`; a stale version answers 409. */
export async function updateCascade(
  db: DataSource,
  compute: ComputeRunner,
  userId: string,
  id: string,
  dto: CascadeUpdateDto,
): Promise<Cascade> {
  await cascadeForCaller(db.manager, id, userId, canEdit);
  const results = await computeNetwork(compute, dto.network);
  await db.transaction(async (tx) => {
    const current = await cascadeForCaller(tx, id, userId, canEdit);
    const locked = await tx
      .getRepository(CascadeEntity)
      .createQueryBuilder('c')
      .setLock('pessimistic_write')
      .where('c.id = :id', { id })
      .getOneOrFail();
    if (locked.version !== dto.version) {
      throw new AppError(
        409,
        'version-conflict',
        `This cascade was changed by someone else (now version ${locked.version}).`,
        { current: toCascade(locked) },
      );
    }
    const next = Object.assign(locked, {
      name: dto.name.trim(),
      notes: dto.notes ?? '',
      network: dto.network,
      design: dto.design ?? null,
      results,
      ...headline(results.outputs),
      version: locked.version + 1,
      updatedBy: userId,
    });
    const row = await tx.getRepository(CascadeEntity).save(next);
    const summary = `cascade ${row.name} v${row.version}`;
    await writeVersion(tx, row, userId, summary);
    await recordAudit(tx, {
      workspaceId: current.workspaceId,
      actorId: userId,
      action: 'cascade.updated',
      entityType: 'cascade',
      entityId: id,
      summary,
    });
  });
  return readCascade(db, userId, id);
}

export async function deleteCascade(db: DataSource, userId: string, id: string): Promise<void> {
  await db.transaction(async (tx) => {
    const row = await cascadeForCaller(tx, id, userId, canEdit);
    await tx.getRepository(CascadeEntity).delete({ id });
    await recordAudit(tx, {
      workspaceId: row.workspaceId,
      actorId: userId,
      action: 'cascade.deleted',
      entityType: 'cascade',
      entityId: id,
      summary: `cascade ${row.name} deleted at v${row.version}`,
    });
  });
}

export async function listCascadeVersions(
  db: DataSource,
  userId: string,
  id: string,
): Promise<
  { version: number; summary: string; createdAt: string; snapshot: Record<string, unknown> }[]
> {
  await cascadeForCaller(db.manager, id, userId);
  const rows = await db
    .getRepository(CascadeVersionEntity)
    .find({ where: { cascadeId: id }, order: { version: 'DESC' } });
  return rows.map((r) => ({
    version: r.version,
    summary: r.summary,
    createdAt: r.createdAt.toISOString(),
    snapshot: r.snapshot,
  }));
}

/**
 * Computes a network without saving: the stored cascade's, or the one in the body (a draft the
 * page is editing). Any member may compute, as for pairs.
 */
export async function computeCascade(
  db: DataSource,
  compute: ComputeRunner,
  userId: string,
  id: string,
  draft: Record<string, unknown> | undefined,
): Promise<{ outputs: Record<string, unknown>; warnings: unknown[] }> {
  const row = await cascadeForCaller(db.manager, id, userId);
  return computeNetwork(compute, draft ?? row.network);
}
