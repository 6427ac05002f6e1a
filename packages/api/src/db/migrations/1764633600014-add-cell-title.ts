import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A cell may carry a title its people chose; screens and e-mail name the cell by it instead
 * of its kind and place ("Circuit 2"). Null until someone sets one.
 */
export class AddCellTitle1764633600014 implements MigrationInterface {
  name = 'AddCellTitle1764633600014';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE cells ADD COLUMN title VARCHAR(80) NULL AFTER kind');
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE cells DROP COLUMN title');
  }
}
