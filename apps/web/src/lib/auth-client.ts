import { createAuthClient } from 'better-auth/react';

// better-auth's client for the account screens (sign-up, sign-in, verification, password). Rink and staff
// actions go through our own API, which checks roles per rink.
export const authClient = createAuthClient({ baseURL: window.location.origin, basePath: '/api/auth' });

/** A readable sentence for an error answered by better-auth. */
export function authMessage(error: { message?: string | undefined; code?: string | undefined; status?: number } | null | undefined): string {
  if (!error) return '';
  if (error.status === 429) return 'Too many attempts: wait a minute and try again.';
  if (error.code === 'INVALID_EMAIL_OR_PASSWORD') return 'That e-mail and password do not match an account.';
  if (error.code === 'EMAIL_NOT_VERIFIED') return 'Confirm your e-mail first: we have sent you a new link.';
  if (error.code === 'USER_ALREADY_EXISTS' || error.code === 'USER_ALREADY_EXISTS_USE_ANOTHER_EMAIL') return 'An account with this e-mail already exists. Sign in instead.';
  if (error.code === 'INVALID_TOKEN') return 'This link has expired or was already used. Ask for a new one.';
  return error.message ?? 'Something went wrong. Try again.';
}
