/**
 * Seeds the demo workspaces and accounts (idempotent): `npx tsx db/seed/seed-demo.ts`.
 * The four demo accounts share the password `gapwise-demo`: change or drop them for real use.
 * Applies pending migrations first. DATABASE_URL defaults to the development cluster.
 */
import { createDataSource, DEFAULT_DATABASE_URL } from '../data-source';
import { DEMO_ACCOUNTS, DEMO_LAB, DEMO_PASSWORD, seedDemo } from './demo-data';
import { seedDemoReport } from '../../apps/api/src/reports/demo-report-seed';

const dataSource = createDataSource({ url: process.env['DATABASE_URL'] || DEFAULT_DATABASE_URL, poolSize: 2 });
try {
  await dataSource.initialize();
  await dataSource.runMigrations({ transaction: 'each' });
  const report = await seedDemo(dataSource);
  console.log(`demo seed: ${report.users} user(s), ${report.workspaces} workspace(s), ${report.pairs} pair(s) added`);
  // A submitted report in the demo lab for the demo reviewer (apps/api/src/reports/demo-report-seed.ts).
  if (await seedDemoReport(dataSource, { labName: DEMO_LAB, editorEmail: 'editor@gapwise.test', publicUrl: process.env['PUBLIC_URL'] })) {
    console.log('demo seed: 1 submitted report added');
  }
  console.log(`demo sign-ins (password ${DEMO_PASSWORD}): ${DEMO_ACCOUNTS.map((a) => a.email).join(', ')}`);
} catch (error) {
  console.error(`demo seed failed: ${(error as Error).message}`);
  process.exitCode = 1;
} finally {
  if (dataSource.isInitialized) await dataSource.destroy();
}
