import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A revision may say why it was made when its author did not type it: `language update`,
 * `restored from revision 3`. Null for an ordinary save.
 */
export class AddRevisionMessage1764633600012 implements MigrationInterface {
  name = 'AddRevisionMessage1764633600012';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE cell_revisions ADD COLUMN message VARCHAR(200) NULL AFTER authorId');
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE cell_revisions DROP COLUMN message');
  }
}
