import type { DataSource, EntityManager } from 'typeorm';
import {
  canEdit,
  computePairResults,
  type Pair,
  type PairComparison,
  type PairInput,
  type PairResults,
  type Role,
} from '@gapwise/contracts';
import type { ComputeRunner } from '../compute/compute-tasks';
import { AppError, notFound, validationFailed } from '../http/app-error';
import { recordAudit } from '../audit/audit-repository';
import { requireRole } from '../workspaces/workspace-access';
import {
  provenanceReferences,
  requireWorkspaceReferences,
} from '../workspaces/workspace-references';
import type { PairInputDto } from './pair-dto';
import { diffPairs, summariseChange } from './pair-diff';
import { normalisePairInput, pairInputProblems } from './pair-rules';
import {
  deletePair,
  findPair,
  findVersion,
  insertPair,
  insertVersion,
  pairWorkspace,
  updatePair,
} from './pair-repository';

type FullInput = Required<PairInput>;

/** Checks cross-field rules and returns the normalised input (or throws 400 with every field). */
export function acceptPairInput(dto: PairInputDto): FullInput {
  const problems = pairInputProblems(dto);
  if (problems.length) throw validationFailed(problems);
  return normalisePairInput(dto);
}

/**
 * A pair's results computed on the calling thread. Only for one-shot commands with no HTTP to
 * answer (the demo seed); requests compute through the pool with `computeResults`.
 */
export function resultsFor(
  input: Pick<PairInput, 'temperature' | 'parameters'> & { model?: PairInput['model'] },
): PairResults {
  return computePairResults({
    temperature: input.temperature,
    model: input.model ?? 'marcus',
    parameters: input.parameters,
  });
}

const PAIR_ADVICE = 'Compute the pair with a larger ħω or the classical or thermal form.';

/**
 * A pair's results computed in the worker-thread pool within the interactive budget. Called
 * before any transaction opens, so no transaction is held while the calculation runs.
 */
export function computeResults(
  compute: ComputeRunner,
  input: Pick<PairInput, 'temperature' | 'parameters'> & { model?: PairInput['model'] },
): Promise<PairResults> {
  const { temperature, parameters } = input;
  return compute.run('pairResults', [{ temperature, model: input.model ?? 'marcus', parameters }], {
    budget: 'interactive',
    advice: PAIR_ADVICE,
  });
}

/** Loads a pair the caller may see (404 for non-members), checking the role rule (403). */
export async function pairForCaller(
  db: EntityManager,
  pairId: string,
  userId: string,
  allowed: (role: Role) => boolean = () => true,
): Promise<{ workspaceId: string; role: Role }> {
  const workspaceId = await pairWorkspace(db, pairId);
  if (!workspaceId) throw notFound('pair');
  const role = await requireRole(db, workspaceId, userId, allowed, 'pair');
  return { workspaceId, role };
}

const auditSummary = (p: Pair) => ({
  name: p.name,
  version: p.version,
  status: p.status,
  parameters: Object.fromEntries(
    p.parameters.map((x) => [x.kind, `${x.value} (${x.provenance.kind})`]),
  ),
  log10k: p.results?.log10k ?? null,
});

async function saveSnapshot(
  tx: EntityManager,
  pair: Pair,
  before: Pair | null,
  userId: string,
  action: string,
  summary: string,
) {
  await insertVersion(tx, pair, summary, userId);
  await recordAudit(tx, {
    workspaceId: pair.workspaceId,
    actorId: userId,
    action,
    entityType: 'pair',
    entityId: pair.id,
    summary: `${pair.name} v${pair.version}: ${summary}`,
    before: before ? auditSummary(before) : undefined,
    after: auditSummary(pair),
  });
}

/** Computes the results in the pool first, then writes the pair in one short transaction. */
export async function createPair(
  db: DataSource,
  compute: ComputeRunner,
  userId: string,
  workspaceId: string,
  input: FullInput,
): Promise<Pair> {
  const results = await computeResults(compute, input);
  return db.transaction((tx) => createPairIn(tx, userId, workspaceId, input, results));
}

/**
 * Creates a pair inside the caller's transaction (the demo seed runs all of its writes in one):
 * role check, the row and its parameters, version 1 and the audit event. `results` are computed
 * by the caller before the transaction opened.
 */
export async function createPairIn(
  tx: EntityManager,
  userId: string,
  workspaceId: string,
  input: FullInput,
  results: PairResults,
): Promise<Pair> {
  await requireRole(tx, workspaceId, userId, canEdit);
  await requireWorkspaceReferences(tx, workspaceId, provenanceReferences(input));
  const id = await insertPair(tx, workspaceId, input, results, userId);
  const pair = (await findPair(tx, id))!;
  await saveSnapshot(tx, pair, null, userId, 'pair.created', 'created');
  return pair;
}

/** A save computed ahead of its transaction: the state it starts from, the input and results. */
export interface PreparedSave {
  readonly pairId: string;
  readonly from: Pair;
  readonly input: FullInput;
  readonly results: PairResults;
}

function versionConflict(current: Pair): AppError {
  return new AppError(
    409,
    'version-conflict',
    `This pair was changed by someone else (now version ${current.version}); review and save again.`,
    { current },
  );
}

/**
 * Reads the pair at `version` (a stale version answers 409 `version-conflict` carrying the
 * current pair), builds its new input and computes the results in the pool — all before any
 * transaction opens. `savePairIn` then writes it only if the pair is still at that version, so
 * the results always belong to the state that is saved.
 */
export async function prepareSave(
  db: DataSource,
  compute: ComputeRunner,
  userId: string,
  pairId: string,
  version: number,
  build: (current: Pair) => FullInput,
): Promise<PreparedSave> {
  await pairForCaller(db.manager, pairId, userId, canEdit);
  const from = await findPair(db.manager, pairId);
  if (!from) throw notFound('pair');
  if (from.version !== version) throw versionConflict(from);
  const input = build(from);
  return { pairId, from, input, results: await computeResults(compute, input) };
}

/**
 * Saves a new state of a pair from `version` (optimistic locking): computed first
 * (`prepareSave`), then written in one short transaction; a stale version answers 409
 * `version-conflict` carrying the current pair, and nothing is written.
 */
export async function savePair(
  db: DataSource,
  compute: ComputeRunner,
  userId: string,
  pairId: string,
  version: number,
  build: (current: Pair) => FullInput,
  action = 'pair.updated',
  fixedSummary?: string,
): Promise<Pair> {
  const prepared = await prepareSave(db, compute, userId, pairId, version, build);
  return db.transaction((tx) => savePairIn(tx, userId, prepared, action, fixedSummary));
}

/**
 * Writes a prepared save inside a caller's transaction (several pairs saved all or nothing): the
 * row is locked and must still be at the version the save was computed from (else 409).
 */
export async function savePairIn(
  tx: EntityManager,
  userId: string,
  prepared: PreparedSave,
  action = 'pair.updated',
  fixedSummary?: string,
): Promise<Pair> {
  const { pairId, input, results } = prepared;
  const { workspaceId } = await pairForCaller(tx, pairId, userId, canEdit);
  const current = await findPair(tx, pairId, true);
  if (!current) throw notFound('pair');
  if (current.version !== prepared.from.version) throw versionConflict(current);
  // Only links this save adds are checked: a source deleted since it was linked stays readable.
  const linked = new Set(provenanceReferences(current).map((r) => `${r.type}:${r.id}`));
  await requireWorkspaceReferences(
    tx,
    workspaceId,
    provenanceReferences(input).filter((r) => !linked.has(`${r.type}:${r.id}`)),
  );
  await updatePair(tx, pairId, input, results, userId);
  const pair = (await findPair(tx, pairId))!;
  await saveSnapshot(
    tx,
    pair,
    current,
    userId,
    action,
    fixedSummary ?? summariseChange(current, pair),
  );
  return pair;
}

export const inputOf = (p: Pair): FullInput => ({
  name: p.name,
  donor: p.donor,
  acceptor: p.acceptor,
  medium: p.medium,
  temperature: p.temperature,
  temperatureUnit: p.temperatureUnit ?? 'K',
  notes: p.notes ?? '',
  status: p.status,
  tags: p.tags,
  model: p.model,
  parameters: p.parameters,
});

/** Archives a pair (a save of its own, so it has a version and an audit event). */
export async function archivePair(
  db: DataSource,
  compute: ComputeRunner,
  userId: string,
  pairId: string,
): Promise<Pair> {
  await pairForCaller(db.manager, pairId, userId, canEdit);
  const current = await findPair(db.manager, pairId);
  if (!current) throw notFound('pair');
  if (current.status === 'archived') return current;
  return savePair(
    db,
    compute,
    userId,
    pairId,
    current.version,
    (p) => ({ ...inputOf(p), status: 'archived' }),
    'pair.archived',
    'archived',
  );
}

export async function deletePairUseCase(
  db: DataSource,
  userId: string,
  pairId: string,
): Promise<void> {
  await db.transaction(async (tx) => {
    const { workspaceId } = await pairForCaller(tx, pairId, userId, canEdit);
    const current = await findPair(tx, pairId, true);
    if (!current) throw notFound('pair');
    await deletePair(tx, pairId);
    await recordAudit(tx, {
      workspaceId,
      actorId: userId,
      action: 'pair.deleted',
      entityType: 'pair',
      entityId: pairId,
      summary: `deleted ${current.name} (last version ${current.version})`,
      before: auditSummary(current),
    });
  });
}

/** Copies a pair as a draft: computed in the pool from the source's state, then written. */
export async function duplicatePair(
  db: DataSource,
  compute: ComputeRunner,
  userId: string,
  pairId: string,
): Promise<Pair> {
  await pairForCaller(db.manager, pairId, userId, canEdit);
  const from = await findPair(db.manager, pairId);
  if (!from) throw notFound('pair');
  const results = await computeResults(compute, from);
  return db.transaction(async (tx) => {
    const { workspaceId } = await pairForCaller(tx, pairId, userId, canEdit);
    const source = await findPair(tx, pairId);
    if (!source) throw notFound('pair');
    // Changed while computing: the results belong to another state; the caller tries again.
    if (source.version !== from.version) throw versionConflict(source);
    const input: FullInput = {
      ...inputOf(source),
      name: `${source.name} (copy)`.slice(0, 200),
      status: 'draft',
    };
    const id = await insertPair(tx, workspaceId, input, results, userId);
    const pair = (await findPair(tx, id))!;
    await saveSnapshot(
      tx,
      pair,
      null,
      userId,
      'pair.created',
      `duplicated from ${source.name} v${source.version}`,
    );
    return pair;
  });
}

export async function readPair(db: DataSource, userId: string, pairId: string): Promise<Pair> {
  await pairForCaller(db.manager, pairId, userId);
  const pair = await findPair(db.manager, pairId);
  if (!pair) throw notFound('pair');
  return pair;
}

export async function readVersion(
  db: DataSource,
  userId: string,
  pairId: string,
  version: number,
): Promise<Pair> {
  await pairForCaller(db.manager, pairId, userId);
  const pair = await findVersion(db.manager, pairId, version);
  if (!pair) throw notFound('version');
  return pair;
}

export async function comparePairVersions(
  db: DataSource,
  userId: string,
  pairId: string,
  from: number,
  to: number | undefined,
): Promise<PairComparison> {
  await pairForCaller(db.manager, pairId, userId);
  const a = await findVersion(db.manager, pairId, from);
  const b =
    to === undefined
      ? await findPair(db.manager, pairId)
      : await findVersion(db.manager, pairId, to);
  if (!a || !b) throw notFound('version');
  return { from, to: b.version, differences: diffPairs(a, b) };
}

/** Recomputes a pair's results with the shared dispatcher (nothing is saved). */
export async function computePair(
  db: DataSource,
  compute: ComputeRunner,
  userId: string,
  pairId: string,
): Promise<PairResults> {
  const pair = await readPair(db, userId, pairId);
  return computeResults(compute, pair);
}
