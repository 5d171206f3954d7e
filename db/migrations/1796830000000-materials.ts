import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Material cases (charge transport by hopping, issue 18) and their immutable versions. */
export class Materials1796830000000 implements MigrationInterface {
  name = 'Materials1796830000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "materials" (
      "id" uuid NOT NULL DEFAULT gen_random_uuid(),
      "workspace_id" uuid NOT NULL,
      "name" text NOT NULL,
      "notes" text NOT NULL DEFAULT '',
      "lambda_ev" double precision NOT NULL,
      "lambda_sigma_ev" double precision,
      "temperature_k" double precision NOT NULL,
      "dimensions" integer NOT NULL,
      "neighbours" jsonb NOT NULL,
      "results" jsonb,
      "mobility_cm2_per_vs" double precision,
      "version" integer NOT NULL DEFAULT 1,
      "created_by" uuid,
      "updated_by" uuid,
      "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      CONSTRAINT "PK_materials" PRIMARY KEY ("id"),
      CONSTRAINT "FK_materials_workspace" FOREIGN KEY ("workspace_id") REFERENCES "workspaces"("id") ON DELETE CASCADE,
      CONSTRAINT "FK_materials_created_by" FOREIGN KEY ("created_by") REFERENCES "users"("id") ON DELETE SET NULL,
      CONSTRAINT "FK_materials_updated_by" FOREIGN KEY ("updated_by") REFERENCES "users"("id") ON DELETE SET NULL
    )`);
    await q.query(`CREATE INDEX "idx_materials_workspace" ON "materials" ("workspace_id")`);
    await q.query(`CREATE TABLE "material_versions" (
      "id" uuid NOT NULL DEFAULT gen_random_uuid(),
      "material_id" uuid NOT NULL,
      "version" integer NOT NULL,
      "snapshot" jsonb NOT NULL,
      "summary" text NOT NULL,
      "created_by" uuid,
      "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      CONSTRAINT "PK_material_versions" PRIMARY KEY ("id"),
      CONSTRAINT "uq_material_versions_material_version" UNIQUE ("material_id", "version"),
      CONSTRAINT "FK_material_versions_material" FOREIGN KEY ("material_id") REFERENCES "materials"("id") ON DELETE CASCADE,
      CONSTRAINT "FK_material_versions_created_by" FOREIGN KEY ("created_by") REFERENCES "users"("id") ON DELETE SET NULL
    )`);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "material_versions"`);
    await q.query(`DROP TABLE "materials"`);
  }
}
