import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A record of every deleted workspace (who, when, what it held), outside the workspace's
 * cascade: no foreign keys, so neither the workspace's deletion nor a later account deletion
 * removes it.
 */
export class WorkspaceDeletions1796600000000 implements MigrationInterface {
  name = 'WorkspaceDeletions1796600000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE "workspace_deletions" (
      "id" uuid NOT NULL DEFAULT gen_random_uuid(),
      "workspace_id" uuid NOT NULL,
      "workspace_name" text NOT NULL,
      "deleted_by" uuid,
      "deleted_by_email" text NOT NULL,
      "deleted_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      "pair_count" integer NOT NULL,
      "report_count" integer NOT NULL,
      "screen_count" integer NOT NULL,
      "trace_count" integer NOT NULL,
      "series_count" integer NOT NULL,
      "member_count" integer NOT NULL,
      CONSTRAINT "PK_workspace_deletions" PRIMARY KEY ("id")
    )`);
    await queryRunner.query(
      `CREATE INDEX "idx_workspace_deletions_deleted_at" ON "workspace_deletions" ("deleted_at")`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "idx_workspace_deletions_deleted_at"`);
    await queryRunner.query(`DROP TABLE "workspace_deletions"`);
  }
}
