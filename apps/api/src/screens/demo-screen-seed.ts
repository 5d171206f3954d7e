/**
 * Demo data for screens and series (invented): a finished screen of the 200 "Med-n" mediator
 * pairs of `db/seed/screens/demo-mediator-screen.csv` in the flow-cell workspace, and a fitted
 * driving-force series of the DA dyads in the demo lab. Idempotent (matched by name in the
 * workspace); goes through the same use-cases as the API, and computes the screen's chunks in
 * this process (no queue needed).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { DataSource } from 'typeorm';
import { inlineCompute } from '../compute/compute-tasks';
import { REPO_ROOT } from '../config';
import { createSeries, fitSeriesUseCase } from '../series/series-use-case';
import type { ScreenService } from './screen-queue';
import { processChunk } from './screen-results-writer';
import { uploadScreen } from './screen-use-case';

export const DEMO_SCREEN_NAME = 'Med-n mediator pairs, photo-charging screen (demo)';
export const DEMO_SERIES_NAME = 'DA dyads: charge recombination against driving force (demo)';
export const DEMO_SCREEN_CSV = join(REPO_ROOT, 'db/seed/screens/demo-mediator-screen.csv');

/**
 * Invented recombination rates of eight dyads in MeCN at 298 K (ΔG° in kJ/mol as typed in the
 * lab's notebook; log10 k with σ), close to λ ≈ 0.97 eV, |H_AB| ≈ 0.4 meV, with the fall-off of the
 * inverted region.
 */
const DEMO_SERIES_POINTS: ReadonlyArray<[string, number, number, number]> = [
  ['DA-1', -38.6, 7.62, 0.15],
  ['DA-2', -53.1, 8.55, 0.12],
  ['DA-3', -67.5, 9.19, 0.1],
  ['DA-4', -81.0, 9.62, 0.1],
  ['DA-5', -96.5, 9.66, 0.12],
  ['DA-6', -111.0, 9.43, 0.15],
  ['DA-7', -125.4, 8.94, 0.15],
  ['DA-8', -144.7, 8.01, 0.2],
];

const noQueue: ScreenService = {
  boss: null as never,
  queueOptions: { expireInSeconds: 120, retryLimit: 1 },
  worker: null,
  enqueue: async () => undefined,
  stop: async () => undefined,
};

async function workspaceId(db: DataSource, name: string): Promise<string | null> {
  const [w] = await db.query(
    'SELECT id FROM workspaces WHERE name = $1 ORDER BY created_at LIMIT 1',
    [name],
  );
  return w?.id ?? null;
}

async function userId(db: DataSource, email: string): Promise<string | null> {
  const [u] = await db.query('SELECT id FROM users WHERE email = $1', [email]);
  return u?.id ?? null;
}

/** Adds what is missing; answers what it added. */
export async function seedDemoScreensAndSeries(
  db: DataSource,
  options: { mediatorsName: string; labName: string; ownerEmail: string; editorEmail: string },
): Promise<{ screen: boolean; series: boolean }> {
  const added = { screen: false, series: false };
  const mediators = await workspaceId(db, options.mediatorsName);
  const owner = await userId(db, options.ownerEmail);
  if (mediators && owner) {
    const [existing] = await db.query(
      'SELECT id FROM screens WHERE workspace_id = $1 AND name = $2',
      [mediators, DEMO_SCREEN_NAME],
    );
    if (!existing) {
      const screen = await uploadScreen(
        db,
        noQueue,
        owner,
        mediators,
        readFileSync(DEMO_SCREEN_CSV, 'utf8'),
        {
          name: DEMO_SCREEN_NAME,
          runGoodRows: false,
          score: { kind: 'cs-fast-cr-inverted' },
          chunkSize: 50,
        },
      );
      for (let i = 0; i < screen.progress.chunkCount; i++)
        await processChunk(db, screen.id, i, 'demo-seed');
      added.screen = true;
    }
  }
  const lab = await workspaceId(db, options.labName);
  const editor = await userId(db, options.editorEmail);
  if (lab && editor) {
    const [existing] = await db.query(
      'SELECT id FROM series WHERE workspace_id = $1 AND name = $2',
      [lab, DEMO_SERIES_NAME],
    );
    if (!existing) {
      const series = await createSeries(db, editor, lab, {
        name: DEMO_SERIES_NAME,
        temperature: 298.15,
        energyUnit: 'kJ/mol',
        notes: 'Invented demo data: transient-absorption decay rates of the radical-ion pairs.',
        points: DEMO_SERIES_POINTS.map(([label, deltaG0, log10k, sigmaLog10k]) => ({
          label,
          deltaG0,
          log10k,
          sigmaLog10k,
        })),
      } as never);
      await fitSeriesUseCase(db, inlineCompute, editor, series.id, {
        model: 'marcus',
        hbarOmega: 0.18,
        lambdaVib: 0.25,
      });
      added.series = true;
    }
  }
  return added;
}
