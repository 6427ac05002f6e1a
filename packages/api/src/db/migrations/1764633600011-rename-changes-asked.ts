import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The review state "changes asked" is called **needs changes** (product.md): the stored value
 * becomes `needs_changes` in every assignment and decision, and the checks accept only the
 * new spelling.
 */
export class RenameChangesAsked1764633600011 implements MigrationInterface {
  name = 'RenameChangesAsked1764633600011';

  async up(queryRunner: QueryRunner): Promise<void> {
    await rename(queryRunner, 'changes_asked', 'needs_changes');
  }

  async down(queryRunner: QueryRunner): Promise<void> {
    await rename(queryRunner, 'needs_changes', 'changes_asked');
  }
}

async function rename(queryRunner: QueryRunner, from: string, to: string): Promise<void> {
  await queryRunner.query('ALTER TABLE review_assignments DROP CONSTRAINT chk_review_assignments_state');
  await queryRunner.query('ALTER TABLE review_decisions DROP CONSTRAINT chk_review_decisions_state');
  await queryRunner.query('UPDATE review_assignments SET state = ? WHERE state = ?', [to, from]);
  await queryRunner.query('UPDATE review_decisions SET state = ? WHERE state = ?', [to, from]);
  await queryRunner.query(`ALTER TABLE review_assignments ADD CONSTRAINT chk_review_assignments_state CHECK (state IN ('requested', '${to}', 'signed_off'))`);
  await queryRunner.query(`ALTER TABLE review_decisions ADD CONSTRAINT chk_review_decisions_state CHECK (state IN ('${to}', 'signed_off'))`);
}
