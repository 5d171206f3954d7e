import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Each review transition records the snapshot it acted on, so the review history can number the
 * submissions a reviewer saw and say whether the snapshot changed between two of them. Rows
 * written before this column stay null (unknown): revisions were not recorded per transition.
 */
export class ReportTransitionSnapshots1796760000000 implements MigrationInterface {
  name = 'ReportTransitionSnapshots1796760000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "report_transitions" ADD "snapshot_id" text`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE "report_transitions" DROP COLUMN "snapshot_id"`);
  }
}
