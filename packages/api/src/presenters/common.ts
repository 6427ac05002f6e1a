import type { DiagnosticCounts, UserRef } from '../contract/common.js';
import type { UserRefRow } from '../services/users.js';

export const iso = (date: Date): string => date.toISOString();
export const isoOrNull = (date: Date | null): string | null => (date ? date.toISOString() : null);

export function presentUserRef(row: UserRefRow): UserRef {
  return { id: row.id, login: row.login, name: row.name };
}

/** An author joined by LEFT JOIN: null when the author is gone or unknown. */
export function presentAuthor(id: number | null, login: string | null, name: string | null): UserRef | null {
  return id === null || login === null ? null : { id, login, name: name ?? '' };
}

export function presentDiagnostics(errors: number | null, warnings: number | null): DiagnosticCounts | null {
  return errors === null || warnings === null ? null : { errors, warnings };
}
