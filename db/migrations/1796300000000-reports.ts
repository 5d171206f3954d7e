import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Reports with frozen snapshots, their threaded comments and their review transitions. */
export class Reports1796300000000 implements MigrationInterface {
  name = 'Reports1796300000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE "reports" (
      "id" uuid NOT NULL DEFAULT gen_random_uuid(),
      "workspace_id" uuid NOT NULL,
      "kind" text NOT NULL,
      "title" text NOT NULL,
      "status" text NOT NULL DEFAULT 'draft',
      "author_id" uuid,
      "pair_ids" uuid array NOT NULL DEFAULT '{}',
      "snapshot" jsonb NOT NULL,
      "snapshot_id" text NOT NULL,
      "revision" integer NOT NULL DEFAULT 1,
      "pdf_key" text,
      "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      CONSTRAINT "PK_reports" PRIMARY KEY ("id"),
      CONSTRAINT "CHK_reports_kind" CHECK ("kind" IN ('pair', 'comparison')),
      CONSTRAINT "CHK_reports_status" CHECK ("status" IN ('draft', 'submitted', 'changes-requested', 'approved')),
      CONSTRAINT "FK_reports_workspace" FOREIGN KEY ("workspace_id") REFERENCES "workspaces"("id") ON DELETE CASCADE,
      CONSTRAINT "FK_reports_author" FOREIGN KEY ("author_id") REFERENCES "users"("id") ON DELETE SET NULL
    )`);
    await queryRunner.query(
      `CREATE INDEX "idx_reports_workspace_status" ON "reports" ("workspace_id", "status")`,
    );
    await queryRunner.query(`CREATE TABLE "report_comments" (
      "id" uuid NOT NULL DEFAULT gen_random_uuid(),
      "report_id" uuid NOT NULL,
      "author_id" uuid,
      "body" text NOT NULL,
      "anchor" text,
      "parent_id" uuid,
      "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      CONSTRAINT "PK_report_comments" PRIMARY KEY ("id"),
      CONSTRAINT "FK_report_comments_report" FOREIGN KEY ("report_id") REFERENCES "reports"("id") ON DELETE CASCADE,
      CONSTRAINT "FK_report_comments_author" FOREIGN KEY ("author_id") REFERENCES "users"("id") ON DELETE SET NULL,
      CONSTRAINT "FK_report_comments_parent" FOREIGN KEY ("parent_id") REFERENCES "report_comments"("id") ON DELETE CASCADE
    )`);
    await queryRunner.query(
      `CREATE INDEX "idx_report_comments_report" ON "report_comments" ("report_id", "created_at")`,
    );
    await queryRunner.query(`CREATE TABLE "report_transitions" (
      "id" uuid NOT NULL DEFAULT gen_random_uuid(),
      "report_id" uuid NOT NULL,
      "from_status" text,
      "to_status" text NOT NULL,
      "by_id" uuid,
      "at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      "note" text,
      CONSTRAINT "PK_report_transitions" PRIMARY KEY ("id"),
      CONSTRAINT "FK_report_transitions_report" FOREIGN KEY ("report_id") REFERENCES "reports"("id") ON DELETE CASCADE,
      CONSTRAINT "FK_report_transitions_by" FOREIGN KEY ("by_id") REFERENCES "users"("id") ON DELETE SET NULL
    )`);
    await queryRunner.query(
      `CREATE INDEX "idx_report_transitions_report" ON "report_transitions" ("report_id", "at")`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TABLE "report_transitions"`);
    await queryRunner.query(`DROP TABLE "report_comments"`);
    await queryRunner.query(`DROP TABLE "reports"`);
  }
}
