import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * Review rounds (a version, the people asked, their decisions) and pins (comments at a
 * frequency on a cell revision's trace) with their threads. A notebook's rounds are read by
 * `uq_reviews_round`, its pins by `idx_pins_notebook_cell`, a thread by
 * `idx_pin_comments_pin`; a pin points at its revision by (cellId, revisionNumber), so it can
 * only name a revision of its own cell.
 */
export class CreateReviewsAndPins1764633600007 implements MigrationInterface {
  name = 'CreateReviewsAndPins1764633600007';

  async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`
      CREATE TABLE reviews (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        notebookId CHAR(12) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
        round INT UNSIGNED NOT NULL,
        versionId INT UNSIGNED NOT NULL,
        requestedById INT UNSIGNED NULL,
        message TEXT NOT NULL,
        createdAt DATETIME(3) NOT NULL,
        PRIMARY KEY (id),
        UNIQUE KEY uq_reviews_round (notebookId, round),
        KEY idx_reviews_notebook_created (notebookId, createdAt),
        KEY idx_reviews_version (versionId),
        KEY idx_reviews_requested_by (requestedById),
        CONSTRAINT fk_reviews_notebook FOREIGN KEY (notebookId) REFERENCES notebooks (id) ON DELETE CASCADE,
        CONSTRAINT fk_reviews_version FOREIGN KEY (versionId) REFERENCES notebook_versions (id) ON DELETE CASCADE,
        CONSTRAINT fk_reviews_requested_by FOREIGN KEY (requestedById) REFERENCES users (id) ON DELETE SET NULL
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci
    `);
    await queryRunner.query(`
      CREATE TABLE review_assignments (
        reviewId INT UNSIGNED NOT NULL,
        reviewerId INT UNSIGNED NOT NULL,
        state VARCHAR(20) NOT NULL DEFAULT 'requested',
        summary TEXT NOT NULL,
        createdAt DATETIME(3) NOT NULL,
        decidedAt DATETIME(3) NULL,
        PRIMARY KEY (reviewId, reviewerId),
        KEY idx_review_assignments_reviewer (reviewerId, state),
        CONSTRAINT fk_review_assignments_review FOREIGN KEY (reviewId) REFERENCES reviews (id) ON DELETE CASCADE,
        CONSTRAINT fk_review_assignments_reviewer FOREIGN KEY (reviewerId) REFERENCES users (id) ON DELETE CASCADE,
        CONSTRAINT chk_review_assignments_state CHECK (state IN ('requested', 'changes_asked', 'signed_off'))
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci
    `);
    await queryRunner.query(`
      CREATE TABLE review_decisions (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        reviewId INT UNSIGNED NOT NULL,
        reviewerId INT UNSIGNED NULL,
        state VARCHAR(20) NOT NULL,
        summary TEXT NOT NULL,
        createdAt DATETIME(3) NOT NULL,
        PRIMARY KEY (id),
        KEY idx_review_decisions_review (reviewId, createdAt),
        KEY idx_review_decisions_reviewer (reviewerId),
        CONSTRAINT fk_review_decisions_review FOREIGN KEY (reviewId) REFERENCES reviews (id) ON DELETE CASCADE,
        CONSTRAINT fk_review_decisions_reviewer FOREIGN KEY (reviewerId) REFERENCES users (id) ON DELETE SET NULL,
        CONSTRAINT chk_review_decisions_state CHECK (state IN ('changes_asked', 'signed_off'))
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci
    `);
    await queryRunner.query(`
      CREATE TABLE pins (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        notebookId CHAR(12) CHARACTER SET ascii COLLATE ascii_bin NOT NULL,
        cellId INT UNSIGNED NOT NULL,
        revisionNumber INT UNSIGNED NOT NULL,
        trace VARCHAR(100) NOT NULL,
        frequency DOUBLE NOT NULL,
        createdById INT UNSIGNED NULL,
        createdAt DATETIME(3) NOT NULL,
        resolvedAt DATETIME(3) NULL,
        resolvedById INT UNSIGNED NULL,
        PRIMARY KEY (id),
        KEY idx_pins_notebook_cell (notebookId, cellId, createdAt),
        KEY idx_pins_notebook_created (notebookId, createdAt),
        KEY idx_pins_revision (cellId, revisionNumber),
        KEY idx_pins_created_by (createdById),
        KEY idx_pins_resolved_by (resolvedById),
        CONSTRAINT fk_pins_notebook FOREIGN KEY (notebookId) REFERENCES notebooks (id) ON DELETE CASCADE,
        CONSTRAINT fk_pins_revision FOREIGN KEY (cellId, revisionNumber) REFERENCES cell_revisions (cellId, number) ON DELETE CASCADE,
        CONSTRAINT fk_pins_created_by FOREIGN KEY (createdById) REFERENCES users (id) ON DELETE SET NULL,
        CONSTRAINT fk_pins_resolved_by FOREIGN KEY (resolvedById) REFERENCES users (id) ON DELETE SET NULL,
        CONSTRAINT chk_pins_frequency CHECK (frequency > 0)
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci
    `);
    await queryRunner.query(`
      CREATE TABLE pin_comments (
        id INT UNSIGNED NOT NULL AUTO_INCREMENT,
        pinId INT UNSIGNED NOT NULL,
        authorId INT UNSIGNED NULL,
        body TEXT NOT NULL,
        createdAt DATETIME(3) NOT NULL,
        PRIMARY KEY (id),
        KEY idx_pin_comments_pin (pinId, createdAt),
        KEY idx_pin_comments_author (authorId),
        CONSTRAINT fk_pin_comments_pin FOREIGN KEY (pinId) REFERENCES pins (id) ON DELETE CASCADE,
        CONSTRAINT fk_pin_comments_author FOREIGN KEY (authorId) REFERENCES users (id) ON DELETE SET NULL
      ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci
    `);
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query('DROP TABLE pin_comments');
    await queryRunner.query('DROP TABLE pins');
    await queryRunner.query('DROP TABLE review_decisions');
    await queryRunner.query('DROP TABLE review_assignments');
    await queryRunner.query('DROP TABLE reviews');
  }
}
