/**
 * Writes one computed chunk idempotently: in ONE transaction the chunk row is locked, skipped
 * when already done (or its screen is no longer running), its results inserted with
 * `ON CONFLICT DO NOTHING` on (screen_id, row_number), the chunk marked done and the screen's
 * counters advanced. A worker killed anywhere inside loses the whole transaction, so a retry
 * neither loses nor duplicates rows.
 */
import type { DataSource, EntityManager } from 'typeorm';
import { inlineCompute, type ComputeRunner } from '../compute/compute-tasks';
import { REGIMES, type ChunkResult } from './chunk-computer';
import { float8ArrayParam, int4ArrayParam, textArrayParam } from './pg-binary-array';
import { decodeInputChunk } from './screen-parser';
import type { ScoreChoice, ScoreKind } from './screen-score';

/**
 * Inserts the rows of a chunk result (ignoring rows already there). Columns travel as binary
 * arrays (`pg-binary-array.ts`); a value that could not be computed (non-finite) is stored as
 * NULL, and so is the regime of a rate that could not be computed.
 */
export async function insertResults(
  tx: EntityManager,
  screenId: string,
  r: ChunkResult,
): Promise<void> {
  const regime = (codes: Uint8Array, valid: Float64Array) =>
    textArrayParam(Array.from(codes, (c, i) => (Number.isFinite(valid[i]) ? REGIMES[c]! : null)));
  await tx.query(
    `INSERT INTO screen_results (screen_id, row_number, donor, acceptor, solvent, delta_g_cs,
       delta_g_cr, lambda_inner, lambda_outer, lambda_total, coupling, temperature_k,
       log10k_cs_marcus, log10k_cr_marcus, log10k_cs_mlj, log10k_cr_mlj, regime_cs, regime_cr,
       warning_mask, score)
     SELECT $1, * FROM unnest($2::int[], $3::text[], $4::text[], $5::text[], $6::float8[],
       $7::float8[], $8::float8[], $9::float8[], $10::float8[], $11::float8[], $12::float8[],
       $13::float8[], $14::float8[], $15::float8[], $16::float8[], $17::text[], $18::text[],
       $19::int[], $20::float8[])
     ON CONFLICT (screen_id, row_number) DO NOTHING`,
    [
      screenId,
      int4ArrayParam(r.lines),
      textArrayParam(r.donor),
      textArrayParam(r.acceptor),
      textArrayParam(r.solvent),
      float8ArrayParam(r.deltaGCs),
      float8ArrayParam(r.deltaGCr),
      float8ArrayParam(r.lambdaInner),
      float8ArrayParam(r.lambdaOuter),
      float8ArrayParam(r.lambdaTotal),
      float8ArrayParam(r.coupling),
      float8ArrayParam(r.temperature),
      float8ArrayParam(r.log10kCsMarcus),
      float8ArrayParam(r.log10kCrMarcus),
      float8ArrayParam(r.log10kCsMlj),
      float8ArrayParam(r.log10kCrMlj),
      regime(r.regimeCs, r.log10kCsMarcus),
      regime(r.regimeCr, r.log10kCrMarcus),
      int4ArrayParam(r.warningMask),
      float8ArrayParam(r.score),
    ],
  );
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
    }> = await q.query(
      `SELECT c.status, s.status AS screen_status, s.score_kind, s.score_floor_ev
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
