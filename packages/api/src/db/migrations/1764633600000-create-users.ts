import type { MigrationInterface, QueryRunner } from 'typeorm';

/** The first table: people who can sign in. */
export class CreateUsers1764633600000 implements MigrationInterface {
  name = 'CreateUsers1764633600000';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE users (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        login VARCHAR(100) NOT NULL,
        name VARCHAR(200) NOT NULL DEFAULT '',
        email VARCHAR(320) NULL,
        siteRole VARCHAR(20) NOT NULL DEFAULT 'member',
        disabled TINYINT(1) NOT NULL DEFAULT 0,
        createdAt DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
        updatedAt DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
        PRIMARY KEY (id),
        UNIQUE KEY uq_users_login (login)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci
    `);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE users');
  }
}
