import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Server-side sessions (sign-out and "sign out everywhere" end them at once; refresh tokens carry
 * the session's generation so a reused one is recognised), password-reset links (only the SHA-256
 * of the e-mailed token is stored), and a scope and optional expiry on API tokens.
 */
export class Sessions1796700000000 implements MigrationInterface {
  name = 'Sessions1796700000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE "sessions" (
      "id" uuid NOT NULL DEFAULT gen_random_uuid(),
      "user_id" uuid NOT NULL,
      "generation" integer NOT NULL DEFAULT 0,
      "refreshed_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      "expires_at" TIMESTAMP WITH TIME ZONE NOT NULL,
      "revoked_at" TIMESTAMP WITH TIME ZONE,
      "revoked_reason" text,
      "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      CONSTRAINT "PK_sessions" PRIMARY KEY ("id"),
      CONSTRAINT "FK_sessions_user" FOREIGN KEY ("user_id") REFERENCES "users"("id") ON DELETE CASCADE
    )`);
    await queryRunner.query(`CREATE INDEX "idx_sessions_user" ON "sessions" ("user_id")`);
    await queryRunner.query(`CREATE TABLE "password_resets" (
      "id" uuid NOT NULL DEFAULT gen_random_uuid(),
      "user_id" uuid NOT NULL,
      "token_hash" text NOT NULL,
      "expires_at" TIMESTAMP WITH TIME ZONE NOT NULL,
      "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      CONSTRAINT "PK_password_resets" PRIMARY KEY ("id"),
      CONSTRAINT "UQ_password_resets_token_hash" UNIQUE ("token_hash"),
      CONSTRAINT "UQ_password_resets_user" UNIQUE ("user_id"),
      CONSTRAINT "FK_password_resets_user" FOREIGN KEY ("user_id") REFERENCES "users"("id") ON DELETE CASCADE
    )`);
    await queryRunner.query(
      `ALTER TABLE "api_tokens" ADD "scope" text NOT NULL DEFAULT 'read-write' CONSTRAINT "CHK_api_tokens_scope" CHECK ("scope" IN ('read', 'read-write'))`,
    );
    await queryRunner.query(`ALTER TABLE "api_tokens" ADD "expires_at" TIMESTAMP WITH TIME ZONE`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "api_tokens" DROP COLUMN "expires_at"`);
    await queryRunner.query(`ALTER TABLE "api_tokens" DROP COLUMN "scope"`);
    await queryRunner.query(`DROP TABLE "password_resets"`);
    await queryRunner.query(`DROP INDEX "public"."idx_sessions_user"`);
    await queryRunner.query(`DROP TABLE "sessions"`);
  }
}
