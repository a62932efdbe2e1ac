import type Stripe from 'stripe';
import type { Request } from 'express';
import { directory, scoped } from '@rinkwright/db';
import { AppError } from '../../http/errors';
import { eventSeen, rememberEvent, webhookSecrets, type EndpointKind } from '../../lib/payment-settings';
import { syncCatalog } from './catalog';
import { applyInvoice, syncMembership } from './memberships';
import { syncPlan } from './plan';
import * as repo from './repository';
import { grantPayment, markFailed, type SalesDeps } from './sales';

// Webhooks from the payment service. The signature is checked with the SDK against our stored secrets; each
// event id is handled once; and every handler re-reads the object it is about, so order does not matter.

export function verifyEvent(deps: SalesDeps, req: Request, secrets: string[]): Stripe.Event {
  const signature = req.headers['stripe-signature'];
  const body = req.body as unknown;
  if (typeof signature !== 'string' || !Buffer.isBuffer(body)) throw new AppError('bad_request', 'Missing payment-service signature');
  for (const secret of secrets) {
    try {
      // The SDK rejects a wrong signature and a timestamp older than its tolerance (300 s): a replayed old event.
      return deps.payments.webhooks.constructEvent(body, signature, secret);
    } catch {
      // try the next secret
    }
  }
  throw new AppError('bad_request', 'The payment-service signature does not match');
}

export async function receiveEvent(deps: SalesDeps, req: Request, kind: EndpointKind): Promise<{ received: true }> {
  const event = verifyEvent(deps, req, await webhookSecrets(kind));
  if (await eventSeen(event.id)) return { received: true };
  if (kind === 'connect') await handleConnected(deps, event);
  else await handlePlatform(deps, event);
  await rememberEvent(event);
  return { received: true };
}

const idOf = (v: string | { id: string } | null | undefined) => (v ? (typeof v === 'string' ? v : v.id) : null);

async function handleConnected(deps: SalesDeps, event: Stripe.Event): Promise<void> {
  const account = event.account;
  if (!account) return;
  const rinkId = await directory.findRinkByConnectedAccount(account);
  // An account we do not know (another platform's, or a rink since deleted): acknowledged, nothing to do.
  if (!rinkId) return;
  const s = scoped(rinkId);
  const object = event.data.object as { id: string; metadata?: Record<string, string> | null };
  const paymentId = object.metadata?.payment_id;
  if (object.metadata?.rink_id && object.metadata.rink_id !== rinkId) return;
  switch (event.type) {
    case 'account.updated': {
      const acct = event.data.object;
      await repo.updateBilling(s, { chargesEnabled: acct.charges_enabled ? 1 : 0 });
      if (acct.charges_enabled) await syncCatalog(s, deps.payments);
      return;
    }
    case 'checkout.session.completed':
    case 'checkout.session.async_payment_succeeded': {
      const session = event.data.object;
      if (session.mode === 'subscription') {
        const sub = idOf(session.subscription);
        if (sub) await syncMembership(s, deps, account, sub);
      } else if (paymentId && session.payment_status === 'paid') {
        await grantPayment(s, deps, paymentId, { paidAt: new Date(event.created * 1000), paymentIntentId: idOf(session.payment_intent), serviceTime: event.created });
      }
      return;
    }
    // A checkout left unpaid, or paid by a delayed method that then failed: nothing to grant.
    case 'checkout.session.expired':
    case 'checkout.session.async_payment_failed':
      if (paymentId) await markFailed(s, paymentId);
      return;
    case 'payment_intent.succeeded':
      if (paymentId && !(await isMembershipPayment(s, paymentId))) {
        await grantPayment(s, deps, paymentId, { paidAt: new Date(event.created * 1000), paymentIntentId: object.id, serviceTime: event.created });
      }
      return;
    case 'customer.subscription.created':
    case 'customer.subscription.updated':
    case 'customer.subscription.deleted':
      await syncMembership(s, deps, account, object.id);
      return;
    case 'invoice.paid':
    case 'invoice.payment_succeeded':
    case 'invoice.payment_failed':
      await applyInvoice(s, deps, account, object.id);
      return;
    default:
      return;
  }
}

async function isMembershipPayment(s: ReturnType<typeof scoped>, paymentId: string) {
  const found = await repo.findPayment(s, paymentId);
  if (!found) return true;
  const product = await repo.findProduct(s, found.productId);
  return product?.kind === 'membership';
}

async function handlePlatform(deps: SalesDeps, event: Stripe.Event): Promise<void> {
  const object = event.data.object as { id: string; object: string; subscription?: string | { id: string } | null; parent?: { subscription_details?: { subscription?: string } } };
  switch (event.type) {
    case 'checkout.session.completed': {
      const sub = idOf((event.data.object as Stripe.Checkout.Session).subscription);
      if (sub) await syncPlan(deps, sub);
      return;
    }
    case 'customer.subscription.created':
    case 'customer.subscription.updated':
    case 'customer.subscription.deleted':
      await syncPlan(deps, object.id);
      return;
    case 'invoice.paid':
    case 'invoice.payment_failed': {
      const sub = idOf(object.subscription) ?? object.parent?.subscription_details?.subscription ?? null;
      if (sub) await syncPlan(deps, sub, event.type === 'invoice.payment_failed');
      return;
    }
    default:
      return;
  }
}
