/**
 * The demo scenario at the API level: the seeded lab has a submitted report; the demo reviewer
 * finds it waiting, reads inputs with provenance, comments on the coupling, approves; the author
 * (the demo editor) receives the e-mail; the PDF prints the numbers the JSON holds.
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatLog10, formatRate, type ReportListItem, type ReportView } from '@gapwise/contracts';
import { DEMO_LAB, DEMO_PASSWORD, seedDemo } from '../../apps/api/src/seed/demo-data';
import { DEMO_REPORT_TITLE, seedDemoReport } from '../../apps/api/src/reports/demo-report-seed';
import { signIn, startTestApp, type TestApp } from './support/test-app';

let t: TestApp;

beforeAll(async () => {
  execFileSync('bash', ['docker-free-scripts/poppler-ensure.sh'], { stdio: 'inherit' });
  t = await startTestApp();
  await seedDemo(t.db, { bcryptCost: 4 });
  expect(
    await seedDemoReport(t.db, { labName: DEMO_LAB, editorEmail: 'editor@gapwise.test' }),
  ).toBe(true);
  // Idempotent.
  expect(
    await seedDemoReport(t.db, { labName: DEMO_LAB, editorEmail: 'editor@gapwise.test' }),
  ).toBe(false);
});
afterAll(async () => t?.close());

describe('demo review', () => {
  it('reviewer opens the submitted demo report, comments on the coupling, approves; the author is e-mailed; the PDF shows the same numbers', async () => {
    const reviewer = await signIn(t.app, 'reviewer@gapwise.test', DEMO_PASSWORD);
    const waiting = (await reviewer.get('/api/reviews/waiting').expect(200))
      .body as ReportListItem[];
    const item = waiting.find((r) => r.title === DEMO_REPORT_TITLE)!;
    expect(item).toBeDefined();
    expect(item.status).toBe('submitted');
    const view = (await reviewer.get(`/api/reports/${item.id}`).expect(200)).body as ReportView;
    const coupling = view.snapshot.pairs[0].inputs.find((i) => i.kind === 'coupling')!;
    expect(coupling.provenance.kind).toBeTruthy();
    await reviewer
      .post(`/api/reports/${item.id}/comments`, {
        body: 'Is the coupling from the CT band or from GMH?',
        anchor: 'coupling',
      })
      .expect(201);
    t.mail.clear();
    const approved = (
      await reviewer
        .post(`/api/reports/${item.id}/approve`, { note: 'Approved for the group meeting' })
        .expect(200)
    ).body as ReportView;
    expect(approved.status).toBe('approved');
    const mail = await t.mail.waitFor(
      (m) => m.to.includes('editor@gapwise.test') && m.subject === `Approved: ${DEMO_REPORT_TITLE}`,
    );
    expect(mail.text).toContain(`/reports/${item.id}`);

    const res = await reviewer
      .get(`/api/reports/${item.id}/pdf`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      })
      .expect(200);
    const dir = join(process.cwd(), 'test-output', 'reports');
    mkdirSync(dir, { recursive: true });
    const file = join(dir, 'demo-approved.pdf');
    writeFileSync(file, res.body as Buffer);
    const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' }).replace(
      /\s+/g,
      ' ',
    );
    const primary = approved.snapshot.pairs[0].results.find((r) => r.primary)!;
    expect(text).toContain(
      `k = ${formatRate(primary.k)} (log10 k = ${formatLog10(primary.log10k)})`,
    );
    expect(text).toContain('APPROVED');
    expect(text).toContain('Is the coupling from the CT band or from GMH?');
    expect(text).toContain('Submitted → Approved');
  });
});
