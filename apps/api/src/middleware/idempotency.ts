import { createHash } from 'node:crypto';
import type { Request } from 'express';
import { eq } from 'drizzle-orm';
import { idempotencyKey, isDuplicateKey, preparedInsert, scoped, step, type Scope } from '@rinkwright/db';
import { AppError } from '../http/errors';

// Every write from the counter carries a key the client made. The first request with a key claims it (an
// INSERT that a second, concurrent one cannot also win), runs, and stores its answer; a repeat with the same
// body gets that answer again; the same key with another body is refused. Keys are kept per rink.

const KEY = /^[\w-]{8,100}$/;

export interface StoredAnswer {
  status: number;
  body: unknown;
}

export function idempotencyKeyOf(req: Request): string {
  const key = req.get('idempotency-key');
  if (!key) throw AppError.field('Idempotency-Key', 'This write needs an Idempotency-Key header, made once per action by the client');
  if (!KEY.test(key)) throw AppError.field('Idempotency-Key', 'Use 8 to 100 letters, digits, dashes or underscores');
  return key;
}

export function requestHash(route: string, params: unknown, body: unknown): string {
  return createHash('sha256').update(JSON.stringify([route, params, body ?? null])).digest('hex');
}

type KeyRow = typeof idempotencyKey.$inferSelect;

/** Every atomic write ends with this insert, so it is built once. */
const answerInsert = preparedInsert(idempotencyKey, ['key', 'route', 'requestHash', 'statusCode', 'responseBody']);

/** The answer stored for a key that is already taken, or why it cannot be replayed. */
function replayOf(first: KeyRow, route: string, hash: string): StoredAnswer {
  if (first.requestHash !== hash || first.route !== route) {
    throw new AppError('unprocessable', 'This Idempotency-Key was already used for a different request');
  }
  if (first.statusCode === 0) throw new AppError('conflict', 'The first request with this Idempotency-Key is still running; try again in a moment');
  return { status: first.statusCode, body: JSON.parse(first.responseBody) };
}

/**
 * Runs `work` once per key: replays the stored answer for a repeat, refuses a reuse with another request.
 *
 * Atomic: the work and its stored answer are one transaction, and `work` gets its scope. A repeat runs the work
 * again inside its own transaction, which cannot commit: it ends on the answer's unique key at the latest (or on a
 * ledger key, or on a rule the first request's writes now break), rolls back whole, and replays the first answer.
 * So a repeat costs no read up front, nothing is ever left claimed without an answer, and a refused write leaves
 * the key free for a corrected retry.
 *
 * Otherwise the claim commits first, so the work may commit on its own (a payment service call in the middle), and a
 * repeat during the work is told to try again.
 */
export async function once(
  tenantId: string,
  claim: { key: string; route: string; hash: string; atomic: boolean },
  work: (scope: Scope) => Promise<StoredAnswer>,
): Promise<StoredAnswer> {
  const { key, route, hash } = claim;
  const where = eq(idempotencyKey.key, key);
  const claimed = { key, route, requestHash: hash };
  const stored = (answer: StoredAnswer) => ({ statusCode: answer.status, responseBody: JSON.stringify(answer.body) });
  const scope = scoped(tenantId);
  const replay = async (error: unknown) => {
    const first = await scope.findOne(idempotencyKey, where);
    if (!first) throw error;
    return replayOf(first, route, hash);
  };
  if (claim.atomic) {
    try {
      return await scope.transaction(async (tx) => {
        const answer = await work(tx);
        // Sent with the COMMIT: a repeat's answer fails there on the unique key, and nothing of it commits.
        tx.atCommit(step.insert(answerInsert, { ...claimed, ...stored(answer) }));
        return answer;
      });
    } catch (error) {
      // Rolled back whole. A repeat of an answered key fails one way or another (the answer's unique key, a ledger
      // key, or a rule the first request's writes now break), and gets the first answer; anything else is its own.
      return replay(error);
    }
  }
  try {
    await scope.insert(idempotencyKey, { ...claimed, statusCode: 0, responseBody: '' });
  } catch (error) {
    if (!isDuplicateKey(error)) throw error;
    return replay(error);
  }
  let answer: StoredAnswer;
  try {
    answer = await work(scope);
  } catch (error) {
    // A refused or failed write changed nothing, so the key is released for a corrected retry.
    await scope.remove(idempotencyKey, where);
    throw error;
  }
  await scope.update(idempotencyKey, stored(answer), where);
  return answer;
}
