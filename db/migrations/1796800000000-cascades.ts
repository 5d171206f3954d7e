import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Cascades (multi-step ET networks of a workspace) and their immutable versions. */
export class Cascades1796800000000 implements MigrationInterface {
  name = 'Cascades1796800000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "cascades" (
      "id" uuid NOT NULL DEFAULT gen_random_uuid(),
      "workspace_id" uuid NOT NULL,
      "name" text NOT NULL,
      "notes" text NOT NULL DEFAULT '',
      "network" jsonb NOT NULL,
      "results" jsonb,
      "long_lived_yield" double precision,
      "long_lived_lifetime_s" double precision,
      "version" integer NOT NULL DEFAULT 1,
      "created_by" uuid,
      "updated_by" uuid,
      "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      CONSTRAINT "PK_cascades" PRIMARY KEY ("id"),
      CONSTRAINT "FK_cascades_workspace" FOREIGN KEY ("workspace_id") REFERENCES "workspaces"("id") ON DELETE CASCADE,
      CONSTRAINT "FK_cascades_created_by" FOREIGN KEY ("created_by") REFERENCES "users"("id") ON DELETE SET NULL,
      CONSTRAINT "FK_cascades_updated_by" FOREIGN KEY ("updated_by") REFERENCES "users"("id") ON DELETE SET NULL
    )`);
    await q.query(`CREATE INDEX "idx_cascades_workspace" ON "cascades" ("workspace_id")`);
    await q.query(`CREATE TABLE "cascade_versions" (
      "id" uuid NOT NULL DEFAULT gen_random_uuid(),
      "cascade_id" uuid NOT NULL,
      "version" integer NOT NULL,
      "snapshot" jsonb NOT NULL,
      "summary" text NOT NULL,
      "created_by" uuid,
      "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      CONSTRAINT "PK_cascade_versions" PRIMARY KEY ("id"),
      CONSTRAINT "uq_cascade_versions_cascade_version" UNIQUE ("cascade_id", "version"),
      CONSTRAINT "FK_cascade_versions_cascade" FOREIGN KEY ("cascade_id") REFERENCES "cascades"("id") ON DELETE CASCADE,
      CONSTRAINT "FK_cascade_versions_created_by" FOREIGN KEY ("created_by") REFERENCES "users"("id") ON DELETE SET NULL
    )`);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "cascade_versions"`);
    await q.query(`DROP TABLE "cascades"`);
  }
}
