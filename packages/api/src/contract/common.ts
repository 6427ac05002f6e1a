import { z } from 'zod';

/** Name of the double-submit cookie that holds the CSRF token (readable by scripts). */
export const CSRF_COOKIE = 'rolloff_csrf';
/** Header every state-changing request must carry, equal to the CSRF cookie's value. */
export const CSRF_HEADER = 'x-csrf-token';
/** Name of the HttpOnly session cookie. */
export const SESSION_COOKIE = 'rolloff_session';
/**
 * Header that makes a creating write safe to retry: the same key (per user, for a day) again
 * answers the first outcome; the same key on a different request is 422 `key_reused`.
 */
export const IDEMPOTENCY_HEADER = 'idempotency-key';
/** Header on an answer repeated for an Idempotency-Key seen before. */
export const IDEMPOTENT_REPLAY_HEADER = 'idempotent-replayed';

/** Limits the API enforces; the web checks the same numbers before it sends. */
export const LIMITS = {
  /** Cell text, in UTF-8 bytes (64 KiB). Over it: 413 `too_large`. */
  cellTextBytes: 64 * 1024,
  /** Live cells in one notebook. Over it: 413 `too_large`. */
  cellsPerNotebook: 500,
  /** Notebook title, in characters. Over it: 400 `validation`. */
  titleLength: 200,
  /** Notebook description, in characters. Over it: 400 `validation`. */
  descriptionLength: 2000,
  /** Version label, in characters. */
  versionLabelLength: 200,
  /** A cell's title, in characters. */
  cellTitleLength: 80,
  /** Search text of the notebook list. */
  searchLength: 200,
  /** Default and largest page of a paged list. */
  pageSize: 20,
  maxPageSize: 100,
  /** A comment on a pin, a review request's message or a reviewer's summary, in characters. */
  markdownLength: 10_000,
  /** The label of the trace a pin points at, in characters. */
  traceLabelLength: 100,
  /** People asked in one review request. */
  reviewersPerRequest: 20,
} as const;

export const ErrorIdSchema = z.enum([
  'not_found',
  'validation',
  'conflict',
  'unauthenticated',
  'forbidden',
  'too_large',
  'key_reused',
  'rate_limited',
  'unavailable',
  'internal',
]);
export type ErrorId = z.infer<typeof ErrorIdSchema>;

/** One zod issue of a refused request: `path` names the field (`cells.3.text`, `title`). */
export const ValidationIssueSchema = z.object({
  path: z.string(),
  message: z.string(),
});
export type ValidationIssue = z.infer<typeof ValidationIssueSchema>;

/** Every error answer: `{ error, message, details? }`; `validation` details are `{ issues }`. */
export const ErrorBodySchema = z.object({
  error: ErrorIdSchema,
  message: z.string(),
  details: z.unknown().optional(),
});
export type ErrorBody = z.infer<typeof ErrorBodySchema>;

export const ValidationDetailsSchema = z.object({ issues: z.array(ValidationIssueSchema) });
export type ValidationDetails = z.infer<typeof ValidationDetailsSchema>;

/** Times are ISO 8601 strings in UTC with milliseconds (`2026-12-02T10:15:00.000Z`). */
export const TimestampSchema = z.iso.datetime();
export type Timestamp = z.infer<typeof TimestampSchema>;

/** Notebook ids are random and URL-safe, so a shared link cannot be guessed from another. */
export const NotebookIdSchema = z.string().regex(/^[A-Za-z0-9_-]{12}$/, 'not a notebook id');
export type NotebookId = z.infer<typeof NotebookIdSchema>;

/** Numeric ids of users and cells, as path parameters (`/cells/42`). */
export const NumericIdSchema = z.coerce.number().int().positive().max(4_294_967_295);

/** A person as other people see them: never their e-mail. */
export const UserRefSchema = z.object({
  id: z.number().int(),
  login: z.string(),
  name: z.string(),
});
export type UserRef = z.infer<typeof UserRefSchema>;

/** Counts of the solver's diagnostics for one circuit-cell text. */
export const DiagnosticCountsSchema = z.object({
  errors: z.number().int().nonnegative(),
  warnings: z.number().int().nonnegative(),
});
export type DiagnosticCounts = z.infer<typeof DiagnosticCountsSchema>;

/** Bytes of a string in UTF-8, without TextEncoder allocations for the common ASCII case. */
export function utf8Length(text: string): number {
  let bytes = 0;
  for (let i = 0; i < text.length; i++) {
    const code = text.charCodeAt(i);
    if (code < 0x80) bytes += 1;
    else if (code < 0x800) bytes += 2;
    else if (code >= 0xd800 && code <= 0xdbff && i + 1 < text.length) {
      bytes += 4;
      i++;
    } else bytes += 3;
  }
  return bytes;
}

/** Marks a zod issue as "over a size limit", which the API answers with 413 `too_large`. */
export const TOO_LARGE_PARAM = 'tooLarge';

/** Control characters (C0, DEL, C1): none belongs in a one-line name. */
const controlCharacter = /[\u0000-\u001F\u007F-\u009F]/;

/** A one-line name (a title, a label) has no control characters: no NUL, ESC, CR or LF. */
export const isOneLine = (text: string): boolean => !controlCharacter.test(text);

/** The message for a name that fails `oneLine`. */
export const oneLineMessage = (what: string) => `${what} is one line of plain text: no line breaks, tabs or other control characters.`;

/** A notebook title: trimmed, 1 to 200 characters, one line. */
export const TitleSchema = z
  .string()
  .trim()
  .min(1, 'A title cannot be empty.')
  .max(LIMITS.titleLength, `A title has at most ${LIMITS.titleLength} characters.`)
  .refine(isOneLine, oneLineMessage('A title'));

/**
 * A notebook's description: plain text, shown as written and never rendered as Markdown.
 * Line breaks are kept (CR LF becomes LF); other control characters are refused. Trimmed,
 * at most 2 000 characters; empty means no description.
 */
export const DescriptionSchema = z
  .string()
  .overwrite((text) => text.replace(/\r\n?/g, '\n'))
  .trim()
  .max(LIMITS.descriptionLength, `A description has at most ${LIMITS.descriptionLength} characters.`)
  // Tab and line feed are the only control characters plain text needs.
  .refine((text) => !/[\u0000-\u0008\u000B-\u001F\u007F]/.test(text), 'A description is plain text: no control characters other than line breaks and tabs.');

/** The text of a cell: any string up to 64 KiB of UTF-8. */
export const CellTextSchema = z.string().refine((text) => utf8Length(text) <= LIMITS.cellTextBytes, {
  message: `A cell holds at most ${LIMITS.cellTextBytes / 1024} KiB of text.`,
  params: { [TOO_LARGE_PARAM]: true },
});

/**
 * Markdown written by a person (a comment, a review message or summary): trimmed, at most
 * 10 000 characters. Stored and sent as written; the web renders it without raw HTML.
 */
export const MarkdownSchema = z.string().trim().max(LIMITS.markdownLength, `Markdown text has at most ${LIMITS.markdownLength} characters.`);

/** Query of a paged list: `cursor` is opaque (the previous page's `nextCursor`). */
export const PageQuerySchema = z.object({
  cursor: z.string().max(200).optional(),
  limit: z.coerce.number().int().min(1).max(LIMITS.maxPageSize).default(LIMITS.pageSize),
});
export type PageQuery = z.infer<typeof PageQuerySchema>;
