/**
 * Demo data for reviews: a submitted report of DA-3 in the demo lab, written by the demo editor,
 * so `reviewer@gapwise.test` finds it under "Reviews waiting for me". Idempotent (matched by
 * title in the lab). Goes through the same use-cases as the API (snapshot, audit, outbox).
 */
import type { DataSource } from 'typeorm';
import type { Config } from '../config';
import { inlineCompute } from '../compute/compute-tasks';
import { createReport, transitionReport } from './report-use-case';

export const DEMO_REPORT_TITLE = 'DA-3 photoinduced charge separation: rate estimate for review';

export async function seedDemoReport(
  dataSource: DataSource,
  options: { labName: string; editorEmail: string; publicUrl?: string },
): Promise<boolean> {
  const [lab] = await dataSource.query(
    'SELECT id FROM workspaces WHERE name = $1 ORDER BY created_at LIMIT 1',
    [options.labName],
  );
  const [editor] = await dataSource.query('SELECT id FROM users WHERE email = $1', [
    options.editorEmail,
  ]);
  if (!lab || !editor) return false;
  const [pair] = await dataSource.query(
    'SELECT id FROM pairs WHERE workspace_id = $1 AND name = $2',
    [lab.id, 'DA-3'],
  );
  if (!pair) return false;
  const [existing] = await dataSource.query(
    'SELECT id FROM reports WHERE workspace_id = $1 AND title = $2',
    [lab.id, DEMO_REPORT_TITLE],
  );
  if (existing) return false;
  const deps = {
    dataSource,
    config: { publicUrl: options.publicUrl ?? 'http://127.0.0.1:4280' } as Config,
    queue: null,
    // The seed is a one-shot command with no HTTP to answer: its one report computes inline.
    compute: inlineCompute,
  };
  const report = await createReport(deps, editor.id, lab.id, {
    pairIds: [pair.id],
    kind: 'pair',
    title: DEMO_REPORT_TITLE,
  });
  await transitionReport(
    deps,
    editor.id,
    report.reportId,
    'submit',
    'Ready for review: please check the coupling source.',
  );
  return true;
}
