import { randomUUID } from 'node:crypto';
import type { ProductInput, ProductRow } from '@rinkwright/core';
import { scoped, type Scope } from '@rinkwright/db';
import type { RinkContext } from '../../http/route';
import { AppError } from '../../http/errors';
import { callPayments, type Payments } from '../../lib/payments';
import * as repo from './repository';

// The rink's products and their versioned prices, mirrored onto the rink's payout account. MariaDB holds the
// catalog; the payment service holds a copy it can charge for. A price is never edited: a new one replaces it.

const NOT_FOUND = 'No such product at this rink';

export function describeProducts(products: repo.ProductRecord[], prices: repo.PriceRecord[]): ProductRow[] {
  return products.flatMap((p) => {
    const history = prices.filter((pr) => pr.productId === p.id);
    const current = history.find((pr) => pr.retiredAt === null) ?? history[0];
    if (!current) return [];
    const price = (pr: repo.PriceRecord) => ({ id: pr.id, amountMinor: pr.amountMinor, currency: pr.currency, createdAt: pr.createdAt.toISOString(), retiredAt: pr.retiredAt?.toISOString() ?? null });
    return [
      {
        id: p.id,
        kind: p.kind,
        name: p.name,
        description: p.description,
        credits: p.credits,
        monthsValid: p.monthsValid,
        rolloverCap: p.rolloverCap,
        graceDays: p.graceDays,
        interval: p.interval,
        listed: p.listed === 1,
        active: p.active === 1,
        price: price(current),
        priceHistory: history.map(price),
        synced: p.paymentProductId !== null && current.paymentPriceId !== null,
      },
    ];
  });
}

export async function catalogOf(s: Scope): Promise<ProductRow[]> {
  const products = await repo.listProducts(s);
  return describeProducts(products, await repo.pricesOf(s, products.map((p) => p.id)));
}

export async function listProducts(ctx: RinkContext) {
  return { products: await catalogOf(scoped(ctx.tenantId)) };
}

async function productRow(s: Scope, productId: string): Promise<ProductRow> {
  const found = await repo.findProduct(s, productId);
  if (!found) throw AppError.notFound(NOT_FOUND);
  const [row] = describeProducts([found], await repo.pricesOf(s, [found.id]));
  if (!row) throw AppError.notFound(NOT_FOUND);
  return row;
}

const fieldsOf = (input: ProductInput) => ({
  name: input.name,
  description: input.description,
  credits: input.credits,
  monthsValid: input.kind === 'membership' ? null : input.monthsValid,
  rolloverCap: input.rolloverCap,
  graceDays: input.graceDays,
  interval: input.interval,
  listed: input.kind === 'league_pack' ? 0 : input.listed ? 1 : 0,
});

export async function createProduct(ctx: RinkContext, payments: Payments, input: ProductInput): Promise<ProductRow> {
  const s = scoped(ctx.tenantId);
  const rink = await s.rink();
  const id = randomUUID();
  const now = new Date();
  await s.transaction(async (tx) => {
    await repo.insertProduct(tx, { id, kind: input.kind, ...fieldsOf(input), active: 1, paymentProductId: null, createdAt: now, updatedAt: now });
    await repo.insertPrice(tx, { id: randomUUID(), productId: id, amountMinor: input.priceMinor, currency: rink?.currency ?? 'USD', paymentPriceId: null, retiredAt: null, createdAt: now });
  });
  await syncProduct(s, payments, id);
  return productRow(s, id);
}

export async function updateProduct(ctx: RinkContext, payments: Payments, productId: string, change: { input?: ProductInput | undefined; active?: boolean | undefined }): Promise<ProductRow> {
  const s = scoped(ctx.tenantId);
  const current = await productRow(s, productId);
  const now = new Date();
  await s.transaction(async (tx) => {
    if (change.input) {
      if (change.input.kind !== current.kind) throw AppError.field('kind', 'A product keeps its kind; make a new product instead');
      await repo.updateProduct(tx, productId, { ...fieldsOf(change.input), updatedAt: now });
      if (change.input.priceMinor !== current.price.amountMinor) {
        await repo.updatePrice(tx, current.price.id, { retiredAt: now });
        await repo.insertPrice(tx, { id: randomUUID(), productId, amountMinor: change.input.priceMinor, currency: current.price.currency, paymentPriceId: null, retiredAt: null, createdAt: new Date(now.getTime() + 1) });
      }
    }
    if (change.active !== undefined) await repo.updateProduct(tx, productId, { active: change.active ? 1 : 0, updatedAt: now });
  });
  await syncProduct(s, payments, productId);
  return productRow(s, productId);
}

/**
 * Puts the product and its current price on the rink's payout account, and retires the old prices there.
 * Nothing to do until the rink has connected one. Idempotency keys make a retried sync create nothing twice.
 */
export async function syncProduct(s: Scope, payments: Payments, productId: string): Promise<void> {
  const billing = await repo.findBilling(s);
  const account = billing?.connectedAccountId;
  if (!account) return;
  const found = await repo.findProduct(s, productId);
  if (!found) return;
  const prices = await repo.pricesOf(s, [productId]);
  const opts = (key: string) => ({ stripeAccount: account, idempotencyKey: key });
  await callPayments(async () => {
    let paymentProductId = found.paymentProductId;
    const details = { name: found.name, description: found.description ?? undefined, active: found.active === 1, metadata: { rink_id: s.tenantId, product_id: found.id, kind: found.kind } };
    if (!paymentProductId) {
      paymentProductId = (await payments.products.create(details, opts(`product:${found.id}`))).id;
      await repo.updateProduct(s, found.id, { paymentProductId });
    } else {
      await payments.products.update(paymentProductId, details, { stripeAccount: account });
    }
    for (const price of prices) {
      if (price.retiredAt === null && !price.paymentPriceId) {
        const made = await payments.prices.create(
          {
            product: paymentProductId,
            unit_amount: price.amountMinor,
            currency: price.currency.toLowerCase(),
            ...(found.kind === 'membership' && found.interval ? { recurring: { interval: found.interval } } : {}),
            metadata: { rink_id: s.tenantId, price_id: price.id },
          },
          opts(`price:${price.id}`),
        );
        await repo.updatePrice(s, price.id, { paymentPriceId: made.id });
      } else if (price.retiredAt !== null && price.paymentPriceId) {
        await payments.prices.update(price.paymentPriceId, { active: false }, { stripeAccount: account });
      }
    }
  });
}

/** After onboarding, every product is put on the new payout account. */
export async function syncCatalog(s: Scope, payments: Payments): Promise<void> {
  for (const p of await repo.listProducts(s)) await syncProduct(s, payments, p.id);
}

/** The product and its current price, ready to sell (synced first if it is not yet). */
export async function sellable(s: Scope, payments: Payments, productId: string) {
  const row = await productRow(s, productId).catch(() => {
    throw AppError.field('productId', NOT_FOUND);
  });
  if (!row.active) throw AppError.field('productId', 'That product is no longer sold');
  if (!row.synced) await syncProduct(s, payments, productId);
  const product = await repo.findProduct(s, productId);
  const price = await repo.findPrice(s, row.price.id);
  if (!product?.paymentProductId || !price?.paymentPriceId) throw new AppError('conflict', 'This rink has not finished connecting its payout account, so it cannot sell yet');
  return { product, price, row };
}
