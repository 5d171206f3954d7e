import type { MigrationInterface, QueryRunner } from 'typeorm';

/** The team workspace schema: users, workspaces, roles, invitations, pairs with parameters and
 * versions, audit trail, API tokens and the e-mail outbox. */
export class Initial1764640000000 implements MigrationInterface {
  name = 'Initial1764640000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      'CREATE TABLE "users" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "email" text NOT NULL, "display_name" text NOT NULL, "password_hash" text NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "UQ_97672ac88f789774dd47f7c8be3" UNIQUE ("email"), CONSTRAINT "PK_a3ffb1c0c8416b9fc6f907b7433" PRIMARY KEY ("id"))',
    );
    await queryRunner.query(
      'CREATE TABLE "api_tokens" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "user_id" uuid NOT NULL, "name" text NOT NULL, "prefix" text NOT NULL, "token_hash" text NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "last_used_at" TIMESTAMP WITH TIME ZONE, "revoked_at" TIMESTAMP WITH TIME ZONE, CONSTRAINT "UQ_bbd687a104e1921e6702c6e3aad" UNIQUE ("token_hash"), CONSTRAINT "PK_c587455266b5fa8dace7194caac" PRIMARY KEY ("id"))',
    );
    await queryRunner.query('CREATE INDEX "idx_api_tokens_user" ON "api_tokens"  ("user_id") ');
    await queryRunner.query(
      'CREATE TABLE "workspaces" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "name" text NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_098656ae401f3e1a4586f47fd8e" PRIMARY KEY ("id"))',
    );
    await queryRunner.query(
      'CREATE TABLE "audit_events" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "workspace_id" uuid, "actor_id" uuid, "action" text NOT NULL, "entity_type" text NOT NULL, "entity_id" text, "summary" text NOT NULL, "before" jsonb, "after" jsonb, "at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_910f64d901a5c3e9878f0d4a407" PRIMARY KEY ("id"))',
    );
    await queryRunner.query(
      'CREATE INDEX "idx_audit_events_workspace_at" ON "audit_events"  ("workspace_id", "at") ',
    );
    await queryRunner.query(
      'CREATE TABLE "invitations" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "workspace_id" uuid NOT NULL, "email" text NOT NULL, "role" text NOT NULL, "token_hash" text NOT NULL, "expires_at" TIMESTAMP WITH TIME ZONE NOT NULL, "accepted_at" TIMESTAMP WITH TIME ZONE, "accepted_by" uuid, "revoked_at" TIMESTAMP WITH TIME ZONE, "created_by" uuid, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "UQ_872ac94a64b3d44fc4b554780cd" UNIQUE ("token_hash"), CONSTRAINT "PK_5dec98cfdfd562e4ad3648bbb07" PRIMARY KEY ("id"))',
    );
    await queryRunner.query(
      'CREATE INDEX "idx_invitations_workspace" ON "invitations"  ("workspace_id") ',
    );
    await queryRunner.query(
      'CREATE TABLE "mail_outbox" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "kind" text NOT NULL, "to_address" text NOT NULL, "subject" text NOT NULL, "text_body" text, "html_body" text, "status" text NOT NULL DEFAULT \'pending\', "attempts" integer NOT NULL DEFAULT \'0\', "last_error" text, "related_id" uuid, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "sent_at" TIMESTAMP WITH TIME ZONE, CONSTRAINT "PK_fecc63c96385bc35a39ccf2a72e" PRIMARY KEY ("id"))',
    );
    await queryRunner.query('CREATE INDEX "idx_mail_outbox_status" ON "mail_outbox"  ("status") ');
    await queryRunner.query(
      'CREATE TABLE "memberships" ("workspace_id" uuid NOT NULL, "user_id" uuid NOT NULL, "role" text NOT NULL, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_b30e6ce2c364503f9840fa6440b" PRIMARY KEY ("workspace_id", "user_id"))',
    );
    await queryRunner.query('CREATE INDEX "idx_memberships_user" ON "memberships"  ("user_id") ');
    await queryRunner.query(
      'CREATE TABLE "pairs" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "workspace_id" uuid NOT NULL, "name" text NOT NULL, "donor" text NOT NULL, "acceptor" text NOT NULL, "medium" text NOT NULL, "temperature_k" double precision NOT NULL, "temperature_unit" text NOT NULL DEFAULT \'K\', "notes" text NOT NULL DEFAULT \'\', "status" text NOT NULL DEFAULT \'draft\', "tags" text array NOT NULL DEFAULT \'{}\', "model" text NOT NULL DEFAULT \'marcus\', "version" integer NOT NULL DEFAULT \'1\', "results" jsonb, "delta_g0" double precision, "lambda_total" double precision, "coupling_abs" double precision, "log10k" double precision, "regime" text, "created_by" uuid, "updated_by" uuid, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), "updated_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "PK_bfc550b07b52c37db12aa7d8e69" PRIMARY KEY ("id"))',
    );
    await queryRunner.query('CREATE INDEX "idx_pairs_workspace" ON "pairs"  ("workspace_id") ');
    await queryRunner.query(
      'CREATE TABLE "pair_parameters" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "pair_id" uuid NOT NULL, "position" integer NOT NULL, "kind" text NOT NULL, "value" double precision NOT NULL, "unit" text NOT NULL, "uncertainty" double precision, "provenance_kind" text NOT NULL, "citation" text, "method_id" text, "method_inputs" jsonb, "sources" jsonb, "note" text, CONSTRAINT "PK_2bd5fcb289f60cb55de827a45b7" PRIMARY KEY ("id"))',
    );
    await queryRunner.query(
      'CREATE INDEX "idx_pair_parameters_pair" ON "pair_parameters"  ("pair_id") ',
    );
    await queryRunner.query(
      'CREATE TABLE "pair_versions" ("id" uuid NOT NULL DEFAULT gen_random_uuid(), "pair_id" uuid NOT NULL, "version" integer NOT NULL, "snapshot" jsonb NOT NULL, "summary" text NOT NULL, "created_by" uuid, "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(), CONSTRAINT "uq_pair_versions_pair_version" UNIQUE ("pair_id", "version"), CONSTRAINT "PK_5791e7e88cb48fa116b0fbf992b" PRIMARY KEY ("id"))',
    );
    await queryRunner.query(
      'ALTER TABLE "api_tokens" ADD CONSTRAINT "FK_b74883f5884a42fd8496d389b25" FOREIGN KEY ("user_id") REFERENCES "users"("id") ON DELETE CASCADE ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE "audit_events" ADD CONSTRAINT "FK_ce538042f1afc3b80bfa0fb2de2" FOREIGN KEY ("workspace_id") REFERENCES "workspaces"("id") ON DELETE CASCADE ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE "audit_events" ADD CONSTRAINT "FK_04c7c044146c6632491a370fc04" FOREIGN KEY ("actor_id") REFERENCES "users"("id") ON DELETE SET NULL ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE "invitations" ADD CONSTRAINT "FK_37d2c3ed527014368be5302bdec" FOREIGN KEY ("workspace_id") REFERENCES "workspaces"("id") ON DELETE CASCADE ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE "invitations" ADD CONSTRAINT "FK_2afdbc73ee1fe16cf1f3929e920" FOREIGN KEY ("created_by") REFERENCES "users"("id") ON DELETE SET NULL ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE "memberships" ADD CONSTRAINT "FK_9b76ecf1dda18a6adec17fe71c4" FOREIGN KEY ("workspace_id") REFERENCES "workspaces"("id") ON DELETE CASCADE ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE "memberships" ADD CONSTRAINT "FK_7c1e2fdfed4f6838e0c05ae5051" FOREIGN KEY ("user_id") REFERENCES "users"("id") ON DELETE CASCADE ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE "pairs" ADD CONSTRAINT "FK_ccda366d16267e2c919b1fad001" FOREIGN KEY ("workspace_id") REFERENCES "workspaces"("id") ON DELETE CASCADE ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE "pairs" ADD CONSTRAINT "FK_d7b702df9e4e59d5fe914f1a862" FOREIGN KEY ("updated_by") REFERENCES "users"("id") ON DELETE SET NULL ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE "pairs" ADD CONSTRAINT "FK_0c436f4ad385d71d5fd82a58cb9" FOREIGN KEY ("created_by") REFERENCES "users"("id") ON DELETE SET NULL ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE "pair_parameters" ADD CONSTRAINT "FK_38ac5c73c7dae19d13dfe021750" FOREIGN KEY ("pair_id") REFERENCES "pairs"("id") ON DELETE CASCADE ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE "pair_versions" ADD CONSTRAINT "FK_7953d3554ff2c6d9c952cb85371" FOREIGN KEY ("pair_id") REFERENCES "pairs"("id") ON DELETE CASCADE ON UPDATE NO ACTION',
    );
    await queryRunner.query(
      'ALTER TABLE "pair_versions" ADD CONSTRAINT "FK_6f75146ff52088361e27bf2efea" FOREIGN KEY ("created_by") REFERENCES "users"("id") ON DELETE SET NULL ON UPDATE NO ACTION',
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE "users"');
    await queryRunner.query('DROP TABLE "api_tokens"');
    await queryRunner.query('DROP INDEX "public"."idx_api_tokens_user"');
    await queryRunner.query('DROP TABLE "workspaces"');
    await queryRunner.query('DROP TABLE "audit_events"');
    await queryRunner.query('DROP INDEX "public"."idx_audit_events_workspace_at"');
    await queryRunner.query('DROP TABLE "invitations"');
    await queryRunner.query('DROP INDEX "public"."idx_invitations_workspace"');
    await queryRunner.query('DROP TABLE "mail_outbox"');
    await queryRunner.query('DROP INDEX "public"."idx_mail_outbox_status"');
    await queryRunner.query('DROP TABLE "memberships"');
    await queryRunner.query('DROP INDEX "public"."idx_memberships_user"');
    await queryRunner.query('DROP TABLE "pairs"');
    await queryRunner.query('DROP INDEX "public"."idx_pairs_workspace"');
    await queryRunner.query('DROP TABLE "pair_parameters"');
    await queryRunner.query('DROP INDEX "public"."idx_pair_parameters_pair"');
    await queryRunner.query('DROP TABLE "pair_versions"');
    await queryRunner.query(
      'ALTER TABLE "api_tokens" DROP CONSTRAINT "FK_b74883f5884a42fd8496d389b25"',
    );
    await queryRunner.query(
      'ALTER TABLE "audit_events" DROP CONSTRAINT "FK_ce538042f1afc3b80bfa0fb2de2"',
    );
    await queryRunner.query(
      'ALTER TABLE "audit_events" DROP CONSTRAINT "FK_04c7c044146c6632491a370fc04"',
    );
    await queryRunner.query(
      'ALTER TABLE "invitations" DROP CONSTRAINT "FK_37d2c3ed527014368be5302bdec"',
    );
    await queryRunner.query(
      'ALTER TABLE "invitations" DROP CONSTRAINT "FK_2afdbc73ee1fe16cf1f3929e920"',
    );
    await queryRunner.query(
      'ALTER TABLE "memberships" DROP CONSTRAINT "FK_9b76ecf1dda18a6adec17fe71c4"',
    );
    await queryRunner.query(
      'ALTER TABLE "memberships" DROP CONSTRAINT "FK_7c1e2fdfed4f6838e0c05ae5051"',
    );
    await queryRunner.query('ALTER TABLE "pairs" DROP CONSTRAINT "FK_ccda366d16267e2c919b1fad001"');
    await queryRunner.query('ALTER TABLE "pairs" DROP CONSTRAINT "FK_d7b702df9e4e59d5fe914f1a862"');
    await queryRunner.query('ALTER TABLE "pairs" DROP CONSTRAINT "FK_0c436f4ad385d71d5fd82a58cb9"');
    await queryRunner.query(
      'ALTER TABLE "pair_parameters" DROP CONSTRAINT "FK_38ac5c73c7dae19d13dfe021750"',
    );
    await queryRunner.query(
      'ALTER TABLE "pair_versions" DROP CONSTRAINT "FK_7953d3554ff2c6d9c952cb85371"',
    );
    await queryRunner.query(
      'ALTER TABLE "pair_versions" DROP CONSTRAINT "FK_6f75146ff52088361e27bf2efea"',
    );
  }
}
