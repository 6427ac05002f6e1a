import { modernizeCellText } from '@rolloff/solver';
import type { MigrationInterface, QueryRunner } from 'typeorm';
import { checkCircuitText } from '../../cell-check.js';
import { SYSTEM_USER } from '../entities/user.js';

/** How many cells are read and rewritten at a time, so a large database is never held in memory. */
const batch = 200;
const message = 'language update';

/**
 * Saved notebooks keep working after the language dropped its older forms (`0` as ground,
 * digit nodes, free-form designators, `noiseless`, `en`/`in`, `tolerance …`): the current
 * text of every circuit cell, live or deleted, is rewritten to today's forms as a new
 * revision by the system user, with the message "language update". Older revisions stay as
 * they were; the editor offers the same rewrites as quick fixes when one is opened.
 */
export class LanguageUpdate1764633600013 implements MigrationInterface {
  name = 'LanguageUpdate1764633600013';

  async up(queryRunner: QueryRunner): Promise<void> {
    // No one can sign in as the system: its login is not one GitHub (or the stand-in) gives out, and it is disabled.
    await queryRunner.query('INSERT INTO users (login, name, email, siteRole, disabled) VALUES (?, ?, NULL, ?, 1)', [
      SYSTEM_USER.login,
      SYSTEM_USER.name,
      'member',
    ]);
    const [system]: { id: number }[] = await queryRunner.query('SELECT id FROM users WHERE login = ?', [SYSTEM_USER.login]);
    const now = new Date();
    for (let after = 0; ;) {
      const cells: { id: number; revision: number; text: string }[] = await queryRunner.query(
        `SELECT c.id, c.revision, r.text FROM cells c JOIN cell_revisions r ON r.cellId = c.id AND r.number = c.revision
          WHERE c.kind = 'circuit' AND c.id > ? ORDER BY c.id LIMIT ${batch}`,
        [after],
      );
      if (cells.length === 0) break;
      for (const cell of cells) {
        const modern = modernizeCellText(cell.text);
        if (!modern.changed) continue;
        const counts = checkCircuitText(modern.text);
        await queryRunner.query(
          `INSERT INTO cell_revisions (cellId, number, text, authorId, message, diagnosticErrors, diagnosticWarnings, createdAt)
           VALUES (?, ?, ?, ?, ?, ?, ?, ?)`,
          [cell.id, cell.revision + 1, modern.text, system!.id, message, counts.errors, counts.warnings, now],
        );
        await queryRunner.query('UPDATE cells SET revision = ? WHERE id = ?', [cell.revision + 1, cell.id]);
      }
      after = cells[cells.length - 1]!.id;
    }
  }

  /**
   * Takes back each update that is still its cell's current revision and that no pin or
   * version points at; an update that later work built on stays, as history. The system user
   * goes when nothing of it is left.
   */
  async down(queryRunner: QueryRunner): Promise<void> {
    const [system]: { id: number }[] = await queryRunner.query('SELECT id FROM users WHERE login = ?', [SYSTEM_USER.login]);
    if (!system) return;
    const undoable: { id: number; cellId: number; number: number }[] = await queryRunner.query(
      `SELECT r.id, r.cellId, r.number FROM cell_revisions r JOIN cells c ON c.id = r.cellId AND c.revision = r.number
        WHERE r.authorId = ? AND r.message = ?
          AND NOT EXISTS (SELECT 1 FROM pins p WHERE p.cellId = r.cellId AND p.revisionNumber = r.number)
          AND NOT EXISTS (SELECT 1 FROM notebook_version_cells v WHERE v.revisionId = r.id)`,
      [system.id, message],
    );
    for (const revision of undoable) {
      await queryRunner.query('UPDATE cells SET revision = ? WHERE id = ?', [revision.number - 1, revision.cellId]);
      await queryRunner.query('DELETE FROM cell_revisions WHERE id = ?', [revision.id]);
    }
    await queryRunner.query('DELETE FROM users WHERE id = ? AND NOT EXISTS (SELECT 1 FROM cell_revisions WHERE authorId = ?)', [system.id, system.id]);
  }
}
