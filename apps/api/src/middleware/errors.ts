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
