import type { Metadata } from './types';

// The one error maker. The shape follows the Stripe API reference, "Errors": { error: { type, code, message, param, ... } };
// the SDK picks its error class from the status and type (stripe-node src/Error.ts, generateV1Error).
export type ErrorType = 'invalid_request_error' | 'card_error' | 'idempotency_error' | 'api_error';

export interface ErrorBody {
  type: ErrorType;
  message: string;
  code?: string;
  param?: string;
  decline_code?: string;
  payment_intent?: unknown;
  charge?: string;
  payment_method?: unknown;
  doc_url?: string;
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: ErrorBody,
    /** Parameter validation failures are not stored under an idempotency key (Stripe API reference, "Idempotent requests"). */
    readonly validation = false,
  ) {
    super(body.message);
  }
}

export function invalid(message: string, param?: string, code?: string): ApiError {
  return new ApiError(400, { type: 'invalid_request_error', message, ...(param ? { param } : {}), ...(code ? { code } : {}) }, true);
}

/** A rule of the resource refused the request after it started: stored under the idempotency key like the real service. */
export function refused(message: string, code?: string, param?: string): ApiError {
  return new ApiError(400, { type: 'invalid_request_error', message, ...(code ? { code } : {}), ...(param ? { param } : {}) });
}

export function noSuch(kind: string, id: string, param?: string): ApiError {
  return new ApiError(
    404,
    { type: 'invalid_request_error', code: 'resource_missing', message: `No such ${kind}: '${id}'`, ...(param ? { param } : {}) },
    true,
  );
}

// Form bodies carry every value as a string (stripe-node stringifies them); these readers coerce and validate.
export type Params = Record<string, unknown>;

export function allowParams(params: Params, allowed: readonly string[]): void {
  for (const key of Object.keys(params)) {
    if (key !== 'expand' && !allowed.includes(key)) throw invalid(`Received unknown parameter: ${key}`, key);
  }
}

export function str(params: Params, key: string, label = key): string | undefined {
  const value = params[key];
  if (value === undefined) return undefined;
  if (typeof value !== 'string') throw invalid(`Invalid string: ${label}`, label);
  return value;
}

export function requireStr(params: Params, key: string, label = key): string {
  const value = str(params, key, label);
  if (value === undefined || value === '') throw invalid(`Missing required param: ${label}.`, label, 'parameter_missing');
  return value;
}

/** Empty string clears a nullable field, as in the real API. */
export function nullableStr(params: Params, key: string, label = key): string | null | undefined {
  const value = str(params, key, label);
  return value === '' ? null : value;
}

export function int(params: Params, key: string, label = key): number | undefined {
  const value = str(params, key, label);
  if (value === undefined || value === '') return undefined;
  if (!/^-?\d+$/.test(value)) throw invalid(`Invalid integer: ${value}`, label);
  return Number(value);
}

export function requireInt(params: Params, key: string, label = key): number {
  const value = int(params, key, label);
  if (value === undefined) throw invalid(`Missing required param: ${label}.`, label, 'parameter_missing');
  return value;
}

export function decimal(params: Params, key: string, label = key): number | undefined {
  const value = str(params, key, label);
  if (value === undefined || value === '') return undefined;
  const parsed = Number(value);
  if (!Number.isFinite(parsed)) throw invalid(`Invalid decimal: ${value}`, label);
  return parsed;
}

export function bool(params: Params, key: string, label = key): boolean | undefined {
  const value = str(params, key, label);
  if (value === undefined) return undefined;
  if (value !== 'true' && value !== 'false') throw invalid(`Invalid boolean: ${value}`, label);
  return value === 'true';
}

export function obj(params: Params, key: string, label = key): Params | undefined {
  const value = params[key];
  if (value === undefined || value === '') return undefined;
  if (typeof value !== 'object' || value === null || Array.isArray(value)) throw invalid(`Invalid object`, label);
  return value as Params;
}

/** qs turns `a[0]=x` into an array but long or sparse lists into objects with numeric keys; both count as a list. */
export function list(params: Params, key: string, label = key): unknown[] | undefined {
  const value = params[key];
  if (value === undefined || value === '') return undefined;
  if (Array.isArray(value)) return value as unknown[];
  if (typeof value === 'object' && value !== null) {
    const entries = Object.entries(value);
    if (entries.every(([k]) => /^\d+$/.test(k))) return entries.sort(([a], [b]) => Number(a) - Number(b)).map(([, v]) => v);
  }
  throw invalid(`Invalid array`, label);
}

export function strList(params: Params, key: string, label = key): string[] | undefined {
  return list(params, key, label)?.map((value, index) => {
    if (typeof value !== 'string') throw invalid(`Invalid string: ${label}[${index}]`, `${label}[${index}]`);
    return value;
  });
}

export function objList(params: Params, key: string, label = key): Params[] | undefined {
  return list(params, key, label)?.map((value, index) => {
    if (typeof value !== 'object' || value === null) throw invalid(`Invalid object`, `${label}[${index}]`);
    return value as Params;
  });
}

/**
 * Metadata updates merge key by key; an empty string unsets a key and `metadata=''` clears all
 * (Stripe API reference, "Metadata").
 */
export function mergeMetadata(current: Metadata, params: Params, key = 'metadata'): Metadata {
  const value = params[key];
  if (value === undefined) return current;
  if (value === '') return {};
  if (typeof value !== 'object' || value === null) throw invalid('Invalid metadata', key);
  const next = { ...current };
  for (const [name, entry] of Object.entries(value)) {
    if (typeof entry !== 'string') throw invalid(`Invalid string: ${key}[${name}]`, `${key}[${name}]`);
    if (entry === '') delete next[name];
    else next[name] = entry;
  }
  return next;
}

export function oneOf<T extends string>(value: string | undefined, allowed: readonly T[], param: string): T | undefined {
  if (value === undefined) return undefined;
  if (!(allowed as readonly string[]).includes(value)) {
    throw invalid(`Invalid ${param}: must be one of ${allowed.join(', ')}`, param);
  }
  return value as T;
}

/** The error `param` of a nested field: nested('line_items[0]', 'price') is 'line_items[0][price]'. */
export function nested(label: string, name: string): string {
  return label ? `${label}[${name}]` : name;
}
