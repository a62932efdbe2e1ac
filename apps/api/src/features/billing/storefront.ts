import type { CheckoutInput, PublicRink } from '@rinkwright/core';
import { directory, scoped } from '@rinkwright/db';
import { AppError } from '../../http/errors';
import type { UserContext } from '../../http/route';
import { catalogOf } from './catalog';
import { effectivePlanState } from './plan';
import * as repo from './repository';
import { checkoutStatus, customerByEmail, startCheckout, type SalesDeps } from './sales';

// The rink's public page (/r/:slug): what it sells, and hosted checkout for anyone with an e-mail address.

async function rinkOf(slug: string) {
  const rink = await directory.findRinkBySlug(slug);
  // A suspended rink's public page is gone until the platform reactivates it.
  if (!rink || rink.standing.suspendedAt) throw AppError.notFound('No such rink');
  return rink;
}

export async function publicRink(slug: string): Promise<PublicRink> {
  const rink = await rinkOf(slug);
  const s = scoped(rink.id);
  const billing = await repo.findBilling(s);
  const products = (await catalogOf(s)).filter((p) => p.active && p.listed && p.kind !== 'league_pack');
  return {
    rink: { name: rink.name, slug: rink.slug, currency: rink.currency, timeZone: rink.timeZone },
    products: products.map(({ id, kind, name, description, credits, monthsValid, interval, price }) => ({ id, kind, name, description, credits, monthsValid, interval, price })),
    selling: billing?.chargesEnabled === 1 && effectivePlanState(billing, new Date()) !== 'read_only',
  };
}

export async function publicCheckout(slug: string, deps: SalesDeps, input: CheckoutInput, user: UserContext | null) {
  const rink = await rinkOf(slug);
  const s = scoped(rink.id);
  // A signed-in skater buys for their own verified address; anyone else names the address the credits belong to.
  const email = user ? user.email.toLowerCase() : input.email;
  const customer = await customerByEmail(s, email, input.name);
  return startCheckout(s, deps, { productId: input.productId, customer, successPath: `/r/${rink.slug}/thanks`, cancelPath: `/r/${rink.slug}`, createdBy: user?.userId ?? null });
}

export async function publicCheckoutStatus(slug: string, sessionId: string) {
  const rink = await rinkOf(slug);
  return checkoutStatus(scoped(rink.id), sessionId);
}
