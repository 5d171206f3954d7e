import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The ħω a screen's score assumes for a step in the inverted region when the row gives none
 * (the score then ranks with MLJ there, not with the classical rate). Screens made before keep
 * NULL: their scores were computed without it. And the unit the upload's header named for each
 * column, so a row opened as a pair shows its values in the units they were written in.
 */
export class ScreenScoreHbarOmega1796770000000 implements MigrationInterface {
  name = 'ScreenScoreHbarOmega1796770000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "screens" ADD "score_hbar_omega_ev" double precision`);
    await queryRunner.query(`ALTER TABLE "screens" ADD "column_units" jsonb NOT NULL DEFAULT '{}'`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "screens" DROP COLUMN "column_units"`);
    await queryRunner.query(`ALTER TABLE "screens" DROP COLUMN "score_hbar_omega_ev"`);
  }
}
