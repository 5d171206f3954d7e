/**
 * Writes one computed chunk idempotently: in ONE transaction the chunk row is locked, skipped
 * when already done (or its screen is no longer running), its results written with binary COPY,
 * the chunk marked done and the screen's counters advanced. A worker killed anywhere inside loses the whole transaction, so a retry
 * neither loses nor duplicates rows.
 */
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { PoolClient } from 'pg';
import { from as copyFrom } from 'pg-copy-streams';
import type { DataSource, EntityManager } from 'typeorm';
import { inlineCompute, type ComputeRunner } from '../compute/compute-tasks';
import type { ChunkResult } from './chunk-computer';
import { SCREEN_RESULT_COPY_COLUMNS, screenResultsCopyPayload } from './pg-binary-copy';
import { decodeInputChunk } from './screen-parser';
import type { ScoreChoice, ScoreKind } from './screen-score';

/**
 * Writes the rows of a chunk result with one binary `COPY … FROM STDIN` on the transaction's
 * connection. Raw SQL and the `pg-copy-streams` package rather than TypeORM: measured, COPY
 * stores a pair in a fraction of the time of the former `INSERT … SELECT FROM unnest(…)`
 * (README.md beside this file). COPY has no `ON CONFLICT`; none is needed, as rows are only
 * written while the transaction holds their chunk row still pending, and a committed row always
 * comes with its chunk marked done. Were a row there all the same, the primary key on
 * (screen_id, row_number) would fail the transaction rather than store it twice.
 */
export async function insertResults(
  tx: EntityManager,
  screenId: string,
  r: ChunkResult,
): Promise<void> {
  if (r.size === 0) return;
  const runner = tx.queryRunner;
  if (!runner)
    throw new Error('insertResults needs a transaction (EntityManager of a query runner)');
  const payload = screenResultsCopyPayload(screenId, r);
  const client = (await runner.connect()) as PoolClient;
  const copy = client.query(
    copyFrom(
      `COPY screen_results (${SCREEN_RESULT_COPY_COLUMNS.join(', ')}) FROM STDIN (FORMAT binary)`,
    ),
  );
  await pipeline(Readable.from([payload]), copy);
}

export type ChunkOutcome = 'done' | 'already-done' | 'screen-not-running' | 'missing';

/**
 * Computes and stores one chunk (the body of a `screen-chunk` job). The chunk is computed first,
 * by `compute` (the server's worker-thread pool; on the calling thread in the standalone worker
 * process, which answers no HTTP), and only then is the transaction opened that locks the chunk,
 * re-checks it is still pending and its screen still running, and writes: no transaction stays
 * open while a chunk computes.
 * @param hooks.beforeCommit test hook: runs inside the transaction after the insert
 */
export async function processChunk(
  db: DataSource,
  screenId: string,
  chunkIndex: number,
  worker: string,
  hooks: { beforeCommit?: () => Promise<void> } = {},
  compute: ComputeRunner = inlineCompute,
): Promise<ChunkOutcome> {
  // Counted outside the transaction, so attempts killed mid-way are counted too.
  await db.query(
    'UPDATE screen_chunks SET attempts = attempts + 1, worker = $3 WHERE screen_id = $1 AND chunk_index = $2',
    [screenId, chunkIndex, worker],
  );
  const chunkState = async (q: Pick<EntityManager, 'query'>, lock: boolean) => {
    const rows: Array<{
      status: string;
      screen_status: string;
      score_kind: string;
      score_floor_ev: number | null;
      score_hbar_omega_ev: number | null;
    }> = await q.query(
      `SELECT c.status, s.status AS screen_status, s.score_kind, s.score_floor_ev, s.score_hbar_omega_ev
           FROM screen_chunks c JOIN screens s ON s.id = c.screen_id
          WHERE c.screen_id = $1 AND c.chunk_index = $2${lock ? '\n          FOR UPDATE OF c' : ''}`,
      [screenId, chunkIndex],
    );
    const chunk = rows[0];
    if (!chunk) return 'missing' as const;
    if (chunk.status === 'done') return 'already-done' as const;
    if (chunk.status !== 'pending') return 'screen-not-running' as const;
    if (chunk.screen_status !== 'running') return 'screen-not-running' as const;
    return chunk;
  };
  const before = await chunkState(db.manager, false);
  if (typeof before === 'string') return before;
  const inputs: Array<{ payload: string }> = await db.query(
    'SELECT payload FROM screen_inputs WHERE screen_id = $1 AND chunk_index = $2',
    [screenId, chunkIndex],
  );
  if (!inputs[0]) return 'missing';
  const score: ScoreChoice = {
    kind: before.score_kind as ScoreKind,
    floorEv: before.score_floor_ev ?? undefined,
    assumedHbarOmegaEv: before.score_hbar_omega_ev ?? undefined,
  };
  const result = await compute.run(
    'screenChunk',
    [decodeInputChunk(chunkIndex, inputs[0].payload), score],
    {
      budget: 'background',
      advice: 'Split the screen into smaller ones, or use a larger ħω in its rows.',
    },
  );
  return db.transaction(async (tx) => {
    // Another worker may have stored the chunk, or the screen been cancelled, meanwhile.
    const now = await chunkState(tx, true);
    if (typeof now === 'string') return now;
    await insertResults(tx, screenId, result);
    await hooks.beforeCommit?.();
    await tx.query(
      `UPDATE screen_chunks SET status = 'done', finished_at = now() WHERE screen_id = $1 AND chunk_index = $2`,
      [screenId, chunkIndex],
    );
    await tx.query(
      `UPDATE screens SET rows_done = rows_done + $2, chunks_done = chunks_done + 1,
              status = CASE WHEN chunks_done + 1 >= chunk_count AND status = 'running' THEN 'done' ELSE status END,
              finished_at = CASE WHEN chunks_done + 1 >= chunk_count AND status = 'running' THEN now() ELSE finished_at END
        WHERE id = $1`,
      [screenId, result.size],
    );
    return 'done';
  });
}
