import { randomBytes } from 'node:crypto';

/** A new notebook id: 12 URL-safe characters (72 random bits). */
export function newNotebookId(): string {
  return randomBytes(9).toString('base64url');
}
