/**
 * The entities (db/entities) declare the same schema the migrations build: on a freshly migrated
 * database TypeORM's schema builder finds nothing to change. A failure lists the statements it
 * would run, which name the entity column, index or key that drifted.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { DataSource } from 'typeorm';
import { createDataSource } from '@gapwise/db';
import { createTestDatabase, type TestDatabase } from './support/test-database';

let database: TestDatabase;
let dataSource: DataSource;
beforeAll(async () => {
  database = await createTestDatabase();
  dataSource = createDataSource({ url: database.url, poolSize: 1 });
  await dataSource.initialize();
  await dataSource.runMigrations({ transaction: 'each' });
});
afterAll(async () => {
  if (dataSource?.isInitialized) await dataSource.destroy();
  await database?.drop();
});

describe('schema drift', () => {
  it('the schema builder needs no statement to sync the entities with the migrated database', async () => {
    const sql = await dataSource.driver.createSchemaBuilder().log();
    expect(sql.upQueries.map((q) => q.query)).toEqual([]);
  });
});
