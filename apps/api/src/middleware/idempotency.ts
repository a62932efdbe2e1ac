import { createHash } from 'node:crypto';
import type { Request } from 'express';
import { eq } from 'drizzle-orm';
import { idempotencyKey, isDuplicateKey, scoped } from '@rinkwright/db';
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

/** Runs `work` once per key: replays the stored answer for a repeat, refuses a reuse with another request. */
export async function once(tenantId: string, key: string, route: string, hash: string, work: () => Promise<StoredAnswer>): Promise<StoredAnswer> {
  const scope = scoped(tenantId);
  const where = eq(idempotencyKey.key, key);
  try {
    await scope.insert(idempotencyKey, { key, route, requestHash: hash, statusCode: 0, responseBody: '' });
  } catch (error) {
    if (!isDuplicateKey(error)) throw error;
    const first = await scope.findOne(idempotencyKey, where);
    if (!first) throw error;
    if (first.requestHash !== hash || first.route !== route) {
      throw new AppError('unprocessable', 'This Idempotency-Key was already used for a different request');
    }
    if (first.statusCode === 0) throw new AppError('conflict', 'The first request with this Idempotency-Key is still running; try again in a moment');
    return { status: first.statusCode, body: JSON.parse(first.responseBody) };
  }
  let answer: StoredAnswer;
  try {
    answer = await work();
  } catch (error) {
    // A refused or failed write changed nothing, so the key is released for a corrected retry.
    await scope.remove(idempotencyKey, where);
    throw error;
  }
  await scope.update(idempotencyKey, { statusCode: answer.status, responseBody: JSON.stringify(answer.body) }, where);
  return answer;
}
