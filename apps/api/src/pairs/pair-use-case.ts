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

export function resultsFor(
  input: Pick<PairInput, 'temperature' | 'parameters'> & { model?: PairInput['model'] },
): PairResults {
  return computePairResults({
    temperature: input.temperature,
    model: input.model ?? 'marcus',
    parameters: input.parameters,
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

export async function createPair(
  db: DataSource,
  userId: string,
  workspaceId: string,
  input: FullInput,
): Promise<Pair> {
  return db.transaction((tx) => createPairIn(tx, userId, workspaceId, input));
}

/**
 * Creates a pair inside the caller's transaction (the demo seed runs all of its writes in one):
 * role check, the row and its parameters, version 1 and the audit event.
 */
export async function createPairIn(
  tx: EntityManager,
  userId: string,
  workspaceId: string,
  input: FullInput,
): Promise<Pair> {
  await requireRole(tx, workspaceId, userId, canEdit);
  await requireWorkspaceReferences(tx, workspaceId, provenanceReferences(input));
  const id = await insertPair(tx, workspaceId, input, resultsFor(input), userId);
  const pair = (await findPair(tx, id))!;
  await saveSnapshot(tx, pair, null, userId, 'pair.created', 'created');
  return pair;
}

/**
 * Saves a new state of a pair from `version` (optimistic locking): the row is locked, a stale
 * version answers 409 `version-conflict` carrying the current pair, and nothing is written.
 */
export async function savePair(
  db: DataSource,
  userId: string,
  pairId: string,
  version: number,
  build: (current: Pair) => FullInput,
  action = 'pair.updated',
  fixedSummary?: string,
): Promise<Pair> {
  return db.transaction((tx) =>
    savePairIn(tx, userId, pairId, version, build, action, fixedSummary),
  );
}

/** `savePair` inside a caller's transaction (several pairs saved all or nothing). */
export async function savePairIn(
  tx: EntityManager,
  userId: string,
  pairId: string,
  version: number,
  build: (current: Pair) => FullInput,
  action = 'pair.updated',
  fixedSummary?: string,
): Promise<Pair> {
  const { workspaceId } = await pairForCaller(tx, pairId, userId, canEdit);
  const current = await findPair(tx, pairId, true);
  if (!current) throw notFound('pair');
  if (current.version !== version) {
    throw new AppError(
      409,
      'version-conflict',
      `This pair was changed by someone else (now version ${current.version}); review and save again.`,
      { current },
    );
  }
  const input = build(current);
  // Only links this save adds are checked: a source deleted since it was linked stays readable.
  const linked = new Set(provenanceReferences(current).map((r) => `${r.type}:${r.id}`));
  await requireWorkspaceReferences(
    tx,
    workspaceId,
    provenanceReferences(input).filter((r) => !linked.has(`${r.type}:${r.id}`)),
  );
  await updatePair(tx, pairId, input, resultsFor(input), userId);
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
export async function archivePair(db: DataSource, userId: string, pairId: string): Promise<Pair> {
  const current = await db.transaction(async (tx) => {
    await pairForCaller(tx, pairId, userId, canEdit);
    return findPair(tx, pairId);
  });
  if (!current) throw notFound('pair');
  if (current.status === 'archived') return current;
  return savePair(
    db,
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

export async function duplicatePair(db: DataSource, userId: string, pairId: string): Promise<Pair> {
  return db.transaction(async (tx) => {
    const { workspaceId } = await pairForCaller(tx, pairId, userId, canEdit);
    const source = await findPair(tx, pairId);
    if (!source) throw notFound('pair');
    const input: FullInput = {
      ...inputOf(source),
      name: `${source.name} (copy)`.slice(0, 200),
      status: 'draft',
    };
    const id = await insertPair(tx, workspaceId, input, resultsFor(input), userId);
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
  const { temperature, model, parameters } = pair;
  return compute.run('pairResults', [{ temperature, model: model ?? 'marcus', parameters }], {
    budget: 'interactive',
    advice: 'Compute the pair with a larger ħω or the classical or thermal form.',
  });
}
