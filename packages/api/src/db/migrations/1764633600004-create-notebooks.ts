import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Notebooks and their members. The list queries read `idx_notebooks_owner_changed` (scope
 * mine), `idx_notebook_members_user` (scope shared) and `idx_notebooks_changed` (an admin's all),
 * each ending in (updatedAt, id) for "newest change first" paging.
 */
export class CreateNotebooks1764633600004 implements MigrationInterface {
  name = 'CreateNotebooks1764633600004';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE notebooks (
        id CHAR(12) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
        title VARCHAR(200) NOT NULL,
        ownerId INT UNSIGNED NOT NULL,
        visibility VARCHAR(10) NOT NULL DEFAULT 'private',
        forkedFromId CHAR(12) CHARACTER SET ascii COLLATE ascii_bin NULL,
        forkedFromVersionId INT UNSIGNED NULL,
        createdAt DATETIME(3) NOT NULL,
        updatedAt DATETIME(3) NOT NULL,
        deletedAt DATETIME(3) NULL,
        PRIMARY KEY (id),
        KEY idx_notebooks_owner_changed (ownerId, deletedAt, updatedAt, id),
        KEY idx_notebooks_changed (deletedAt, updatedAt, id),
        KEY idx_notebooks_forked_from (forkedFromId, createdAt),
        CONSTRAINT fk_notebooks_owner FOREIGN KEY (ownerId) REFERENCES users (id),
        CONSTRAINT fk_notebooks_forked_from FOREIGN KEY (forkedFromId) REFERENCES notebooks (id) ON DELETE SET NULL,
        CONSTRAINT chk_notebooks_visibility CHECK (visibility IN ('private', 'link'))
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci
    `);
    await queryRunner.query(`
      CREATE TABLE notebook_members (
        notebookId CHAR(12) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
        userId INT UNSIGNED NOT NULL,
        role VARCHAR(10) NOT NULL,
        createdAt DATETIME(3) NOT NULL,
        PRIMARY KEY (notebookId, userId),
        KEY idx_notebook_members_user (userId, notebookId),
        CONSTRAINT fk_notebook_members_notebook FOREIGN KEY (notebookId) REFERENCES notebooks (id) ON DELETE CASCADE,
        CONSTRAINT fk_notebook_members_user FOREIGN KEY (userId) REFERENCES users (id) ON DELETE CASCADE,
        CONSTRAINT chk_notebook_members_role CHECK (role IN ('editor', 'reviewer', 'viewer'))
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci
    `);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE notebook_members');
    await queryRunner.query('DROP TABLE notebooks');
  }
}
