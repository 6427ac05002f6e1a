import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The mail outbox: the text of each message still to be sent, one row per mail_log row in
 * `queued`, written in the transaction of the action that caused it. A sender claims due rows
 * (`idx_mail_outbox_due`) with `FOR UPDATE SKIP LOCKED` and a lease, so any number of server
 * processes send each message once; the row goes when the message is sent or given up on.
 * `idx_mail_log_finished` counts what was sent or failed in the last day for the admin page.
 */
export class CreateMailOutbox1764633600030 implements MigrationInterface {
  name = 'CreateMailOutbox1764633600030';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE mail_outbox (
        mailLogId INT UNSIGNED NOT NULL,
        body MEDIUMTEXT NOT NULL,
        nextAttemptAt DATETIME(3) NOT NULL,
        claimedUntil DATETIME(3) NULL,
        PRIMARY KEY (mailLogId),
        KEY idx_mail_outbox_due (nextAttemptAt),
        CONSTRAINT fk_mail_outbox_log FOREIGN KEY (mailLogId) REFERENCES mail_log (id) ON DELETE CASCADE
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci
    `);
    await queryRunner.query('ALTER TABLE mail_log ADD KEY idx_mail_log_finished (status, finishedAt)');
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('ALTER TABLE mail_log DROP KEY idx_mail_log_finished');
    await queryRunner.query('DROP TABLE mail_outbox');
  }
}
