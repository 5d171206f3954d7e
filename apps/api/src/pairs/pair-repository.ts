import type { EntityManager } from 'typeorm';
import type {
  Page,
  Pair,
  PairInput,
  PairListItem,
  PairParameter,
  PairResults,
  PairStatus,
  PairVersionSummary,
} from '@gapwise/contracts';
import { PairEntity, PairParameterEntity, PairVersionEntity } from '@gapwise/db';
import { isUuid } from '../http/validate';
import { parameterValue, totalLambdaEv } from '@gapwise/contracts';

function toParameter(r: PairParameterEntity): PairParameter {
  return {
    kind: r.kind,
    value: r.value,
    unit: r.unit,
    uncertainty: r.uncertainty,
    provenance: {
      kind: r.provenanceKind,
      citation: r.citation,
      methodId: r.methodId,
      methodInputs: r.methodInputs,
      sources: r.sources,
      note: r.note,
    },
  };
}

function toPair(p: PairEntity, parameters: PairParameter[]): Pair {
  return {
    id: p.id,
    workspaceId: p.workspaceId,
    name: p.name,
    donor: p.donor,
    acceptor: p.acceptor,
    medium: p.medium,
    temperature: p.temperatureK,
    temperatureUnit: p.temperatureUnit,
    notes: p.notes,
    status: p.status,
    tags: p.tags ?? [],
    model: p.model,
    version: p.version,
    parameters,
    results: p.results,
    createdAt: p.createdAt.toISOString(),
    updatedAt: p.updatedAt.toISOString(),
    updatedBy: p.updatedBy ? { id: p.updatedBy, displayName: p.updater?.displayName ?? '' } : null,
  };
}

/** Workspace of a pair (for the membership check), or null when there is no such pair. */
export async function pairWorkspace(db: EntityManager, pairId: string): Promise<string | null> {
  if (!isUuid(pairId)) return null;
  const pair = await db
    .getRepository(PairEntity)
    .findOne({ where: { id: pairId }, select: { id: true, workspaceId: true } });
  return pair?.workspaceId ?? null;
}

export async function findPair(
  db: EntityManager,
  pairId: string,
  lock = false,
): Promise<Pair | null> {
  if (!isUuid(pairId)) return null;
  const query = db
    .getRepository(PairEntity)
    .createQueryBuilder('p')
    .leftJoin('p.updater', 'u')
    .addSelect(['u.id', 'u.displayName'])
    .where('p.id = :pairId', { pairId });
  // FOR UPDATE OF p: the pair row is locked, the (outer-joined) user is not.
  if (lock) query.setLock('pessimistic_write', undefined, ['p']);
  const pair = await query.getOne();
  if (!pair) return null;
  const params = await db
    .getRepository(PairParameterEntity)
    .find({ where: { pairId }, order: { position: 'ASC' } });
  return toPair(pair, params.map(toParameter));
}

/** Values repeated in columns so that the list can sort and filter in SQL. */
function listColumns(input: Required<PairInput>, results: PairResults) {
  const coupling = parameterValue(input.parameters, 'coupling');
  return {
    deltaG0: parameterValue(input.parameters, 'deltaG0') ?? null,
    lambda: totalLambdaEv(input.parameters),
    coupling: coupling === undefined ? null : Math.abs(coupling),
    log10k: results.log10k,
    regime: results.regime,
  };
}

/** The columns a save writes, from the input and its results. */
function pairColumns(input: Required<PairInput>, results: PairResults, userId: string) {
  const c = listColumns(input, results);
  return {
    name: input.name,
    donor: input.donor,
    acceptor: input.acceptor,
    medium: input.medium,
    temperatureK: input.temperature,
    temperatureUnit: input.temperatureUnit,
    notes: input.notes,
    status: input.status,
    tags: [...input.tags],
    model: input.model,
    results,
    deltaG0: c.deltaG0,
    lambdaTotal: c.lambda,
    couplingAbs: c.coupling,
    log10k: c.log10k,
    regime: c.regime,
    updatedBy: userId,
  };
}

export async function insertPair(
  db: EntityManager,
  workspaceId: string,
  input: Required<PairInput>,
  results: PairResults,
  userId: string,
): Promise<string> {
  const result = await db
    .createQueryBuilder()
    .insert()
    .into(PairEntity)
    .values({ ...pairColumns(input, results, userId), workspaceId, version: 1, createdBy: userId })
    .returning(['id'])
    .execute();
  const id = (result.raw as Array<{ id: string }>)[0]!.id;
  await replaceParameters(db, id, input.parameters);
  return id;
}

/** Writes the new state and bumps the version; the caller holds the row lock. */
export async function updatePair(
  db: EntityManager,
  pairId: string,
  input: Required<PairInput>,
  results: PairResults,
  userId: string,
): Promise<void> {
  await db
    .createQueryBuilder()
    .update(PairEntity)
    .set({ ...pairColumns(input, results, userId), version: () => 'version + 1' })
    .where('id = :pairId', { pairId })
    .execute();
  await replaceParameters(db, pairId, input.parameters);
}

async function replaceParameters(
  db: EntityManager,
  pairId: string,
  parameters: readonly PairParameter[],
) {
  await db.getRepository(PairParameterEntity).delete({ pairId });
  if (parameters.length === 0) return;
  const repo = db.getRepository(PairParameterEntity);
  await repo.save(
    parameters.map((p, position) =>
      repo.create({
        pairId,
        position,
        kind: p.kind,
        value: p.value,
        unit: p.unit,
        uncertainty: p.uncertainty,
        provenanceKind: p.provenance.kind,
        citation: p.provenance.citation ?? null,
        methodId: p.provenance.methodId ?? null,
        methodInputs: p.provenance.methodInputs ?? null,
        sources: p.provenance.sources ? [...p.provenance.sources] : null,
        note: p.provenance.note ?? null,
      }),
    ),
  );
}

export async function deletePair(db: EntityManager, pairId: string): Promise<void> {
  await db.getRepository(PairEntity).delete({ id: pairId });
}

export async function insertVersion(
  db: EntityManager,
  pair: Pair,
  summary: string,
  userId: string,
): Promise<void> {
  const repo = db.getRepository(PairVersionEntity);
  await repo.save(
    repo.create({
      pairId: pair.id,
      version: pair.version,
      snapshot: pair,
      summary,
      createdBy: userId,
    }),
  );
}

export async function listVersions(
  db: EntityManager,
  pairId: string,
): Promise<PairVersionSummary[]> {
  const versions = await db
    .getRepository(PairVersionEntity)
    .createQueryBuilder('v')
    .select(['v.version', 'v.createdAt', 'v.summary'])
    .leftJoin('v.creator', 'u')
    .addSelect(['u.id', 'u.displayName'])
    .where('v.pairId = :pairId', { pairId })
    .orderBy('v.version', 'DESC')
    .getMany();
  return versions.map((v) => ({
    version: v.version,
    createdAt: v.createdAt.toISOString(),
    createdBy: v.creator?.displayName ?? null,
    summary: v.summary,
  }));
}

export async function findVersion(
  db: EntityManager,
  pairId: string,
  version: number,
): Promise<Pair | null> {
  const row = await db
    .getRepository(PairVersionEntity)
    .findOne({ where: { pairId, version }, select: { id: true, snapshot: true } });
  return row?.snapshot ?? null;
}

export const SORT_COLUMNS = {
  name: 'lower(p.name)',
  donor: 'lower(p.donor)',
  acceptor: 'lower(p.acceptor)',
  updatedAt: 'p.updated_at',
  log10k: 'p.log10k',
  deltaG0: 'p.delta_g0',
  lambda: 'p.lambda_total',
  coupling: 'p.coupling_abs',
} as const;
export type SortKey = keyof typeof SORT_COLUMNS;

export interface PairListQuery {
  readonly offset: number;
  readonly limit: number;
  readonly sort: SortKey;
  readonly descending: boolean;
  readonly q?: string;
  readonly regime?: string;
  readonly tag?: string;
  /** A status, or undefined for every status but `archived`. */
  readonly status?: PairStatus | 'all';
}

/** One list row as the query builder answers it (raw columns, aliased below). */
interface ListRow {
  id: string;
  name: string;
  donor: string;
  acceptor: string;
  status: PairStatus;
  tags: string[] | null;
  delta_g0: number | null;
  lambda_total: number | null;
  coupling_abs: number | null;
  log10k: number | null;
  regime: string | null;
  version: number;
  updated_at: Date;
  display_name: string | null;
  log10k_cr: number | null;
  regime_cr: string | null;
  log10_ratio: number | null;
  total: number;
}

export async function listPairs(
  db: EntityManager,
  workspaceId: string,
  q: PairListQuery,
): Promise<Page<PairListItem>> {
  const filtered = () => {
    const query = db
      .getRepository(PairEntity)
      .createQueryBuilder('p')
      .where('p.workspace_id = :workspaceId', { workspaceId });
    if (q.q) {
      const like = '%' + q.q.replace(/[\\%_]/g, (c) => '\\' + c) + '%';
      query.andWhere(
        '(p.name ILIKE :like OR p.donor ILIKE :like OR p.acceptor ILIKE :like OR p.medium ILIKE :like OR p.notes ILIKE :like)',
        { like },
      );
    }
    if (q.regime) query.andWhere('p.regime = :regime', { regime: q.regime });
    if (q.tag) query.andWhere(':tag = ANY(p.tags)', { tag: q.tag });
    if (q.status === undefined) query.andWhere(`p.status <> 'archived'`);
    else if (q.status !== 'all') query.andWhere('p.status = :status', { status: q.status });
    return query;
  };
  // Selected as raw columns: the list reads a projection and two values out of the results'
  // JSON, not whole entities. The total rides along as a window count: one round trip for the
  // page and its total.
  const rows = await filtered()
    .leftJoin('p.updater', 'u')
    .select([
      'p.id AS id',
      'p.name AS name',
      'p.donor AS donor',
      'p.acceptor AS acceptor',
      'p.status AS status',
      'p.tags AS tags',
      'p.delta_g0 AS delta_g0',
      'p.lambda_total AS lambda_total',
      'p.coupling_abs AS coupling_abs',
      'p.log10k AS log10k',
      'p.regime AS regime',
      'p.version AS version',
      'p.updated_at AS updated_at',
      'u.display_name AS display_name',
      // Recombination is read from the stored results (pair-model.ts computed them on save):
      // the table shows k_CR without a column of its own to keep in step.
      `(p.results->'recombination'->>'log10k')::float8 AS log10k_cr`,
      `p.results->'recombination'->>'regime' AS regime_cr`,
      `(p.results->>'log10Ratio')::float8 AS log10_ratio`,
      'count(*) OVER ()::int AS total',
    ])
    .orderBy(SORT_COLUMNS[q.sort], q.descending ? 'DESC' : 'ASC', 'NULLS LAST')
    .addOrderBy('p.id')
    .offset(q.offset)
    .limit(q.limit)
    .getRawMany<ListRow>();
  // A page past the end has no row to carry the total: only then is it counted apart.
  const total = rows[0] ? rows[0].total : q.offset === 0 ? 0 : await filtered().getCount();
  return {
    items: rows.map((r) => ({
      id: r.id,
      name: r.name,
      donor: r.donor,
      acceptor: r.acceptor,
      status: r.status,
      tags: r.tags ?? [],
      deltaG0: r.delta_g0,
      lambda: r.lambda_total,
      coupling: r.coupling_abs,
      log10k: r.log10k,
      regime: r.regime,
      log10kCr: r.log10k_cr,
      regimeCr: r.regime_cr,
      log10Ratio: r.log10_ratio,
      version: r.version,
      updatedAt: r.updated_at.toISOString(),
      updatedBy: r.display_name,
    })),
    total,
    offset: q.offset,
    limit: q.limit,
  };
}
