import Stripe from 'stripe';
import type { Env } from '../env';
import { AppError } from '../http/errors';

// The payment service, through its official SDK. The host comes from STRIPE_API_BASE, so the same code talks
// to the local fake in the demo and tests and to the real service with real keys.

export type Payments = Stripe;

export function createPayments(env: Env): Payments {
  const base = new URL(env.STRIPE_API_BASE);
  const protocol = base.protocol === 'http:' ? 'http' : 'https';
  return new Stripe(env.STRIPE_SECRET_KEY, {
    host: base.hostname,
    port: Number(base.port || (protocol === 'http' ? 80 : 443)),
    protocol,
    // The SDK keeps the same Idempotency-Key across its own retries, so a retried charge is never doubled.
    maxNetworkRetries: 2,
    timeout: 20_000,
    appInfo: { name: 'Rinkwright' },
  });
}

/** The platform's fee on a sale: basis points of the amount, rounded half up to the minor unit. */
export const applicationFee = (amountMinor: number, feeBps: number) => Math.round((amountMinor * feeBps) / 10_000);

/** Connection failures and the service's own 5xx become one clear 503; card problems are the caller's to show. */
export function paymentFailure(error: unknown): never {
  if (error instanceof Stripe.errors.StripeCardError) throw new AppError('payment_failed', error.message || 'The card was declined');
  if (error instanceof Stripe.errors.StripeError) {
    if (error.statusCode !== undefined && error.statusCode < 500 && error.type !== 'StripeConnectionError') {
      throw new AppError('bad_request', `The payment service refused: ${error.message}`);
    }
  }
  throw new AppError('payment_unavailable', 'The payment service is not answering; nothing was charged. Try again in a moment.');
}

/** Runs a call to the payment service and maps its failures (see paymentFailure). */
export async function callPayments<T>(fn: () => Promise<T>): Promise<T> {
  try {
    return await fn();
  } catch (error) {
    if (error instanceof AppError) throw error;
    paymentFailure(error);
  }
}
