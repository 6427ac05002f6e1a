import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A plain-text description under a notebook's title. Existing notebooks get an empty one;
 * the API allows 2 000 characters, so the column holds exactly that many.
 */
export class AddNotebookDescription1764633600009 implements MigrationInterface {
  name = 'AddNotebookDescription1764633600009';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query("ALTER TABLE notebooks ADD COLUMN description VARCHAR(2000) NOT NULL DEFAULT '' AFTER title");
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE notebooks DROP COLUMN description');
  }
}
