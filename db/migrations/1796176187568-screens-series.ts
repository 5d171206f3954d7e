import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Screens (chunked many-pair computations with stored inputs and results) and measured
 * driving-force series with their points.
 */
export class ScreensSeries1796176187568 implements MigrationInterface {
  name = 'ScreensSeries1796176187568';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "screens" (
      "id" uuid NOT NULL DEFAULT gen_random_uuid(),
      "workspace_id" uuid NOT NULL,
      "name" text NOT NULL,
      "status" text NOT NULL DEFAULT 'uploaded',
      "input_hash" text NOT NULL,
      "software_version" text NOT NULL,
      "row_count" integer NOT NULL DEFAULT 0,
      "bad_row_count" integer NOT NULL DEFAULT 0,
      "bad_rows" jsonb NOT NULL DEFAULT '[]',
      "bad_row_choice" text NOT NULL DEFAULT 'none',
      "score_kind" text NOT NULL,
      "score_floor_ev" double precision,
      "chunk_size" integer NOT NULL,
      "chunk_count" integer NOT NULL DEFAULT 0,
      "chunks_done" integer NOT NULL DEFAULT 0,
      "rows_done" integer NOT NULL DEFAULT 0,
      "reused_from" uuid,
      "error" text,
      "upload_ms" integer,
      "created_by" uuid,
      "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      "started_at" TIMESTAMP WITH TIME ZONE,
      "finished_at" TIMESTAMP WITH TIME ZONE,
      CONSTRAINT "PK_screens" PRIMARY KEY ("id"),
      CONSTRAINT "FK_screens_workspace" FOREIGN KEY ("workspace_id") REFERENCES "workspaces"("id") ON DELETE CASCADE
    )`);
    await q.query(
      `CREATE INDEX "idx_screens_workspace" ON "screens" ("workspace_id", "created_at")`,
    );
    await q.query(
      `CREATE INDEX "idx_screens_reuse" ON "screens" ("workspace_id", "input_hash", "software_version")`,
    );
    await q.query(`CREATE TABLE "screen_chunks" (
      "screen_id" uuid NOT NULL,
      "chunk_index" integer NOT NULL,
      "first_line" integer NOT NULL,
      "last_line" integer NOT NULL,
      "row_count" integer NOT NULL,
      "status" text NOT NULL DEFAULT 'pending',
      "attempts" integer NOT NULL DEFAULT 0,
      "worker" text,
      "finished_at" TIMESTAMP WITH TIME ZONE,
      CONSTRAINT "PK_screen_chunks" PRIMARY KEY ("screen_id", "chunk_index"),
      CONSTRAINT "FK_screen_chunks_screen" FOREIGN KEY ("screen_id") REFERENCES "screens"("id") ON DELETE CASCADE
    )`);
    await q.query(`CREATE TABLE "screen_inputs" (
      "screen_id" uuid NOT NULL,
      "chunk_index" integer NOT NULL,
      "payload" text NOT NULL,
      CONSTRAINT "PK_screen_inputs" PRIMARY KEY ("screen_id", "chunk_index"),
      CONSTRAINT "FK_screen_inputs_screen" FOREIGN KEY ("screen_id") REFERENCES "screens"("id") ON DELETE CASCADE
    )`);
    await q.query(`CREATE TABLE "screen_results" (
      "screen_id" uuid NOT NULL,
      "row_number" integer NOT NULL,
      "donor" text NOT NULL,
      "acceptor" text NOT NULL,
      "solvent" text NOT NULL DEFAULT '',
      "delta_g_cs" double precision,
      "delta_g_cr" double precision,
      "lambda_inner" double precision,
      "lambda_outer" double precision,
      "lambda_total" double precision,
      "coupling" double precision,
      "temperature_k" double precision,
      "log10k_cs_marcus" double precision,
      "log10k_cr_marcus" double precision,
      "log10k_cs_mlj" double precision,
      "log10k_cr_mlj" double precision,
      "regime_cs" text,
      "regime_cr" text,
      "warning_mask" integer NOT NULL DEFAULT 0,
      "score" double precision,
      CONSTRAINT "PK_screen_results" PRIMARY KEY ("screen_id", "row_number"),
      CONSTRAINT "FK_screen_results_screen" FOREIGN KEY ("screen_id") REFERENCES "screens"("id") ON DELETE CASCADE
    )`);
    for (const [name, column] of [
      ['score', 'score'],
      ['dg_cs', 'delta_g_cs'],
      ['dg_cr', 'delta_g_cr'],
      ['k_cs', 'log10k_cs_marcus'],
      ['k_cr', 'log10k_cr_marcus'],
    ]) {
      await q.query(
        `CREATE INDEX "idx_screen_results_${name}" ON "screen_results" ("screen_id", "${column}")`,
      );
    }
    await q.query(`CREATE TABLE "series" (
      "id" uuid NOT NULL DEFAULT gen_random_uuid(),
      "workspace_id" uuid NOT NULL,
      "name" text NOT NULL,
      "temperature_k" double precision NOT NULL,
      "temperature_unit" text NOT NULL DEFAULT 'K',
      "energy_unit" text NOT NULL DEFAULT 'eV',
      "model_options" jsonb NOT NULL DEFAULT '{}',
      "pair_ids" uuid array NOT NULL DEFAULT '{}',
      "fit" jsonb,
      "notes" text NOT NULL DEFAULT '',
      "version" integer NOT NULL DEFAULT 1,
      "created_by" uuid,
      "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      CONSTRAINT "PK_series" PRIMARY KEY ("id"),
      CONSTRAINT "FK_series_workspace" FOREIGN KEY ("workspace_id") REFERENCES "workspaces"("id") ON DELETE CASCADE
    )`);
    await q.query(`CREATE INDEX "idx_series_workspace" ON "series" ("workspace_id")`);
    await q.query(`CREATE TABLE "series_points" (
      "id" uuid NOT NULL DEFAULT gen_random_uuid(),
      "series_id" uuid NOT NULL,
      "position" integer NOT NULL,
      "label" text NOT NULL DEFAULT '',
      "delta_g0" double precision NOT NULL,
      "log10k" double precision NOT NULL,
      "sigma_log10k" double precision,
      "pair_id" uuid,
      CONSTRAINT "PK_series_points" PRIMARY KEY ("id"),
      CONSTRAINT "FK_series_points_series" FOREIGN KEY ("series_id") REFERENCES "series"("id") ON DELETE CASCADE
    )`);
    await q.query(
      `CREATE INDEX "idx_series_points_series" ON "series_points" ("series_id", "position")`,
    );
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "series_points"`);
    await q.query(`DROP TABLE "series"`);
    await q.query(`DROP TABLE "screen_results"`);
    await q.query(`DROP TABLE "screen_inputs"`);
    await q.query(`DROP TABLE "screen_chunks"`);
    await q.query(`DROP TABLE "screens"`);
  }
}
