import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Notebook versions (labelled snapshots) and the revision each cell had in them. */
export class CreateVersions1764633600006 implements MigrationInterface {
  name = 'CreateVersions1764633600006';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE notebook_versions (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        notebookId CHAR(12) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
        number INT UNSIGNED NOT NULL,
        label VARCHAR(200) NOT NULL,
        authorId INT UNSIGNED NULL,
        createdAt DATETIME(3) NOT NULL,
        PRIMARY KEY (id),
        UNIQUE KEY uq_notebook_versions_number (notebookId, number),
        KEY idx_notebook_versions_author (authorId),
        CONSTRAINT fk_notebook_versions_notebook FOREIGN KEY (notebookId) REFERENCES notebooks (id) ON DELETE CASCADE,
        CONSTRAINT fk_notebook_versions_author FOREIGN KEY (authorId) REFERENCES users (id) ON DELETE SET NULL
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci
    `);
    await queryRunner.query(`
      CREATE TABLE notebook_version_cells (
        versionId INT UNSIGNED NOT NULL,
        cellId INT UNSIGNED NOT NULL,
        revisionId INT UNSIGNED NOT NULL,
        position INT UNSIGNED NOT NULL,
        PRIMARY KEY (versionId, cellId),
        KEY idx_notebook_version_cells_cell (cellId),
        KEY idx_notebook_version_cells_revision (revisionId),
        CONSTRAINT fk_notebook_version_cells_version FOREIGN KEY (versionId) REFERENCES notebook_versions (id) ON DELETE CASCADE,
        CONSTRAINT fk_notebook_version_cells_cell FOREIGN KEY (cellId) REFERENCES cells (id) ON DELETE CASCADE,
        CONSTRAINT fk_notebook_version_cells_revision FOREIGN KEY (revisionId) REFERENCES cell_revisions (id) ON DELETE CASCADE
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci
    `);
    await queryRunner.query(`
      ALTER TABLE notebooks
        ADD KEY idx_notebooks_forked_from_version (forkedFromVersionId),
        ADD CONSTRAINT fk_notebooks_forked_from_version FOREIGN KEY (forkedFromVersionId)
          REFERENCES notebook_versions (id) ON DELETE SET NULL
    `);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE notebooks DROP FOREIGN KEY fk_notebooks_forked_from_version, DROP KEY idx_notebooks_forked_from_version');
    await queryRunner.query('DROP TABLE notebook_version_cells');
    await queryRunner.query('DROP TABLE notebook_versions');
  }
}
