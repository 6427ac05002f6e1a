import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The first answer to each creating write sent with an `Idempotency-Key`, per user, so the
 * same request again (a retry after a lost answer) gets that answer instead of being done
 * twice. `fingerprint` is a hash of the request, to refuse the same key on another request;
 * rows older than a day no longer count and are removed.
 */
export class CreateIdempotencyKeys1764633600040 implements MigrationInterface {
  name = 'CreateIdempotencyKeys1764633600040';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE idempotency_keys (
        userId INT UNSIGNED NOT NULL,
        idempotencyKey VARCHAR(255) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
        fingerprint CHAR(64) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
        status SMALLINT UNSIGNED NOT NULL,
        response MEDIUMTEXT NOT NULL,
        createdAt DATETIME(3) NOT NULL,
        PRIMARY KEY (userId, idempotencyKey),
        KEY idx_idempotency_keys_created (createdAt),
        CONSTRAINT fk_idempotency_keys_user FOREIGN KEY (userId) REFERENCES users (id) ON DELETE CASCADE
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci
    `);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE idempotency_keys');
  }
}
