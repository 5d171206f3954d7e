/**
 * Screen results have no per-row foreign key (migration 1796500000000, for insert speed); a
 * trigger on `screens` deletes them with their screen. Deleting a screen, or the workspace that
 * holds it, must leave no result row behind, and must not touch another screen's rows.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { computeChunk } from '../../../apps/api/src/screens/chunk-computer';
import { parseScreenCsv, type InputChunk } from '../../../apps/api/src/screens/screen-parser';
import { insertResults } from '../../../apps/api/src/screens/screen-results-writer';
import { startTestApp, type TestApp } from '../support/test-app';
import { screenCsv } from './screen-csv';

let t: TestApp;
let userId: string;
beforeAll(async () => {
  t = await startTestApp();
  userId = (
    await t.db.query(
      `INSERT INTO users (email, display_name, password_hash) VALUES ('cascade@example.test', 'C', 'x') RETURNING id`,
    )
  )[0].id;
});
afterAll(async () => t?.close());

async function workspace(name: string): Promise<string> {
  return (await t.db.query(`INSERT INTO workspaces (name) VALUES ($1) RETURNING id`, [name]))[0].id;
}

/** A screen with `rows` stored results, written by the workers' own insert. */
async function screenWithResults(workspaceId: string, rows: number): Promise<string> {
  const id: string = (
    await t.db.query(
      `INSERT INTO screens (workspace_id, name, status, input_hash, software_version, score_kind, chunk_size, created_by)
       VALUES ($1, 'cascade', 'running', '', 'test', 'cs-fast-cr-inverted', $2, $3) RETURNING id`,
      [workspaceId, rows, userId],
    )
  )[0].id;
  let chunk: InputChunk | null = null;
  await parseScreenCsv(screenCsv(rows, 5), { chunkSize: rows, onChunk: (c) => void (chunk = c) });
  const result = computeChunk(chunk!, { kind: 'cs-fast-cr-inverted' });
  await t.db.transaction((tx) => insertResults(tx, id, result));
  return id;
}

async function resultCount(screenId: string): Promise<number> {
  return (
    await t.db.query('SELECT count(*)::int AS n FROM screen_results WHERE screen_id = $1', [
      screenId,
    ])
  )[0].n;
}

describe('screen results cascade', () => {
  it('go with their screen, and only theirs', async () => {
    const ws = await workspace('cascade A');
    const doomed = await screenWithResults(ws, 30);
    const kept = await screenWithResults(ws, 20);
    expect(await resultCount(doomed)).toBe(30);
    await t.db.query('DELETE FROM screens WHERE id = $1', [doomed]);
    expect(await resultCount(doomed)).toBe(0);
    expect(await resultCount(kept)).toBe(20);
  });

  it('go with the workspace that holds their screen', async () => {
    const ws = await workspace('cascade B');
    const screen = await screenWithResults(ws, 25);
    expect(await resultCount(screen)).toBe(25);
    await t.db.query('DELETE FROM workspaces WHERE id = $1', [ws]);
    expect(await resultCount(screen)).toBe(0);
  });
});
