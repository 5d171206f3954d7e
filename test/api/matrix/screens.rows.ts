import type { ScreenService } from '../../../apps/api/src/screens/screen-queue';
import { processChunk } from '../../../apps/api/src/screens/screen-results-writer';
import { uploadScreen } from '../../../apps/api/src/screens/screen-use-case';
import { screenCsv } from '../screens/screen-csv';
import { editors, everyone, members, type CaseContext, type MatrixRow } from './matrix-types';

// The matrix compares table fingerprints around denied writes: a worker inside the test server
// finishing an earlier case's chunks would change them, so this process runs none (the rows drive
// chunks themselves). Set before matrix.spec.ts starts its server (rows load eagerly).
process.env['GAPWISE_SCREEN_WORKER'] = 'false';

/** A queue that queues nothing: the matrix drives chunks itself (or leaves them pending). */
const noQueue: ScreenService = {
  boss: null as never,
  queueOptions: { expireInSeconds: 120, retryLimit: 1 },
  worker: null,
  enqueue: async () => undefined,
  stop: async () => undefined,
};

/** A fresh screen of the case's workspace, uploaded by its owner: running (nothing computed) or done. */
async function screen(
  c: CaseContext,
  state: 'running' | 'done',
): Promise<{ id: string; firstLine: number }> {
  const db = c.t.db;
  const s = await uploadScreen(db, noQueue, c.users.owner.id, c.workspaceId, screenCsv(4, 7), {
    name: c.unique('matrix-screen'),
    runGoodRows: false,
    score: { kind: 'cs-fast-cr-inverted' },
    chunkSize: 50,
  });
  if (state === 'done') {
    for (let i = 0; i < s.progress.chunkCount; i++) await processChunk(db, s.id, i, 'matrix');
  }
  const [row] = await db.query(
    'SELECT min(first_line)::int AS line FROM screen_chunks WHERE screen_id = $1',
    [s.id],
  );
  return { id: s.id, firstLine: row.line };
}

/** Matrix rows of the screen API. */
export const rows: MatrixRow[] = [
  {
    method: 'get',
    route: '/screens/template.csv',
    request: () => ({ path: '/screens/template.csv' }),
    expect: everyone(200),
  },
  {
    method: 'get',
    route: '/screens/options',
    request: () => ({ path: '/screens/options' }),
    expect: everyone(200),
  },
  {
    method: 'post',
    route: '/workspaces/:wid/screens',
    request: (c) => ({
      path: `/workspaces/${c.workspaceId}/screens?name=${c.unique('up')}`,
      body: { csv: screenCsv(3, 11) },
    }),
    expect: editors(201),
  },
  {
    method: 'get',
    route: '/workspaces/:wid/screens',
    request: (c) => ({ path: `/workspaces/${c.workspaceId}/screens` }),
    expect: members(200),
  },
  {
    method: 'get',
    route: '/screens/:id',
    request: async (c) => ({ path: `/screens/${(await screen(c, 'running')).id}` }),
    expect: members(200),
  },
  {
    method: 'post',
    route: '/screens/:id/cancel',
    request: async (c) => ({ path: `/screens/${(await screen(c, 'running')).id}/cancel` }),
    expect: editors(200),
  },
  // A finished screen of this software version is reused: 200 with reused true.
  {
    method: 'post',
    route: '/screens/:id/run',
    request: async (c) => ({ path: `/screens/${(await screen(c, 'done')).id}/run` }),
    expect: editors(200),
  },
  {
    method: 'get',
    route: '/screens/:id/results',
    request: async (c) => ({
      path: `/screens/${(await screen(c, 'done')).id}/results?sort=-score&limit=10`,
    }),
    expect: members(200),
  },
  {
    method: 'get',
    route: '/screens/:id/results.csv',
    request: async (c) => ({
      path: `/screens/${(await screen(c, 'done')).id}/results.csv?regimeCr=inverted`,
    }),
    expect: members(200),
  },
  {
    method: 'post',
    route: '/screens/:id/results/:row/open-as-pair',
    request: async (c) => {
      const s = await screen(c, 'done');
      return { path: `/screens/${s.id}/results/${s.firstLine}/open-as-pair` };
    },
    expect: editors(201),
  },
];
