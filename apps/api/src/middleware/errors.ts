import type { ErrorRequestHandler, RequestHandler } from 'express';
import { z } from 'zod';
import { AppError, fieldsOf } from '../http/errors';

export const notFoundHandler: RequestHandler = (_req, _res, next) => next(AppError.notFound('No such route'));

/** The one mapping from errors to HTTP answers: every error body is { error: { code, message, fields? } }. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  let error: AppError;
  if (err instanceof AppError) error = err;
  else if (err instanceof z.ZodError) error = new AppError('validation_failed', 'Some fields need attention', fieldsOf(err));
  else if (isBodyParseError(err)) error = new AppError('bad_request', 'The request body is not valid JSON');
  else if (isDatabaseUnreachable(err)) {
    req.log.error({ err }, 'database unreachable');
    error = new AppError('unavailable', 'Rinkwright cannot reach its database just now; nothing was changed. Try again shortly.');
  }
  else {
    req.log.error({ err }, 'unhandled error');
    error = new AppError('internal', 'Something went wrong on our side; nothing was changed');
  }
  if (error.status >= 500 && err instanceof AppError) req.log.error({ err }, error.message);
  res.status(error.status).json({ error: { code: error.code, message: error.message, ...(error.fields ? { fields: error.fields } : {}) } });
};

function isBodyParseError(err: unknown): boolean {
  return typeof err === 'object' && err !== null && 'type' in err && (err as { type: unknown }).type === 'entity.parse.failed';
}

const UNREACHABLE = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'PROTOCOL_CONNECTION_LOST', 'ER_CON_COUNT_ERROR']);

/** A driver error that means the database is down or full, possibly wrapped by Drizzle as the cause. */
function isDatabaseUnreachable(err: unknown): boolean {
  for (let e = err, depth = 0; e && typeof e === 'object' && depth < 4; e = (e as { cause?: unknown }).cause, depth++) {
    const code = (e as { code?: unknown }).code;
    if (typeof code === 'string' && UNREACHABLE.has(code)) return true;
  }
  return false;
}
