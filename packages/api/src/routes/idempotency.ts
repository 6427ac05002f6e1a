/**
 * `Idempotency-Key` on creating writes: a retry of a request whose answer was lost (a 503
 * after a COMMIT that went through) gets the first answer again, status and body, instead of
 * the write being done twice or refused as a conflict with the sender's own text.
 */
import { createHash } from 'node:crypto';
import type { Request, Response } from 'express';
import { actorOf } from '../auth/require-user.js';
import { IDEMPOTENCY_HEADER, IDEMPOTENT_REPLAY_HEADER } from '../contract/common.js';
import { connect } from '../db/connection.js';
import { ApiError, errorBody, validation } from '../errors.js';
import { recordAnswer, removeExpiredKeys, storedAnswer } from '../services/idempotency.js';
import type { KeyedRequest, Once, StoredAnswer } from '../services/idempotency.js';

export interface Answer {
  status: number;
  body: unknown;
}

const keyPattern = /^[\x21-\x7e]{1,255}$/;

/** The request's key, user and fingerprint (its method, address and body), or null without the header. */
function keyedRequest(req: Request): KeyedRequest | null {
  const key = req.get(IDEMPOTENCY_HEADER);
  if (key === undefined) return null;
  if (!keyPattern.test(key)) throw validation(`The ${IDEMPOTENCY_HEADER} header must be 1 to 255 visible ASCII characters, such as a UUID.`);
  const fingerprint = createHash('sha256')
    .update(`${req.method} ${req.originalUrl}\n${JSON.stringify(req.body ?? null)}`)
    .digest('hex');
  return { userId: actorOf(req).id, key, fingerprint };
}

function replay(res: Response, request: KeyedRequest, stored: StoredAnswer): void {
  if (stored.fingerprint !== request.fingerprint) {
    throw new ApiError(
      'key_reused',
      `This ${IDEMPOTENCY_HEADER} was already used for a different request (another address or body). Send a new key with a new request; send the same request again to get its first answer.`,
    );
  }
  res.set(IDEMPOTENT_REPLAY_HEADER, 'true').status(stored.status).json(stored.body);
}

/** Keeps an answer given outside a transaction; one stored meanwhile by a twin request wins. */
async function keep(request: KeyedRequest, answer: Answer): Promise<void> {
  try {
    await recordAnswer((await connect()).manager, request, answer.status, answer.body);
  } catch (error) {
    const failure = error as { code?: string; driverError?: { code?: string } };
    if ((failure.code ?? failure.driverError?.code) !== 'ER_DUP_ENTRY') throw error;
  }
}

/**
 * Answers a creating write at most once per key. Without the header `work` simply runs. With
 * it: the stored answer if the key was seen (422 `key_reused` if on another request); else
 * `work` runs and its answer is stored, inside the write's transaction when the service takes
 * `once`, else just after. A 4xx answer is stored too; a 5xx is not, so a retry runs again.
 */
export async function answerOnce(req: Request, res: Response, work: (once: Once | null) => Promise<Answer>): Promise<void> {
  const request = keyedRequest(req);
  if (!request) {
    const answer = await work(null);
    res.status(answer.status).json(answer.body);
    return;
  }
  const db = await connect();
  const stored = await storedAnswer(db, request);
  if (stored) return replay(res, request, stored);

  let recorded = false;
  const once: Once = {
    record: async (manager, status, body) => {
      await recordAnswer(manager, request, status, body);
      recorded = true;
    },
  };
  let answer: Answer;
  try {
    answer = await work(once);
  } catch (error) {
    // A twin request with this key may have been answered meanwhile, or this one's COMMIT went
    // through before the connection dropped: then its stored answer is the answer.
    const meanwhile = await storedAnswer(db, request).catch(() => null);
    if (meanwhile) return replay(res, request, meanwhile);
    if (error instanceof ApiError && error.status < 500) await keep(request, { status: error.status, body: errorBody(error) });
    throw error;
  }
  if (!recorded) await keep(request, answer);
  await removeExpiredKeys(db);
  res.status(answer.status).json(answer.body);
}
