import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * E-mail: each person's choice of the mails they get (no row: every kind on), and a log of
 * every message sent or given up on. The log is read newest first by `idx_mail_log_created`,
 * by status by `idx_mail_log_status`.
 */
export class CreateMail1764633600008 implements MigrationInterface {
  name = 'CreateMail1764633600008';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE user_mail_settings (
        userId INT UNSIGNED NOT NULL,
        reviewRequests TINYINT(1) NOT NULL DEFAULT 1,
        reviewDecisions TINYINT(1) NOT NULL DEFAULT 1,
        pinReplies TINYINT(1) NOT NULL DEFAULT 1,
        addedToNotebook TINYINT(1) NOT NULL DEFAULT 1,
        updatedAt DATETIME(3) NOT NULL,
        PRIMARY KEY (userId),
        CONSTRAINT fk_user_mail_settings_user FOREIGN KEY (userId) REFERENCES users (id) ON DELETE CASCADE
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci
    `);
    await queryRunner.query(`
      CREATE TABLE mail_log (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        toAddress VARCHAR(320) NOT NULL,
        userId INT UNSIGNED NULL,
        subject VARCHAR(300) NOT NULL,
        kind VARCHAR(30) NOT NULL,
        notebookId CHAR(12) CHARACTER SET ascii COLLATE ascii_bin NULL,
        status VARCHAR(10) NOT NULL DEFAULT 'queued',
        attempts INT UNSIGNED NOT NULL DEFAULT 0,
        error VARCHAR(1000) NULL,
        createdAt DATETIME(3) NOT NULL,
        finishedAt DATETIME(3) NULL,
        PRIMARY KEY (id),
        KEY idx_mail_log_created (createdAt),
        KEY idx_mail_log_status (status, createdAt),
        KEY idx_mail_log_user (userId),
        KEY idx_mail_log_notebook (notebookId),
        CONSTRAINT fk_mail_log_user FOREIGN KEY (userId) REFERENCES users (id) ON DELETE SET NULL,
        CONSTRAINT fk_mail_log_notebook FOREIGN KEY (notebookId) REFERENCES notebooks (id) ON DELETE SET NULL,
        CONSTRAINT chk_mail_log_status CHECK (status IN ('queued', 'sent', 'failed')),
        CONSTRAINT chk_mail_log_kind CHECK (kind IN ('reviewRequests', 'reviewDecisions', 'pinReplies', 'addedToNotebook'))
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci
    `);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE mail_log');
    await queryRunner.query('DROP TABLE user_mail_settings');
  }
}
