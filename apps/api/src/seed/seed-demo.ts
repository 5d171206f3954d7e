/**
 * Seeds the demo workspaces and accounts (idempotent): `npx tsx apps/api/src/seed/seed-demo.ts`.
 * It lives in the API because every write goes through the API's use-cases (db imports no app).
 * The four demo accounts share the password `gapwise-demo`: change or drop them for real use.
 * Applies pending migrations first. DATABASE_URL defaults to the development cluster.
 */
import { createDataSource } from '@gapwise/db';
import { DEMO_ACCOUNTS, DEMO_LAB, DEMO_MEDIATORS, DEMO_PASSWORD, seedDemo } from './demo-data';
import { seedDemoReport } from '../reports/demo-report-seed';
import { seedDemoScreensAndSeries } from '../screens/demo-screen-seed';
import { seedDemoTraces } from '../traces/demo-trace-seed';
import { seedDemoCascades } from '../cascades/demo-cascade-seed';
import { seedDemoElectrodeCases } from '../electrodes/demo-electrode-seed';
import { seedDemoMaterials } from '../materials/demo-material-seed';
import { TraceObjectStore } from '../traces/trace-object-store';
import { loadConfig } from '../config';

// The server's configuration, validated the same way (a bad variable stops the seed, named).
const config = loadConfig();
const dataSource = createDataSource({ url: config.databaseUrl, poolSize: 2 });
try {
  await dataSource.initialize();
  await dataSource.runMigrations({ transaction: 'each' });
  // The server's configured bcrypt cost (BCRYPT_COST), so a demo account takes as long to check
  // as any other account and as an unknown address.
  const report = await seedDemo(dataSource, { bcryptCost: config.bcryptCost });
  console.log(
    `demo seed: ${report.users} user(s), ${report.workspaces} workspace(s), ${report.pairs} pair(s) added`,
  );
  // A submitted report in the demo lab for the demo reviewer (apps/api/src/reports/demo-report-seed.ts).
  if (
    await seedDemoReport(dataSource, {
      labName: DEMO_LAB,
      editorEmail: 'editor@gapwise.test',
      publicUrl: config.publicUrl,
    })
  ) {
    console.log('demo seed: 1 submitted report added');
  }
  // A finished demo screen (flow-cell workspace) and a fitted demo series (lab).
  const added = await seedDemoScreensAndSeries(dataSource, {
    mediatorsName: DEMO_MEDIATORS,
    labName: DEMO_LAB,
    ownerEmail: 'owner@gapwise.test',
    editorEmail: 'editor@gapwise.test',
  });
  if (added.screen || added.series)
    console.log(
      `demo seed: ${added.screen ? '1 screen' : ''}${added.screen && added.series ? ' and ' : ''}${added.series ? '1 series' : ''} added`,
    );
  // A triad cascade and its bridgeless dyad in the lab (apps/api/src/cascades/demo-cascade-seed.ts).
  const cascades = await seedDemoCascades(dataSource, {
    labName: DEMO_LAB,
    editorEmail: 'editor@gapwise.test',
  });
  if (cascades) console.log(`demo seed: ${cascades} cascade(s) added`);
  // A ferrocenyl monolayer electrode case with measured k(η) (apps/api/src/electrodes/demo-electrode-seed.ts).
  const electrodes = await seedDemoElectrodeCases(dataSource, {
    labName: DEMO_LAB,
    editorEmail: 'editor@gapwise.test',
  });
  if (electrodes) console.log(`demo seed: ${electrodes} electrode case(s) added`);
  // An invented organic-semiconductor layer (apps/api/src/materials/demo-material-seed.ts).
  if (
    await seedDemoMaterials(dataSource, { labName: DEMO_LAB, editorEmail: 'editor@gapwise.test' })
  )
    console.log('demo seed: 1 material case added');
  // Demo energy-gap traces (lab) in object storage with a finished analysis: needs the S3 store.
  if (config.objectStore.endpointSet) {
    const store = new TraceObjectStore(config.objectStore);
    try {
      const t = await seedDemoTraces(dataSource, store, {
        labName: DEMO_LAB,
        editorEmail: 'editor@gapwise.test',
      });
      if (t.traces || t.analysis)
        console.log(
          `demo seed: ${t.traces} trace(s)${t.analysis ? ' and 1 finished trace analysis' : ''} added`,
        );
    } finally {
      store.destroy();
    }
  } else {
    console.log(
      'demo seed: demo traces skipped (S3_ENDPOINT is not set; npm start starts the S3 store and sets it)',
    );
  }
  console.log(
    `demo sign-ins (password ${DEMO_PASSWORD}): ${DEMO_ACCOUNTS.map((a) => a.email).join(', ')}`,
  );
} catch (error) {
  console.error(`demo seed failed: ${(error as Error).message}`);
  process.exitCode = 1;
} finally {
  if (dataSource.isInitialized) await dataSource.destroy();
}
