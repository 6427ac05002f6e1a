import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The notebook list sorts by title or by creation as well as by the last change. These keys
 * mirror the two "last change" keys of CreateNotebooks (scope mine, and an admin's all),
 * each ending in (sort key, id) for keyset paging.
 */
export class AddNotebookSortKeys1764633600010 implements MigrationInterface {
  name = 'AddNotebookSortKeys1764633600010';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      ALTER TABLE notebooks
        ADD KEY idx_notebooks_owner_title (ownerId, deletedAt, title, id),
        ADD KEY idx_notebooks_owner_created (ownerId, deletedAt, createdAt, id),
        ADD KEY idx_notebooks_title (deletedAt, title, id),
        ADD KEY idx_notebooks_created (deletedAt, createdAt, id)
    `);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      ALTER TABLE notebooks
        DROP KEY idx_notebooks_owner_title,
        DROP KEY idx_notebooks_owner_created,
        DROP KEY idx_notebooks_title,
        DROP KEY idx_notebooks_created
    `);
  }
}
