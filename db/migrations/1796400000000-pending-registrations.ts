import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Registrations waiting for their e-mail confirmation (the account is created on confirmation). */
export class PendingRegistrations1796400000000 implements MigrationInterface {
  name = 'PendingRegistrations1796400000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`CREATE TABLE "pending_registrations" (
      "id" uuid NOT NULL DEFAULT gen_random_uuid(),
      "email" text NOT NULL,
      "display_name" text NOT NULL,
      "password_hash" text NOT NULL,
      "token_hash" text NOT NULL,
      "expires_at" TIMESTAMP WITH TIME ZONE NOT NULL,
      "created_at" TIMESTAMP WITH TIME ZONE NOT NULL DEFAULT now(),
      CONSTRAINT "PK_pending_registrations" PRIMARY KEY ("id"),
      CONSTRAINT "UQ_pending_registrations_email" UNIQUE ("email"),
      CONSTRAINT "UQ_pending_registrations_token_hash" UNIQUE ("token_hash")
    )`);
    await queryRunner.query(
      `CREATE INDEX "idx_pending_registrations_expires" ON "pending_registrations" ("expires_at")`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX "public"."idx_pending_registrations_expires"`);
    await queryRunner.query(`DROP TABLE "pending_registrations"`);
  }
}
