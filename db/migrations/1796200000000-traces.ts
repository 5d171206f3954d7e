import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Energy-gap traces (raw files in object storage, metadata here) and their analyses. */
export class Traces1796200000000 implements MigrationInterface {
  name = 'Traces1796200000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE "traces" (
      "id" uuid NOT NULL DEFAULT gen_random_uuid(),
      "workspace_id" uuid NOT NULL,
      "state" text NOT NULL,
      "file_name" text NOT NULL,
      "size_bytes" bigint NOT NULL,
      "sha256" text NOT NULL,
      "object_key" text NOT NULL,
      "gzip" boolean NOT NULL,
      "unit" text NOT NULL,
      "column_setting" text,
      "column_index" integer NOT NULL,
      "column_name" text,
      "delimiter" text NOT NULL,
      "skip_bad_lines" boolean NOT NULL,
      "sample_count" bigint NOT NULL,
      "line_count" bigint NOT NULL,
      "skipped_line_count" bigint NOT NULL,
      "skipped_lines" jsonb NOT NULL DEFAULT '[]',
      "min_ev" double precision NOT NULL,
      "max_ev" double precision NOT NULL,
      "mean_ev" double precision NOT NULL,
      "uploaded_by" uuid,
      "uploaded_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      CONSTRAINT "PK_traces" PRIMARY KEY ("id"),
      CONSTRAINT "CHK_traces_state" CHECK ("state" IN ('reactant', 'product')),
      CONSTRAINT "FK_traces_workspace" FOREIGN KEY ("workspace_id") REFERENCES "workspaces"("id") ON DELETE CASCADE,
      CONSTRAINT "FK_traces_uploaded_by" FOREIGN KEY ("uploaded_by") REFERENCES "users"("id") ON DELETE SET NULL
    )`);
    await q.query(
      `CREATE INDEX "idx_traces_workspace" ON "traces" ("workspace_id", "uploaded_at")`,
    );
    await q.query(`CREATE INDEX "idx_traces_object_key" ON "traces" ("object_key")`);
    await q.query(`CREATE TABLE "trace_analyses" (
      "id" uuid NOT NULL DEFAULT gen_random_uuid(),
      "workspace_id" uuid NOT NULL,
      "reactant_trace_id" uuid NOT NULL,
      "product_trace_id" uuid NOT NULL,
      "temperature_k" double precision NOT NULL,
      "status" text NOT NULL DEFAULT 'queued',
      "progress" double precision NOT NULL DEFAULT 0,
      "result" jsonb,
      "error" jsonb,
      "attempts" integer NOT NULL DEFAULT 0,
      "created_by" uuid,
      "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      "started_at" TIMESTAMP WITH TIME ZONE,
      "finished_at" TIMESTAMP WITH TIME ZONE,
      CONSTRAINT "PK_trace_analyses" PRIMARY KEY ("id"),
      CONSTRAINT "CHK_trace_analyses_status" CHECK ("status" IN ('queued', 'running', 'done', 'failed')),
      CONSTRAINT "FK_trace_analyses_workspace" FOREIGN KEY ("workspace_id") REFERENCES "workspaces"("id") ON DELETE CASCADE,
      CONSTRAINT "FK_trace_analyses_reactant" FOREIGN KEY ("reactant_trace_id") REFERENCES "traces"("id") ON DELETE CASCADE,
      CONSTRAINT "FK_trace_analyses_product" FOREIGN KEY ("product_trace_id") REFERENCES "traces"("id") ON DELETE CASCADE
    )`);
    await q.query(
      `CREATE INDEX "idx_trace_analyses_workspace" ON "trace_analyses" ("workspace_id", "created_at")`,
    );
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE "trace_analyses"`);
    await q.query(`DROP TABLE "traces"`);
  }
}
