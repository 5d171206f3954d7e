import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Screen results keep their cascade from screens, but through one statement-level delete instead
 * of a per-row foreign-key check. A foreign key makes PostgreSQL check every inserted row against
 * `screens` (a row trigger taking a key-share lock on the same screen row): about three quarters
 * of the insert cost of a 2,000-row chunk, paid on the database's CPU, which the workers share —
 * so a second worker added little. Rows are only ever inserted by `processChunk`, inside the
 * transaction that holds its chunk row `FOR UPDATE`; `screen_chunks` keeps its foreign key, so
 * the screen exists for as long as that transaction runs. Deleting a screen (or its workspace)
 * deletes its results in the trigger below.
 */
export class ScreenResultsWithoutRowTrigger1796500000000 implements MigrationInterface {
  name = 'ScreenResultsWithoutRowTrigger1796500000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `ALTER TABLE "screen_results" DROP CONSTRAINT "FK_screen_results_screen"`,
    );
    await queryRunner.query(`CREATE FUNCTION "screen_results_delete_with_screen"() RETURNS trigger
      LANGUAGE plpgsql AS $$
      BEGIN
        DELETE FROM "screen_results" WHERE "screen_id" = OLD."id";
        RETURN OLD;
      END $$`);
    await queryRunner.query(`CREATE TRIGGER "trg_screen_results_delete_with_screen"
      AFTER DELETE ON "screens" FOR EACH ROW
      EXECUTE FUNCTION "screen_results_delete_with_screen"()`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TRIGGER "trg_screen_results_delete_with_screen" ON "screens"`);
    await queryRunner.query(`DROP FUNCTION "screen_results_delete_with_screen"()`);
    await queryRunner.query(`ALTER TABLE "screen_results" ADD CONSTRAINT "FK_screen_results_screen"
      FOREIGN KEY ("screen_id") REFERENCES "screens"("id") ON DELETE CASCADE`);
  }
}
