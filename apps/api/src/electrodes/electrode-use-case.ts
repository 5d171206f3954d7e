/**
 * Electrode-case use-cases (issue 18): create, list, read, update (optimistic version), delete,
 * versions, fit of measured k(η) and "apply fit". Fits run in the compute pool
 * (`fit.electrodeKinetics`) before any transaction opens; a save writes the case, an immutable
 * version row and an audit event in one transaction.
 */
import { canEdit } from '@gapwise/contracts';
import type { DataSource, EntityManager } from 'typeorm';
import {
  ElectrodeCaseEntity,
  ElectrodeCaseVersionEntity,
  type ElectrodePointRecord,
} from '@gapwise/db';
import { recordAudit } from '../audit/audit-repository';
import type { ComputeRunner } from '../compute/compute-tasks';
import { AppError, notFound, validationFailed } from '../http/app-error';
import { isUuid } from '../http/validate';
import { requireRole } from '../workspaces/workspace-access';
import type {
  ElectrodeApplyFitDto,
  ElectrodeCaseInputDto,
  ElectrodeCaseUpdateDto,
  ElectrodeFitDto,
} from './electrode-dto';

/** An electrode case as the API answers it. */
export interface ElectrodeCase {
  readonly id: string;
  readonly workspaceId: string;
  readonly name: string;
  readonly redoxCouple: string;
  readonly electrode: string;
  readonly lambdaEv: number;
  readonly temperatureK: number;
  readonly rateSource: 'k0' | 'coupling';
  readonly k0: number | null;
  readonly rateUnit: string;
  readonly couplingEv: number | null;
  readonly densityOfStatesPerEv: number | null;
  readonly provenance: string;
  readonly points: ElectrodePointRecord[];
  readonly dataNote: string;
  readonly notes: string;
  readonly version: number;
  readonly createdAt: string;
  readonly updatedAt: string;
}

export type ElectrodeCaseListItem = Omit<ElectrodeCase, 'points' | 'notes'> & {
  readonly pointCount: number;
};

/** The answer of a fit: `fit.electrodeKinetics` outputs and warnings. */
export interface ElectrodeFitAnswer {
  readonly outputs: Record<string, unknown>;
  readonly warnings: unknown[];
  readonly pointCount: number;
}

const ADVICE = 'Fit fewer points (at most 100) or a narrower overpotential range.';

function toCase(row: ElectrodeCaseEntity): ElectrodeCase {
  return {
    id: row.id,
    workspaceId: row.workspaceId,
    name: row.name,
    redoxCouple: row.redoxCouple,
    electrode: row.electrode,
    lambdaEv: row.lambdaEv,
    temperatureK: row.temperatureK,
    rateSource: row.rateSource,
    k0: row.k0,
    rateUnit: row.rateUnit,
    couplingEv: row.couplingEv,
    densityOfStatesPerEv: row.densityOfStatesPerEv,
    provenance: row.provenance,
    points: row.points,
    dataNote: row.dataNote,
    notes: row.notes,
    version: row.version,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

function listItem(row: ElectrodeCaseEntity): ElectrodeCaseListItem {
  const { points, notes: _n, ...item } = toCase(row);
  return { ...item, pointCount: points.length };
}

/** Cross-field rules the decorators cannot state; errors name the field as the form labels it. */
function checkRateSource(dto: ElectrodeCaseInputDto): void {
  const errors: { field: string; message: string }[] = [];
  if (dto.rateSource === 'k0' && !(typeof dto.k0 === 'number' && dto.k0 > 0)) {
    errors.push({
      field: 'k0',
      message: 'Standard rate constant k⁰ is required when the rate comes from k⁰.',
    });
  }
  if (dto.rateSource === 'coupling') {
    if (!(typeof dto.couplingEv === 'number' && dto.couplingEv > 0))
      errors.push({
        field: 'couplingEv',
        message: 'Electronic coupling |H| (eV) is required when the rate comes from |H|.',
      });
    if (!(typeof dto.densityOfStatesPerEv === 'number' && dto.densityOfStatesPerEv > 0))
      errors.push({
        field: 'densityOfStatesPerEv',
        message: 'Density of states ρ_M (eV⁻¹) is required when the rate comes from |H|.',
      });
  }
  if (errors.length > 0) throw validationFailed(errors);
}

function fields(dto: ElectrodeCaseInputDto) {
  return {
    name: dto.name.trim(),
    redoxCouple: dto.redoxCouple.trim(),
    electrode: dto.electrode.trim(),
    lambdaEv: dto.lambdaEv,
    temperatureK: dto.temperatureK,
    rateSource: dto.rateSource,
    k0: dto.rateSource === 'k0' ? (dto.k0 ?? null) : null,
    rateUnit: dto.rateUnit ?? 's-1',
    couplingEv: dto.rateSource === 'coupling' ? (dto.couplingEv ?? null) : null,
    densityOfStatesPerEv: dto.rateSource === 'coupling' ? (dto.densityOfStatesPerEv ?? null) : null,
    provenance: dto.provenance ?? '',
    points: (dto.points ?? []).map((p) => ({
      overpotentialV: p.overpotentialV,
      k: p.k,
      direction: p.direction,
    })),
    dataNote: dto.dataNote ?? '',
    notes: dto.notes ?? '',
  };
}

/** The case's row after checking the caller's role (404 for non-members). */
export async function electrodeCaseForCaller(
  db: EntityManager,
  id: string,
  userId: string,
  allowed: Parameters<typeof requireRole>[3] = () => true,
): Promise<ElectrodeCaseEntity> {
  const row = isUuid(id) ? await db.getRepository(ElectrodeCaseEntity).findOneBy({ id }) : null;
  if (!row) throw notFound('electrode case');
  await requireRole(db, row.workspaceId, userId, allowed, 'electrode case');
  return row;
}

function snapshotOf(row: ElectrodeCaseEntity): Record<string, unknown> {
  const {
    id: _i,
    workspaceId: _w,
    version: _v,
    createdAt: _c,
    updatedAt: _u,
    ...rest
  } = toCase(row);
  return rest;
}

async function writeVersion(
  tx: EntityManager,
  row: ElectrodeCaseEntity,
  userId: string,
  summary: string,
): Promise<void> {
  const versions = tx.getRepository(ElectrodeCaseVersionEntity);
  await versions.save(
    versions.create({
      caseId: row.id,
      version: row.version,
      snapshot: snapshotOf(row),
      summary,
      createdBy: userId,
    }),
  );
}

export async function createElectrodeCase(
  db: DataSource,
  userId: string,
  workspaceId: string,
  dto: ElectrodeCaseInputDto,
): Promise<ElectrodeCase> {
  await requireRole(db.manager, workspaceId, userId, canEdit);
  checkRateSource(dto);
  const saved = await db.transaction(async (tx) => {
    await requireRole(tx, workspaceId, userId, canEdit);
    const repo = tx.getRepository(ElectrodeCaseEntity);
    const row = await repo.save(
      repo.create({
        workspaceId,
        ...fields(dto),
        version: 1,
        createdBy: userId,
        updatedBy: userId,
      }),
    );
    const summary = `electrode case ${row.name} v1`;
    await writeVersion(tx, row, userId, summary);
    await recordAudit(tx, {
      workspaceId,
      actorId: userId,
      action: 'electrode-case.created',
      entityType: 'electrode-case',
      entityId: row.id,
      summary,
    });
    return row.id;
  });
  return toCase((await db.getRepository(ElectrodeCaseEntity).findOneBy({ id: saved }))!);
}

export async function listElectrodeCases(
  db: DataSource,
  userId: string,
  workspaceId: string,
): Promise<ElectrodeCaseListItem[]> {
  await requireRole(db.manager, workspaceId, userId);
  const rows = await db
    .getRepository(ElectrodeCaseEntity)
    .find({ where: { workspaceId }, order: { updatedAt: 'DESC', name: 'ASC' } });
  return rows.map(listItem);
}

export async function readElectrodeCase(
  db: DataSource,
  userId: string,
  id: string,
): Promise<ElectrodeCase> {
  return toCase(await electrodeCaseForCaller(db.manager, id, userId));
}

/** Locks the row and answers 409 when `version` is not the current one. */
async function lockAtVersion(
  tx: EntityManager,
  id: string,
  version: number,
): Promise<ElectrodeCaseEntity> {
  const locked = await tx
    .getRepository(ElectrodeCaseEntity)
    .createQueryBuilder('c')
    .setLock('pessimistic_write')
    .where('c.id = :id', { id })
    .getOneOrFail();
  if (locked.version !== version) {
    throw new AppError(
      409,
      'version-conflict',
      `This electrode case was changed by someone else (now version ${locked.version}).`,
      { current: toCase(locked) },
    );
  }
  return locked;
}

async function saveNextVersion(
  tx: EntityManager,
  locked: ElectrodeCaseEntity,
  changes: Partial<ElectrodeCaseEntity>,
  userId: string,
  action: string,
  note: string,
): Promise<void> {
  const next = Object.assign(locked, changes, { version: locked.version + 1, updatedBy: userId });
  const row = await tx.getRepository(ElectrodeCaseEntity).save(next);
  const summary = `electrode case ${row.name} v${row.version}${note}`;
  await writeVersion(tx, row, userId, summary);
  await recordAudit(tx, {
    workspaceId: row.workspaceId,
    actorId: userId,
    action,
    entityType: 'electrode-case',
    entityId: row.id,
    summary,
  });
}

/** Saves a new version from `dto.version`; a stale version answers 409. */
export async function updateElectrodeCase(
  db: DataSource,
  userId: string,
  id: string,
  dto: ElectrodeCaseUpdateDto,
): Promise<ElectrodeCase> {
  await electrodeCaseForCaller(db.manager, id, userId, canEdit);
  checkRateSource(dto);
  await db.transaction(async (tx) => {
    await electrodeCaseForCaller(tx, id, userId, canEdit);
    const locked = await lockAtVersion(tx, id, dto.version);
    await saveNextVersion(tx, locked, fields(dto), userId, 'electrode-case.updated', '');
  });
  return readElectrodeCase(db, userId, id);
}

export async function deleteElectrodeCase(
  db: DataSource,
  userId: string,
  id: string,
): Promise<void> {
  await db.transaction(async (tx) => {
    const row = await electrodeCaseForCaller(tx, id, userId, canEdit);
    await tx.getRepository(ElectrodeCaseEntity).delete({ id });
    await recordAudit(tx, {
      workspaceId: row.workspaceId,
      actorId: userId,
      action: 'electrode-case.deleted',
      entityType: 'electrode-case',
      entityId: id,
      summary: `electrode case ${row.name} deleted at v${row.version}`,
    });
  });
}

export async function listElectrodeCaseVersions(
  db: DataSource,
  userId: string,
  id: string,
): Promise<
  { version: number; summary: string; createdAt: string; snapshot: Record<string, unknown> }[]
> {
  await electrodeCaseForCaller(db.manager, id, userId);
  const rows = await db
    .getRepository(ElectrodeCaseVersionEntity)
    .find({ where: { caseId: id }, order: { version: 'DESC' } });
  return rows.map((r) => ({
    version: r.version,
    summary: r.summary,
    createdAt: r.createdAt.toISOString(),
    snapshot: r.snapshot,
  }));
}

/** `fit.electrodeKinetics` in the pool; a refusal is a 400 naming the field. */
async function runFit(
  compute: ComputeRunner,
  points: readonly ElectrodePointRecord[],
  temperatureK: number,
): Promise<ElectrodeFitAnswer> {
  const answer = await compute.run(
    'electrodeFit',
    [
      {
        temperature: temperatureK,
        points: points.map((p) => ({
          overpotential: p.overpotentialV,
          k: p.k,
          direction: p.direction,
        })),
      },
    ],
    { budget: 'interactive', advice: ADVICE },
  );
  if (!answer.ok) throw validationFailed(answer.errors);
  return { outputs: answer.outputs, warnings: answer.warnings, pointCount: points.length };
}

/** Fits the stored points, or the draft points of the body (any member may fit, as for pairs). */
export async function fitElectrodeCase(
  db: DataSource,
  compute: ComputeRunner,
  userId: string,
  id: string,
  dto: ElectrodeFitDto,
): Promise<ElectrodeFitAnswer> {
  const row = await electrodeCaseForCaller(db.manager, id, userId);
  return runFit(compute, dto.points ?? row.points, row.temperatureK);
}

function formatSe(value: number, se: number): string {
  return `${value.toPrecision(4)} ± ${se.toPrecision(2)}`;
}

/**
 * Fits (pool first), then in one transaction stores the points, the fitted λ and k⁰ (MHC) and a
 * provenance line naming the fit, as a new version; 409 when the case moved on meanwhile.
 */
export async function applyElectrodeFit(
  db: DataSource,
  compute: ComputeRunner,
  userId: string,
  id: string,
  dto: ElectrodeApplyFitDto,
): Promise<ElectrodeCase> {
  const before = await electrodeCaseForCaller(db.manager, id, userId, canEdit);
  const points = (dto.points ?? before.points).map((p) => ({
    overpotentialV: p.overpotentialV,
    k: p.k,
    direction: p.direction,
  }));
  const fit = await runFit(compute, points, before.temperatureK);
  const mhc = fit.outputs['mhc'] as {
    lambda: number;
    lambdaStandardError: number;
    k0: number;
    log10k0StandardError: number;
  };
  const verdict = String(fit.outputs['verdict']);
  const deltaAic = Number(fit.outputs['deltaAic']);
  const provenance =
    `Fit of ${points.length} measured k(η) (Marcus–Hush–Chidsey, fit.electrodeKinetics, ` +
    `applied to v${dto.version}): λ = ${formatSe(mhc.lambda, mhc.lambdaStandardError)} eV, ` +
    `log10 k⁰ = ${formatSe(Math.log10(mhc.k0), mhc.log10k0StandardError)}; ` +
    `ΔAIC(BV − MHC) = ${deltaAic.toFixed(1)}, verdict ${verdict}.`;
  await db.transaction(async (tx) => {
    await electrodeCaseForCaller(tx, id, userId, canEdit);
    const locked = await lockAtVersion(tx, id, dto.version);
    await saveNextVersion(
      tx,
      locked,
      {
        lambdaEv: mhc.lambda,
        rateSource: 'k0',
        k0: mhc.k0,
        couplingEv: null,
        densityOfStatesPerEv: null,
        points,
        provenance,
      },
      userId,
      'electrode-case.fit-applied',
      ' (fit applied)',
    );
  });
  return readElectrodeCase(db, userId, id);
}
