import type { NextFunction, Request, Response } from 'express';
import { AppError } from '../http/errors';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * better-auth checks Origin only on /api/auth/*; the app's own cookie-authenticated writes get the same
 * check here, so another site cannot make a signed-in browser post to us (SameSite=Lax is the second wall).
 */
export function checkOrigin(allowed: string[]) {
  const origins = new Set(allowed);
  return (req: Request, _res: Response, next: NextFunction) => {
    if (SAFE.has(req.method)) return next();
    const origin = req.get('origin') ?? refererOrigin(req.get('referer'));
    if (!req.get('cookie')) return next();
    if (!origin || !origins.has(origin)) return next(new AppError('forbidden_origin', 'This request came from a page we do not trust'));
    next();
  };
}

function refererOrigin(referer: string | undefined): string | undefined {
  if (!referer) return undefined;
  try {
    return new URL(referer).origin;
  } catch {
    return undefined;
  }
}
