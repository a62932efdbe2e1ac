import type { ErrorCode } from '@rinkwright/core';
import { type z } from 'zod';

export const STATUS_OF: Record<ErrorCode, number> = {
  bad_request: 400,
  validation_failed: 400,
  unauthenticated: 401,
  forbidden: 403,
  forbidden_origin: 403,
  not_found: 404,
  conflict: 409,
  insufficient_credits: 409,
  read_only: 403,
  suspended: 403,
  payment_failed: 402,
  payment_unavailable: 503,
  unprocessable: 422,
  rate_limited: 429,
  unavailable: 503,
  internal: 500,
};

export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly fields?: Record<string, string[]>,
  ) {
    super(message);
  }

  get status(): number {
    return STATUS_OF[this.code];
  }

  static notFound(what = 'Not found'): AppError {
    return new AppError('not_found', what);
  }

  static field(field: string, message: string): AppError {
    return new AppError('validation_failed', message, { [field]: [message] });
  }
}

/** Per-field messages from a zod error, keyed by dotted path ("" for the whole value). */
export function fieldsOf(error: z.ZodError, prefix?: string): Record<string, string[]> {
  const fields: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = [prefix, ...issue.path.map(String)].filter(Boolean).join('.') || (prefix ?? '_');
    (fields[key] ??= []).push(issue.message);
  }
  return fields;
}

/** Turns an error thrown by better-auth's server API into ours, keeping its message for the user. */
export function fromAuthError(error: unknown): unknown {
  if (typeof error !== 'object' || error === null || !('statusCode' in error)) return error;
  const status = Number((error as { statusCode: unknown }).statusCode);
  const body = (error as { body?: { message?: unknown } }).body;
  const message = typeof body?.message === 'string' ? body.message : 'The request was refused';
  if (status === 400 || status === 422) return new AppError('bad_request', message);
  if (status === 401) return new AppError('unauthenticated', message);
  if (status === 403) return new AppError('forbidden', message);
  if (status === 404) return new AppError('not_found', message);
  if (status === 409) return new AppError('conflict', message);
  if (status === 429) return new AppError('rate_limited', message);
  return error;
}
