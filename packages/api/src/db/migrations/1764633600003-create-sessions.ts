import type { MigrationInterface, QueryRunner } from 'typeorm';

/** express-session's sessions, so API processes hold no state. */
export class CreateSessions1764633600003 implements MigrationInterface {
  name = 'CreateSessions1764633600003';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE sessions (
        id VARCHAR(128) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
        userId INT UNSIGNED NULL,
        data MEDIUMTEXT NOT NULL,
        expiresAt DATETIME(3) NOT NULL,
        PRIMARY KEY (id),
        KEY idx_sessions_user (userId),
        KEY idx_sessions_expires (expiresAt),
        CONSTRAINT fk_sessions_user FOREIGN KEY (userId) REFERENCES users (id) ON DELETE CASCADE
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci
    `);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE sessions');
  }
}
