import { z } from 'zod';

export const ERROR_CODES = [
  'bad_request',
  'validation_failed',
  'unauthenticated',
  'forbidden',
  'forbidden_origin',
  'not_found',
  'conflict',
  'insufficient_credits',
  'read_only',
  'suspended',
  'payment_failed',
  'payment_unavailable',
  'unprocessable',
  'rate_limited',
  'unavailable',
  'internal',
] as const;
export type ErrorCode = (typeof ERROR_CODES)[number];

/** The one error body every route answers with. */
export const errorBody = z.object({
  error: z.object({
    code: z.enum(ERROR_CODES),
    message: z.string(),
    fields: z.record(z.string(), z.array(z.string())).optional(),
  }),
});
export type ErrorBody = z.infer<typeof errorBody>;

export const id = z.string().min(1).max(36);
export const emptyObject = z.object({});
export const okResponse = z.object({ ok: z.literal(true) });

export const healthResponse = z.object({ status: z.enum(['ok', 'degraded']), db: z.enum(['up', 'down']) });

export const email = z
  .string()
  .trim()
  .toLowerCase()
  .pipe(z.email('Enter a valid e-mail address').max(320, 'That e-mail address is too long'));
