import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Rate-limit counters that every server process shares: one row per limiter and client (an
 * address or a user), the start of its current window and the hits in it. A hit is one
 * `INSERT … ON DUPLICATE KEY UPDATE` on the primary key; `idx_rate_limits_window` finds the
 * rows of windows long past, to prune them.
 */
export class CreateRateLimits1764633600031 implements MigrationInterface {
  name = 'CreateRateLimits1764633600031';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE rate_limits (
        limiter VARCHAR(40) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
        clientKey VARCHAR(100) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
        windowStart DATETIME(3) NOT NULL,
        hits INT UNSIGNED NOT NULL,
        PRIMARY KEY (limiter, clientKey),
        KEY idx_rate_limits_window (limiter, windowStart)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci
    `);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE rate_limits');
  }
}
