import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Cells and their immutable revisions. A notebook's cells are read in order through
 * `idx_cells_notebook_position`; a cell's current text through `uq_cell_revisions_number`.
 */
export class CreateCells1764633600005 implements MigrationInterface {
  name = 'CreateCells1764633600005';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE cells (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        notebookId CHAR(12) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
        kind VARCHAR(10) NOT NULL,
        position INT UNSIGNED NOT NULL,
        revision INT UNSIGNED NOT NULL,
        createdAt DATETIME(3) NOT NULL,
        updatedAt DATETIME(3) NOT NULL,
        deletedAt DATETIME(3) NULL,
        PRIMARY KEY (id),
        KEY idx_cells_notebook_position (notebookId, deletedAt, position),
        CONSTRAINT fk_cells_notebook FOREIGN KEY (notebookId) REFERENCES notebooks (id) ON DELETE CASCADE,
        CONSTRAINT chk_cells_kind CHECK (kind IN ('circuit', 'note'))
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci
    `);
    await queryRunner.query(`
      CREATE TABLE cell_revisions (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        cellId INT UNSIGNED NOT NULL,
        number INT UNSIGNED NOT NULL,
        text MEDIUMTEXT NOT NULL,
        authorId INT UNSIGNED NULL,
        diagnosticErrors INT UNSIGNED NULL,
        diagnosticWarnings INT UNSIGNED NULL,
        createdAt DATETIME(3) NOT NULL,
        PRIMARY KEY (id),
        UNIQUE KEY uq_cell_revisions_number (cellId, number),
        KEY idx_cell_revisions_author (authorId),
        CONSTRAINT fk_cell_revisions_cell FOREIGN KEY (cellId) REFERENCES cells (id) ON DELETE CASCADE,
        CONSTRAINT fk_cell_revisions_author FOREIGN KEY (authorId) REFERENCES users (id) ON DELETE SET NULL
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci
    `);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE cell_revisions');
    await queryRunner.query('DROP TABLE cells');
  }
}
