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
  ParameterKind,
  RateModel,
} from '@gapwise/contracts';
import { isUuid } from '../http/validate';
import { parameterValue, totalLambdaEv } from '@gapwise/contracts';

type Row = Record<string, unknown>;
const iso = (d: unknown) => (d instanceof Date ? d.toISOString() : String(d));

const PAIR_COLUMNS = `p.id, p.workspace_id, p.name, p.donor, p.acceptor, p.medium, p.temperature_k,
  p.temperature_unit, p.notes, p.status, p.tags, p.model, p.version, p.results, p.created_at,
  p.updated_at, p.updated_by, u.display_name AS updated_by_name`;

function toParameter(r: Row): PairParameter {
  return {
    kind: r['kind'] as ParameterKind,
    value: r['value'] as number,
    unit: r['unit'] as string,
    uncertainty: (r['uncertainty'] as number | null) ?? null,
    provenance: {
      kind: r['provenance_kind'] as PairParameter['provenance']['kind'],
      citation: (r['citation'] as string | null) ?? null,
      methodId: (r['method_id'] as string | null) ?? null,
      methodInputs: (r['method_inputs'] as Record<string, unknown> | null) ?? null,
      sources: (r['sources'] as Array<{ type: string; id: string }> | null) ?? null,
      note: (r['note'] as string | null) ?? null,
    },
  };
}

function toPair(r: Row, parameters: PairParameter[]): Pair {
  return {
    id: r['id'] as string,
    workspaceId: r['workspace_id'] as string,
    name: r['name'] as string,
    donor: r['donor'] as string,
    acceptor: r['acceptor'] as string,
    medium: r['medium'] as string,
    temperature: r['temperature_k'] as number,
    temperatureUnit: r['temperature_unit'] as string,
    notes: r['notes'] as string,
    status: r['status'] as PairStatus,
    tags: (r['tags'] as string[]) ?? [],
    model: r['model'] as RateModel,
    version: r['version'] as number,
    parameters,
    results: (r['results'] as PairResults | null) ?? null,
    createdAt: iso(r['created_at']),
    updatedAt: iso(r['updated_at']),
    updatedBy: r['updated_by']
      ? { id: r['updated_by'] as string, displayName: (r['updated_by_name'] as string) ?? '' }
      : null,
  };
}

/** Workspace of a pair (for the membership check), or null when there is no such pair. */
export async function pairWorkspace(db: EntityManager, pairId: string): Promise<string | null> {
  if (!isUuid(pairId)) return null;
  const rows = await db.query('SELECT workspace_id FROM pairs WHERE id = $1', [pairId]);
  return rows[0]?.workspace_id ?? null;
}

export async function findPair(
  db: EntityManager,
  pairId: string,
  lock = false,
): Promise<Pair | null> {
  if (!isUuid(pairId)) return null;
  const rows: Row[] = await db.query(
    `SELECT ${PAIR_COLUMNS} FROM pairs p LEFT JOIN users u ON u.id = p.updated_by WHERE p.id = $1
     ${lock ? 'FOR UPDATE OF p' : ''}`,
    [pairId],
  );
  if (!rows[0]) return null;
  const params: Row[] = await db.query(
    'SELECT * FROM pair_parameters WHERE pair_id = $1 ORDER BY position',
    [pairId],
  );
  return toPair(rows[0], params.map(toParameter));
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

export async function insertPair(
  db: EntityManager,
  workspaceId: string,
  input: Required<PairInput>,
  results: PairResults,
  userId: string,
): Promise<string> {
  const c = listColumns(input, results);
  const rows = await db.query(
    `INSERT INTO pairs (workspace_id, name, donor, acceptor, medium, temperature_k, temperature_unit,
       notes, status, tags, model, version, results, delta_g0, lambda_total, coupling_abs, log10k,
       regime, created_by, updated_by)
     VALUES ($1,$2,$3,$4,$5,$6,$7,$8,$9,$10,$11,1,$12,$13,$14,$15,$16,$17,$18,$18) RETURNING id`,
    [
      workspaceId,
      input.name,
      input.donor,
      input.acceptor,
      input.medium,
      input.temperature,
      input.temperatureUnit,
      input.notes,
      input.status,
      input.tags,
      input.model,
      JSON.stringify(results),
      c.deltaG0,
      c.lambda,
      c.coupling,
      c.log10k,
      c.regime,
      userId,
    ],
  );
  const id = rows[0].id as string;
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
  const c = listColumns(input, results);
  await db.query(
    `UPDATE pairs SET name=$2, donor=$3, acceptor=$4, medium=$5, temperature_k=$6, temperature_unit=$7,
       notes=$8, status=$9, tags=$10, model=$11, results=$12, delta_g0=$13, lambda_total=$14,
       coupling_abs=$15, log10k=$16, regime=$17, updated_by=$18, version = version + 1, updated_at = now()
     WHERE id = $1`,
    [
      pairId,
      input.name,
      input.donor,
      input.acceptor,
      input.medium,
      input.temperature,
      input.temperatureUnit,
      input.notes,
      input.status,
      input.tags,
      input.model,
      JSON.stringify(results),
      c.deltaG0,
      c.lambda,
      c.coupling,
      c.log10k,
      c.regime,
      userId,
    ],
  );
  await replaceParameters(db, pairId, input.parameters);
}

async function replaceParameters(
  db: EntityManager,
  pairId: string,
  parameters: readonly PairParameter[],
) {
  await db.query('DELETE FROM pair_parameters WHERE pair_id = $1', [pairId]);
  for (const [i, p] of parameters.entries()) {
    await db.query(
      `INSERT INTO pair_parameters (pair_id, position, kind, value, unit, uncertainty, provenance_kind,
         citation, method_id, method_inputs, sources, note)
       VALUES ($1,$2,$3,$4,$5,$6,$7,$8,$9,$10,$11,$12)`,
      [
        pairId,
        i,
        p.kind,
        p.value,
        p.unit,
        p.uncertainty,
        p.provenance.kind,
        p.provenance.citation ?? null,
        p.provenance.methodId ?? null,
        p.provenance.methodInputs == null ? null : JSON.stringify(p.provenance.methodInputs),
        p.provenance.sources == null ? null : JSON.stringify(p.provenance.sources),
        p.provenance.note ?? null,
      ],
    );
  }
}

export async function deletePair(db: EntityManager, pairId: string): Promise<void> {
  await db.query('DELETE FROM pairs WHERE id = $1', [pairId]);
}

export async function insertVersion(
  db: EntityManager,
  pair: Pair,
  summary: string,
  userId: string,
): Promise<void> {
  await db.query(
    `INSERT INTO pair_versions (pair_id, version, snapshot, summary, created_by) VALUES ($1,$2,$3,$4,$5)`,
    [pair.id, pair.version, JSON.stringify(pair), summary, userId],
  );
}

export async function listVersions(
  db: EntityManager,
  pairId: string,
): Promise<PairVersionSummary[]> {
  const rows: Row[] = await db.query(
    `SELECT v.version, v.created_at, v.summary, u.display_name FROM pair_versions v
       LEFT JOIN users u ON u.id = v.created_by WHERE v.pair_id = $1 ORDER BY v.version DESC`,
    [pairId],
  );
  return rows.map((r) => ({
    version: r['version'] as number,
    createdAt: iso(r['created_at']),
    createdBy: (r['display_name'] as string | null) ?? null,
    summary: r['summary'] as string,
  }));
}

export async function findVersion(
  db: EntityManager,
  pairId: string,
  version: number,
): Promise<Pair | null> {
  const rows: Row[] = await db.query(
    'SELECT snapshot FROM pair_versions WHERE pair_id = $1 AND version = $2',
    [pairId, version],
  );
  return (rows[0]?.['snapshot'] as Pair | undefined) ?? null;
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

export async function listPairs(
  db: EntityManager,
  workspaceId: string,
  q: PairListQuery,
): Promise<Page<PairListItem>> {
  const where = ['p.workspace_id = $1'];
  const params: unknown[] = [workspaceId];
  if (q.q) {
    const like = '%' + q.q.replace(/[\\%_]/g, (c) => '\\' + c) + '%';
    const n = params.push(like);
    where.push(
      `(p.name ILIKE $${n} OR p.donor ILIKE $${n} OR p.acceptor ILIKE $${n} OR p.medium ILIKE $${n} OR p.notes ILIKE $${n})`,
    );
  }
  if (q.regime) where.push(`p.regime = $${params.push(q.regime)}`);
  if (q.tag) where.push(`$${params.push(q.tag)} = ANY(p.tags)`);
  if (q.status === undefined) where.push(`p.status <> 'archived'`);
  else if (q.status !== 'all') where.push(`p.status = $${params.push(q.status)}`);
  const sqlWhere = where.join(' AND ');
  const order = `${SORT_COLUMNS[q.sort]} ${q.descending ? 'DESC' : 'ASC'} NULLS LAST, p.id`;
  // The total rides along as a window count: one round trip for the page and its total.
  const rows: Row[] = await db.query(
    `SELECT p.id, p.name, p.donor, p.acceptor, p.status, p.tags, p.delta_g0, p.lambda_total,
            p.coupling_abs, p.log10k, p.regime, p.version, p.updated_at, u.display_name,
            -- Recombination is read from the stored results (pair-model.ts computed them on save):
            -- the table shows k_CR without a column of its own to keep in step.
            (p.results->'recombination'->>'log10k')::float8 AS log10k_cr,
            p.results->'recombination'->>'regime' AS regime_cr,
            (p.results->>'log10Ratio')::float8 AS log10_ratio,
            count(*) OVER ()::int AS total
       FROM pairs p LEFT JOIN users u ON u.id = p.updated_by
      WHERE ${sqlWhere} ORDER BY ${order}
      OFFSET $${params.length + 1} LIMIT $${params.length + 2}`,
    [...params, q.offset, q.limit],
  );
  // A page past the end has no row to carry the total: only then is it counted apart.
  const total: number = rows[0]
    ? (rows[0]['total'] as number)
    : q.offset === 0
      ? 0
      : (await db.query(`SELECT count(*)::int AS total FROM pairs p WHERE ${sqlWhere}`, params))[0]
          .total;
  return {
    items: rows.map((r) => ({
      id: r['id'] as string,
      name: r['name'] as string,
      donor: r['donor'] as string,
      acceptor: r['acceptor'] as string,
      status: r['status'] as PairStatus,
      tags: (r['tags'] as string[]) ?? [],
      deltaG0: (r['delta_g0'] as number | null) ?? null,
      lambda: (r['lambda_total'] as number | null) ?? null,
      coupling: (r['coupling_abs'] as number | null) ?? null,
      log10k: (r['log10k'] as number | null) ?? null,
      regime: (r['regime'] as string | null) ?? null,
      log10kCr: (r['log10k_cr'] as number | null) ?? null,
      regimeCr: (r['regime_cr'] as string | null) ?? null,
      log10Ratio: (r['log10_ratio'] as number | null) ?? null,
      version: r['version'] as number,
      updatedAt: iso(r['updated_at']),
      updatedBy: (r['display_name'] as string | null) ?? null,
    })),
    total,
    offset: q.offset,
    limit: q.limit,
  };
}
