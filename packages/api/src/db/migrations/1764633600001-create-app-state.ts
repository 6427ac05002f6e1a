import type { MigrationInterface, QueryRunner } from 'typeorm';

/** Small key/value facts about this installation, such as "the demo data was loaded". */
export class CreateAppState1764633600001 implements MigrationInterface {
  name = 'CreateAppState1764633600001';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE app_state (
        name VARCHAR(100) NOT NULL,
        value VARCHAR(1000) NOT NULL,
        updatedAt DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
        PRIMARY KEY (name)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci
    `);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE app_state');
  }
}
