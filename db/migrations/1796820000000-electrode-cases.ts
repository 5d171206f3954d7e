import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Electrode cases (electrode kinetics of a redox couple, issue 18) and their versions. */
export class ElectrodeCases1796820000000 implements MigrationInterface {
  name = 'ElectrodeCases1796820000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "electrode_cases" (
      "id" uuid NOT NULL DEFAULT gen_random_uuid(),
      "workspace_id" uuid NOT NULL,
      "name" text NOT NULL,
      "redox_couple" text NOT NULL,
      "electrode" text NOT NULL,
      "lambda_ev" double precision NOT NULL,
      "temperature_k" double precision NOT NULL,
      "rate_source" text NOT NULL,
      "k0" double precision,
      "rate_unit" text NOT NULL DEFAULT 's-1',
      "coupling_ev" double precision,
      "density_of_states_per_ev" double precision,
      "provenance" text NOT NULL DEFAULT '',
      "points" jsonb NOT NULL DEFAULT '[]',
      "data_note" text NOT NULL DEFAULT '',
      "notes" text NOT NULL DEFAULT '',
      "version" integer NOT NULL DEFAULT 1,
      "created_by" uuid,
      "updated_by" uuid,
      "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      CONSTRAINT "PK_electrode_cases" PRIMARY KEY ("id"),
      CONSTRAINT "CHK_electrode_cases_rate_source" CHECK ("rate_source" IN ('k0', 'coupling')),
      CONSTRAINT "FK_electrode_cases_workspace" FOREIGN KEY ("workspace_id") REFERENCES "workspaces"("id") ON DELETE CASCADE,
      CONSTRAINT "FK_electrode_cases_created_by" FOREIGN KEY ("created_by") REFERENCES "users"("id") ON DELETE SET NULL,
      CONSTRAINT "FK_electrode_cases_updated_by" FOREIGN KEY ("updated_by") REFERENCES "users"("id") ON DELETE SET NULL
    )`);
    await q.query(
      `CREATE INDEX "idx_electrode_cases_workspace" ON "electrode_cases" ("workspace_id")`,
    );
    await q.query(`CREATE TABLE "electrode_case_versions" (
      "id" uuid NOT NULL DEFAULT gen_random_uuid(),
      "case_id" uuid NOT NULL,
      "version" integer NOT NULL,
      "snapshot" jsonb NOT NULL,
      "summary" text NOT NULL,
      "created_by" uuid,
      "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      CONSTRAINT "PK_electrode_case_versions" PRIMARY KEY ("id"),
      CONSTRAINT "uq_electrode_case_versions_case_version" UNIQUE ("case_id", "version"),
      CONSTRAINT "FK_electrode_case_versions_case" FOREIGN KEY ("case_id") REFERENCES "electrode_cases"("id") ON DELETE CASCADE,
      CONSTRAINT "FK_electrode_case_versions_created_by" FOREIGN KEY ("created_by") REFERENCES "users"("id") ON DELETE SET NULL
    )`);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "electrode_case_versions"`);
    await q.query(`DROP TABLE "electrode_cases"`);
  }
}
