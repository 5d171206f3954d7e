import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A report's subject may be a cascade (issue 17): kind `cascade`, the cascade and the version its
 * snapshot was frozen from. Deleting the cascade keeps the report (its snapshot is self-contained);
 * the link is then null.
 */
export class CascadeReports1796810000000 implements MigrationInterface {
  name = 'CascadeReports1796810000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "reports" DROP CONSTRAINT "CHK_reports_kind"`);
    await q.query(
      `ALTER TABLE "reports" ADD CONSTRAINT "CHK_reports_kind" CHECK ("kind" IN ('pair', 'comparison', 'cascade'))`,
    );
    await q.query(`ALTER TABLE "reports" ADD "cascade_id" uuid`);
    await q.query(`ALTER TABLE "reports" ADD "cascade_version" integer`);
    await q.query(
      `ALTER TABLE "reports" ADD CONSTRAINT "FK_reports_cascade" FOREIGN KEY ("cascade_id") REFERENCES "cascades"("id") ON DELETE SET NULL`,
    );
    await q.query(`CREATE INDEX "idx_reports_cascade" ON "reports" ("cascade_id")`);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`DELETE FROM "reports" WHERE "kind" = 'cascade'`);
    await q.query(`DROP INDEX "idx_reports_cascade"`);
    await q.query(`ALTER TABLE "reports" DROP CONSTRAINT "FK_reports_cascade"`);
    await q.query(`ALTER TABLE "reports" DROP COLUMN "cascade_version"`);
    await q.query(`ALTER TABLE "reports" DROP COLUMN "cascade_id"`);
    await q.query(`ALTER TABLE "reports" DROP CONSTRAINT "CHK_reports_kind"`);
    await q.query(
      `ALTER TABLE "reports" ADD CONSTRAINT "CHK_reports_kind" CHECK ("kind" IN ('pair', 'comparison'))`,
    );
  }
}
