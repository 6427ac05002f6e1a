/** Escaping for the few pages the server renders itself (sign-in messages, the dev mailbox, the OAuth stand-in). */

const entities: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

/** `text` made safe to place in HTML text or in a quoted attribute value. */
export const escapeHtml = (text: string): string => text.replace(/[&<>"']/g, (c) => entities[c]!);
