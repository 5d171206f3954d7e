/**
 * Screen use-cases: upload (streamed parse into stored chunks and queued jobs, in one
 * transaction), reuse of earlier results, cancel, re-run, and "open as pair".
 */
import { createHash } from 'node:crypto';
import type { Readable } from 'node:stream';
import type { DataSource, EntityManager } from 'typeorm';
import {
  canEdit,
  type BadRowChoice,
  type Pair,
  type PairParameter,
  type Provenance,
  type Screen,
} from '@gapwise/contracts';
import { AppError, notFound } from '../http/app-error';
import { parseBody } from '../http/validate';
import { recordAudit } from '../audit/audit-repository';
import { PairInputDto } from '../pairs/pair-dto';
import type { ComputeRunner } from '../compute/compute-tasks';
import { acceptPairInput, createPair } from '../pairs/pair-use-case';
import { requireRole } from '../workspaces/workspace-access';
import type { ScreenService } from './screen-queue';
import {
  decodeInputChunk,
  parseScreenCsv,
  ScreenTooManyRowsError,
  type InputChunk,
} from './screen-parser';
import * as repo from './screen-repository';
import { findResult, findScreen, inputPayloadForLine, screenWorkspace } from './screen-repository';
import { unitsForKind } from '../pairs/pair-rules';
import { DEFAULT_ASSUMED_HBAR_OMEGA_EV, type ScoreChoice } from './screen-score';
import { SCREEN_SOFTWARE_VERSION } from './screen-version';

export const DEFAULT_CHUNK_SIZE = 2000;

export interface UploadOptions {
  readonly name: string;
  readonly runGoodRows: boolean;
  readonly badRowChoice?: BadRowChoice;
  readonly score: ScoreChoice;
  readonly chunkSize?: number;
  /** Most data rows of one screen (SCREEN_MAX_ROWS); more answers 413. */
  readonly maxRows?: number;
}

/** Loads the screen's workspace and checks the caller's role (404 for non-members). */
export async function screenForCaller(
  db: EntityManager,
  screenId: string,
  userId: string,
  allowed: Parameters<typeof requireRole>[3] = () => true,
): Promise<string> {
  const workspaceId = await screenWorkspace(db, screenId);
  if (!workspaceId) throw notFound('screen');
  await requireRole(db, workspaceId, userId, allowed, 'screen');
  return workspaceId;
}

/**
 * Parses the upload while streaming it into `screen_inputs` / `screen_chunks` inside one
 * transaction. Bad rows answer 400 with their line numbers (nothing saved) unless the user
 * chose to run the good rows. Equal inputs (hash) with the same software version reuse the
 * results of an earlier finished screen of the workspace instead of computing them again.
 */
export async function uploadScreen(
  db: DataSource,
  service: ScreenService,
  userId: string,
  workspaceId: string,
  source: Readable | string,
  options: UploadOptions,
): Promise<Screen> {
  const started = Date.now();
  const chunkSize = options.chunkSize ?? DEFAULT_CHUNK_SIZE;
  const id = await db.transaction(async (tx) => {
    await requireRole(tx, workspaceId, userId, canEdit);
    const screenId = await repo.insertScreen(tx, {
      workspaceId,
      name: options.name,
      softwareVersion: SCREEN_SOFTWARE_VERSION,
      scoreKind: options.score.kind,
      scoreFloorEv: options.score.floorEv ?? null,
      scoreHbarOmegaEv: options.score.assumedHbarOmegaEv ?? DEFAULT_ASSUMED_HBAR_OMEGA_EV,
      chunkSize,
      createdBy: userId,
    });
    // Parsing and storing overlap: each chunk's insert is queued on the transaction's connection
    // while the parser reads on; at most STORE_AHEAD chunks wait, so memory stays flat.
    let stored: Promise<void> = Promise.resolve();
    let waiting = 0;
    const summary = await parseScreenCsv(source, {
      chunkSize,
      maxRows: options.maxRows,
      onChunk: async (chunk, encoded) => {
        waiting += 1;
        stored = stored
          .then(() => repo.storeChunk(tx, screenId, chunk, encoded))
          .finally(() => (waiting -= 1));
        stored.catch(() => undefined);
        if (waiting >= STORE_AHEAD) await stored;
      },
    }).catch((error: unknown) => {
      if (error instanceof ScreenTooManyRowsError)
        throw new AppError(
          413,
          'payload-too-large',
          `A screen may have at most ${error.maxRows} data rows (SCREEN_MAX_ROWS); nothing was stored.`,
          { fields: [{ field: 'file', message: `has more than ${error.maxRows} data rows` }] },
        );
      throw error;
    });
    await stored;
    if (typeof source !== 'string') source.resume();
    if (
      summary.fatal ||
      (summary.badRowCount > 0 && !options.runGoodRows) ||
      summary.goodRows === 0
    ) {
      throw new AppError(
        400,
        'screen-bad-rows',
        summary.fatal
          ? 'The file cannot be read as a screen.'
          : `${summary.badRowCount} bad row(s): fix them, or run the ${summary.goodRows} good row(s).`,
        {
          fields: summary.badRows.map((b) => ({ field: `line ${b.line}`, message: b.message })),
          current: {
            badRowCount: summary.badRowCount,
            goodRows: summary.goodRows,
            fatal: summary.fatal,
          },
        },
      );
    }
    const inputHash = createHash('sha256')
      .update(
        `${summary.inputHash}\n${options.score.kind}\n${options.score.floorEv ?? ''}\n` +
          `${options.score.assumedHbarOmegaEv ?? DEFAULT_ASSUMED_HBAR_OMEGA_EV}`,
      )
      .digest('hex');
    const choice: BadRowChoice =
      summary.badRowCount > 0 ? 'run-good' : (options.badRowChoice ?? 'none');
    await repo.recordUploadSummary(tx, screenId, {
      inputHash,
      rowCount: summary.goodRows,
      badRowCount: summary.badRowCount,
      badRows: summary.badRows,
      badRowChoice: choice,
      chunkCount: summary.chunks,
      uploadMs: Date.now() - started,
      columnUnits: summary.units,
    });
    const reusable = await repo.finishedScreenWithInputs(
      tx,
      workspaceId,
      inputHash,
      SCREEN_SOFTWARE_VERSION,
      screenId,
    );
    if (reusable) await repo.reuseResults(tx, screenId, reusable);
    else {
      await repo.markScreenRunning(tx, screenId);
      await service.enqueue(
        tx,
        screenId,
        Array.from({ length: summary.chunks }, (_, i) => i),
      );
    }
    await recordAudit(tx, {
      workspaceId,
      actorId: userId,
      action: 'screen.created',
      entityType: 'screen',
      entityId: screenId,
      summary: `screen ${options.name}: ${summary.goodRows} row(s), ${summary.badRowCount} bad (${choice})`,
    });
    return screenId;
  });
  return (await findScreen(db.manager, id))!;
}

/** Chunks whose insert may be queued ahead of the parser. */
const STORE_AHEAD = 4;

/** Stops a screen: queued chunks are skipped, finished chunks and their results stay. */
export async function cancelScreen(
  db: DataSource,
  userId: string,
  screenId: string,
): Promise<Screen> {
  await db.transaction(async (tx) => {
    const workspaceId = await screenForCaller(tx, screenId, userId, canEdit);
    // Chunks first, then the screen: the same lock order as the chunk writer (no deadlock).
    await repo.cancelPendingChunks(tx, screenId);
    // The throw below rolls back the chunk update too (nothing written for a finished screen).
    if (!(await repo.markScreenCancelled(tx, screenId)))
      throw new AppError(
        409,
        'screen-not-running',
        'Only an uploaded or running screen can be cancelled.',
      );
    await recordAudit(tx, {
      workspaceId,
      actorId: userId,
      action: 'screen.cancelled',
      entityType: 'screen',
      entityId: screenId,
      summary: 'screen cancelled',
    });
  });
  return (await findScreen(db.manager, screenId))!;
}

/**
 * Runs a screen again. A finished screen computed by this software version keeps its results
 * (`reused: true`); otherwise unfinished chunks (or all, after a version change) are queued.
 */
export async function rerunScreen(
  db: DataSource,
  service: ScreenService,
  userId: string,
  screenId: string,
): Promise<{ screen: Screen; reused: boolean }> {
  const reused = await db.transaction(async (tx) => {
    const workspaceId = await screenForCaller(tx, screenId, userId, canEdit);
    const current = (await repo.lockScreenState(tx, screenId))!;
    if (current.status === 'running')
      throw new AppError(409, 'screen-running', 'The screen is already running.');
    if (current.status === 'done' && current.softwareVersion === SCREEN_SOFTWARE_VERSION)
      return true;
    if (current.softwareVersion !== SCREEN_SOFTWARE_VERSION)
      await repo.resetScreenResults(tx, screenId, SCREEN_SOFTWARE_VERSION);
    else await repo.requeueUnfinishedChunks(tx, screenId);
    const pending = await repo.pendingChunkIndexes(tx, screenId);
    await repo.markScreenRestarted(tx, screenId, pending.length);
    await service.enqueue(tx, screenId, pending);
    await recordAudit(tx, {
      workspaceId,
      actorId: userId,
      action: 'screen.rerun',
      entityType: 'screen',
      entityId: screenId,
      summary: `screen re-run: ${pending.length} chunk(s) queued`,
    });
    return false;
  });
  return { screen: (await findScreen(db.manager, screenId))!, reused };
}

/**
 * Creates a pair from one result row through the pair use-case (so it gets a version and an
 * audit event). Derived parameters name their method, inputs and the screen as source.
 */
export async function openRowAsPair(
  db: DataSource,
  compute: ComputeRunner,
  userId: string,
  screenId: string,
  line: number,
): Promise<Pair> {
  const workspaceId = await screenForCaller(db.manager, screenId, userId, canEdit);
  const screen = (await findScreen(db.manager, screenId))!;
  const row = await findResult(db.manager, screenId, line);
  const stored = await inputPayloadForLine(db.manager, screenId, line);
  if (!row || !stored) throw notFound('screen row');
  const input = decodeInputChunk(stored.chunkIndex, stored.payload);
  const i = input.lines.indexOf(line);
  if (i < 0) throw notFound('screen row');
  const v = (key: keyof InputChunk['values']) => input.values[key][i];
  const source = [{ type: 'screen', id: screenId }];
  const note = `From screen "${screen.name}", line ${line}.`;
  const given: Provenance = {
    kind: 'assumed',
    note: `${note} Value as given in the uploaded file.`,
  };
  const params: PairParameter[] = [];
  // The unit the file's header named for a column travels to the pair (a coupling uploaded in
  // cm⁻¹ opens in cm⁻¹); values stay canonical, as every pair parameter stores them.
  const columnUnits = await repo.screenColumnUnits(db.manager, screenId);
  const add = (
    kind: PairParameter['kind'],
    value: number | null,
    unit: string,
    provenance: Provenance,
    column: string = kind,
  ) => {
    if (value === null || !Number.isFinite(value)) return;
    const typed = columnUnits?.[column];
    const shown = typed && unitsForKind(kind).includes(typed) ? typed : unit;
    params.push({ kind, value, unit: shown, uncertainty: null, provenance });
  };
  const rwInputs = {
    donorOxidation: v('donorOxidation'),
    acceptorReduction: v('acceptorReduction'),
    excitationEnergy: v('excitationEnergy'),
    distance: v('distance'),
    epsilon: v('epsilon'),
  };
  add('deltaG0', row.deltaGCs, 'eV', {
    kind: 'derived',
    methodId: 'drivingForce.rehmWeller',
    methodInputs: rwInputs,
    sources: source,
    note,
  });
  add('deltaG0Recombination', row.deltaGCr, 'eV', {
    kind: 'derived',
    methodId: 'drivingForce.rehmWeller',
    methodInputs: rwInputs,
    sources: source,
    note,
  });
  add('lambdaInner', row.lambdaInner, 'eV', given);
  add(
    'lambdaOuter',
    row.lambdaOuter,
    'eV',
    Number.isNaN(v('lambdaOuter'))
      ? {
          kind: 'derived',
          methodId: 'reorg.twoSphere',
          methodInputs: {
            radiusDonor: v('radiusDonor'),
            radiusAcceptor: v('radiusAcceptor'),
            distance: v('distance'),
            epsilon: v('epsilon'),
            refractiveIndex: v('refractiveIndex'),
          },
          sources: source,
          note,
        }
      : given,
  );
  add(
    'coupling',
    row.coupling,
    'eV',
    Number.isNaN(v('coupling'))
      ? {
          kind: 'derived',
          methodId: 'coupling.distanceDecay',
          methodInputs: {
            coupling0: v('coupling0'),
            distance0: v('distance0'),
            beta: v('beta'),
            distance: v('distance'),
          },
          sources: source,
          note,
        }
      : given,
  );
  add('hbarOmega', Number.isNaN(v('hbarOmega')) ? null : v('hbarOmega'), 'eV', given);
  add('distance', v('distance'), 'A', given);
  add('radiusDonor', Number.isNaN(v('radiusDonor')) ? null : v('radiusDonor'), 'A', given);
  add('radiusAcceptor', Number.isNaN(v('radiusAcceptor')) ? null : v('radiusAcceptor'), 'A', given);
  add('donorOxidation', v('donorOxidation'), 'V', given);
  add('acceptorReduction', v('acceptorReduction'), 'V', given);
  add('excitationEnergy', v('excitationEnergy'), 'eV', given);
  add('epsilonStatic', v('epsilon'), '', given, 'epsilon');
  add(
    'refractiveIndex',
    Number.isNaN(v('refractiveIndex')) ? null : v('refractiveIndex'),
    '',
    given,
  );
  const dto = parseBody(PairInputDto, {
    name: `${row.donor} / ${row.acceptor} (screen line ${line})`,
    donor: row.donor,
    acceptor: row.acceptor,
    medium: row.solvent || `ε = ${v('epsilon')}`,
    temperature: row.temperature ?? v('temperature'),
    notes: note,
    model: Number.isNaN(v('hbarOmega')) ? 'marcus' : 'mlj',
    parameters: params,
  });
  return createPair(db, compute, userId, workspaceId, acceptPairInput(dto));
}
