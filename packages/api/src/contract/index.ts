/**
 * The request and response schemas that the API and the web share. The web imports this
 * module as `@rolloff/api/contract` and never re-declares an API type by hand.
 *
 * Routes (all JSON; errors are `ErrorBodySchema` with a stable `error` id):
 * - `GET /auth/github[?login=NAME&returnTo=/path]` starts GitHub sign-in (or the stand-in's);
 *   `GET /auth/github/callback` finishes it and redirects to `/notebooks` (or `returnTo`);
 *   `POST /auth/logout` → 204. `GET /api/me` → MeSchema, 401 when signed out.
 * - `GET /api/notebooks` (NotebookListQuerySchema → NotebookListSchema; `sort=changed|title|created`,
 *   `order=desc|asc`, keyset cursors), `POST /api/notebooks`,
 *   `GET|PATCH|DELETE /api/notebooks/:id`, `POST /api/notebooks/:id/restore`.
 * - `POST /api/notebooks/:id/cells`, `PUT|PATCH|DELETE /api/notebooks/:id/cells/:cellId`,
 *   `POST …/cells/:cellId/move`, `POST …/cells/:cellId/restore`,
 *   `GET …/cells/:cellId/revisions`, `GET …/cells/:cellId/revisions/:number`,
 *   `POST …/cells/:cellId/revisions/:number/restore`.
 * - `POST|GET /api/notebooks/:id/versions`, `GET /api/notebooks/:id/versions/:number`.
 * - `POST|GET /api/notebooks/:id/forks`.
 * - `GET /api/notebooks/:id/members`, `PUT|DELETE /api/notebooks/:id/members/:userId`.
 * - `GET /api/users?q=` (people to share with); admins: `GET /api/admin/users`,
 *   `PATCH /api/admin/users/:userId`, `GET /api/admin/mail` (the relay and the outbox).
 * - `POST|GET /api/notebooks/:id/reviews`, `GET …/reviews/:reviewId`,
 *   `POST …/reviews/:reviewId/decision`.
 * - `GET|POST /api/notebooks/:id/pins`, `POST …/pins/:pinId/comments`,
 *   `POST …/pins/:pinId/resolve`, `POST …/pins/:pinId/reopen`.
 * - `GET /api/notebooks/:id/activity` (the timeline, paged).
 * - `GET|PATCH /api/me/settings` (which e-mails the caller wants).
 *
 * E-mail is queued in the transaction that stores the change and sent after it by the outbox
 * (kept while the relay is away, sent once it is back); it never holds up or fails the request: to
 * reviewers when a review is asked for, to the requester and the notebook's editors and owner
 * when a reviewer decides, to the earlier people of a pin thread on a reply, and to a person
 * given a role in a notebook; never to someone who turned that kind off in their settings.
 *
 * Sign-in, writes and reads of notebooks and people are rate-limited per address and per user:
 * past a limit the answer is 429 `rate_limited` with a `Retry-After` header (seconds), and
 * `details` says the limit, the window and the wait.
 *
 * A notebook the caller may not read answers 404 `not_found`, exactly like one that does not
 * exist; one the caller may read but not change answers 403 `forbidden`.
 *
 * Cross-site request forgery (double-submit cookie): every response that arrives without it
 * sets the cookie `rolloff_csrf` (CSRF_COOKIE) to a random token; it is not HttpOnly, so the
 * page's script can read it. Every POST, PUT, PATCH and DELETE under `/api` and `/auth/logout`
 * must send that value in the `x-csrf-token` header (CSRF_HEADER), or it is refused with 403
 * `forbidden`. A request whose `Origin` header names another site is refused the same way.
 * Another site can make a browser send our cookies but can neither read the token nor set
 * the header, and the session cookie is `SameSite=Lax` besides.
 */
export * from './common.js';
export * from './health.js';
export * from './users.js';
export * from './cells.js';
export * from './versions.js';
export * from './notebooks.js';
export * from './forks.js';
export * from './members.js';
export * from './reviews.js';
export * from './pins.js';
export * from './activity.js';
export * from './settings.js';
export * from './mail-status.js';
