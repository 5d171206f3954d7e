import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The cascade page's editor design (how each state energy was derived, σ of the inputs, the pair a
 * step was taken from): kept beside the `kinetics.network` request it resolves to, so the
 * network stays a plain calculation request for the API, the CLI and the report.
 */
export class CascadeDesign1796815000000 implements MigrationInterface {
  name = 'CascadeDesign1796815000000';

  public async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "cascades" ADD "design" jsonb`);
  }

  public async down(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE "cascades" DROP COLUMN "design"`);
  }
}
