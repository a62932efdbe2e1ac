import type { Api } from '../app';
import { resolvePaymentMethod, endSubscription } from '../billing';
import {
  allowParams,
  bool,
  int,
  invalid,
  mergeMetadata,
  nested,
  nullableStr,
  obj,
  oneOf,
  type Params,
  refused,
  requireInt,
  requireStr,
  str,
} from '../errors';
import type { Fake } from '../fake';
import { newId, paginate } from '../store';
import type { Customer, Interval, PaymentMethod, Price, Product, Subscription, TestClock } from '../types';

// Customers, products, prices and payment methods.

/** Sets a field and remembers its old value for the event's `previous_attributes`. */
export function change<T extends object, K extends keyof T>(target: T, key: K, value: T[K] | undefined, previous: Record<string, unknown>): void {
  if (value === undefined || value === target[key]) return;
  previous[key as string] = target[key];
  target[key] = value;
}

export function changeMetadata(target: { metadata: Record<string, string> }, params: Params, previous: Record<string, unknown>): void {
  if (params.metadata === undefined) return;
  previous.metadata = target.metadata;
  target.metadata = mergeMetadata(target.metadata, params);
}

function customerDefaultMethod(fake: Fake, account: string, params: Params, customer: string): string | null | undefined {
  const settings = obj(params, 'invoice_settings');
  const ref = settings ? nullableStr(settings, 'default_payment_method', 'invoice_settings[default_payment_method]') : undefined;
  if (ref === null || ref === undefined) return ref;
  return resolvePaymentMethod(fake, account, ref, customer, 'invoice_settings[default_payment_method]').id;
}

export function createProduct(fake: Fake, account: string, params: Params, label = ''): Product {
  const at = fake.nowSec();
  const product = fake.store.put<Product>(account, {
    id: newId('prod'),
    object: 'product',
    created: at,
    livemode: false,
    name: requireStr(params, 'name', nested(label, 'name')),
    description: nullableStr(params, 'description', nested(label, 'description')) ?? null,
    active: bool(params, 'active', nested(label, 'active')) ?? true,
    default_price: null,
    images: [],
    metadata: mergeMetadata({}, params),
    updated: at,
  });
  fake.webhooks.emit(account, 'product.created', product);
  return product;
}

/** Shared by POST /v1/prices and checkout's `price_data`; `label` names nested params in errors. */
export function createPrice(fake: Fake, account: string, params: Params, label = ''): Price {
  const productData = obj(params, 'product_data', nested(label, 'product_data'));
  const productId = str(params, 'product', nested(label, 'product'));
  let product: Product | undefined;
  if (productId) product = fake.store.get<Product>(account, productId, 'product', 'product', nested(label, 'product'));
  else if (productData) product = createProduct(fake, account, productData, nested(label, 'product_data'));
  if (!product) throw invalid(`Missing required param: ${nested(label, 'product')}.`, nested(label, 'product'), 'parameter_missing');
  const unitAmount = requireInt(params, 'unit_amount', nested(label, 'unit_amount'));
  if (unitAmount < 0) throw invalid('This value must be greater than or equal to 0.', nested(label, 'unit_amount'));
  const recurringLabel = nested(label, 'recurring');
  const recurringParams = obj(params, 'recurring', recurringLabel);
  let recurring: Price['recurring'] = null;
  if (recurringParams) {
    const intervalLabel = nested(recurringLabel, 'interval');
    const interval = oneOf<Interval>(requireStr(recurringParams, 'interval', intervalLabel), ['day', 'week', 'month', 'year'], intervalLabel) ?? 'month';
    const count = int(recurringParams, 'interval_count', nested(recurringLabel, 'interval_count')) ?? 1;
    if (count < 1) throw invalid('This value must be greater than or equal to 1.', nested(recurringLabel, 'interval_count'));
    recurring = { interval, interval_count: count, usage_type: 'licensed', trial_period_days: null };
  }
  const price = fake.store.put<Price>(account, {
    id: newId('price'),
    object: 'price',
    created: fake.nowSec(),
    livemode: false,
    active: bool(params, 'active', nested(label, 'active')) ?? true,
    billing_scheme: 'per_unit',
    currency: requireStr(params, 'currency', nested(label, 'currency')).toLowerCase(),
    nickname: nullableStr(params, 'nickname', nested(label, 'nickname')) ?? null,
    product: product.id,
    recurring,
    type: recurring ? 'recurring' : 'one_time',
    unit_amount: unitAmount,
    unit_amount_decimal: String(unitAmount),
    lookup_key: nullableStr(params, 'lookup_key', nested(label, 'lookup_key')) ?? null,
    tax_behavior: 'unspecified',
    metadata: mergeMetadata({}, params),
  });
  fake.webhooks.emit(account, 'price.created', price);
  return price;
}

export function registerCatalog(api: Api): void {
  api.post('/v1/customers', ({ fake, account, params }) => {
    allowParams(params, ['email', 'name', 'description', 'phone', 'metadata', 'test_clock', 'invoice_settings', 'payment_method']);
    const clockId = str(params, 'test_clock');
    const clock = clockId ? fake.store.get<TestClock>(account, clockId, 'test_helpers.test_clock', 'test clock', 'test_clock') : undefined;
    const customer = fake.store.put<Customer>(account, {
      id: newId('cus'),
      object: 'customer',
      created: clock?.frozen_time ?? fake.nowSec(),
      livemode: false,
      email: nullableStr(params, 'email') ?? null,
      name: nullableStr(params, 'name') ?? null,
      description: nullableStr(params, 'description') ?? null,
      phone: nullableStr(params, 'phone') ?? null,
      balance: 0,
      currency: null,
      delinquent: false,
      invoice_settings: { default_payment_method: null, custom_fields: null, footer: null, rendering_options: null },
      metadata: mergeMetadata({}, params),
      test_clock: clock?.id ?? null,
    });
    const attach = str(params, 'payment_method');
    if (attach) resolvePaymentMethod(fake, account, attach, customer.id, 'payment_method');
    customer.invoice_settings.default_payment_method = customerDefaultMethod(fake, account, params, customer.id) ?? null;
    fake.webhooks.emit(account, 'customer.created', customer, { at: customer.created });
    return customer;
  });

  api.get('/v1/customers/:id', ({ fake, account, path }) => {
    const found = fake.store.find(path.id ?? '');
    // A deleted customer still answers, as `{ id, object, deleted: true }` (Stripe API reference, "Retrieve a customer").
    if (found?.account === account && found.obj.object === 'customer' && found.obj.deleted) return found.obj;
    return fake.store.get<Customer>(account, path.id ?? '', 'customer', 'customer', 'id');
  });

  api.post('/v1/customers/:id', ({ fake, account, params, path }) => {
    allowParams(params, ['email', 'name', 'description', 'phone', 'metadata', 'invoice_settings']);
    const customer = fake.store.get<Customer>(account, path.id ?? '', 'customer', 'customer', 'id');
    const previous: Record<string, unknown> = {};
    change(customer, 'email', nullableStr(params, 'email'), previous);
    change(customer, 'name', nullableStr(params, 'name'), previous);
    change(customer, 'description', nullableStr(params, 'description'), previous);
    change(customer, 'phone', nullableStr(params, 'phone'), previous);
    changeMetadata(customer, params, previous);
    const method = customerDefaultMethod(fake, account, params, customer.id);
    if (method !== undefined && method !== customer.invoice_settings.default_payment_method) {
      previous.invoice_settings = { ...customer.invoice_settings };
      customer.invoice_settings.default_payment_method = method;
    }
    fake.webhooks.emit(account, 'customer.updated', customer, { previous, at: fake.timeFor(account, customer.id) });
    return customer;
  });

  api.get('/v1/customers', ({ fake, account, params }) => {
    const email = str(params, 'email');
    const clock = str(params, 'test_clock');
    const items = fake.store.all<Customer>(account, 'customer', (customer) => (!email || customer.email === email) && (!clock || customer.test_clock === clock));
    return paginate(items, params, '/v1/customers');
  });

  api.delete('/v1/customers/:id', ({ fake, account, path }) => {
    const customer = fake.store.get<Customer>(account, path.id ?? '', 'customer', 'customer', 'id');
    const at = fake.timeFor(account, customer.id);
    // Deleting a customer cancels its subscriptions at once (Stripe API reference, "Delete a customer").
    for (const sub of fake.store.all<Subscription>(account, 'subscription', (s) => s.customer === customer.id && s.status !== 'canceled')) {
      endSubscription(fake, account, sub, at);
    }
    fake.webhooks.emit(account, 'customer.deleted', customer, { at });
    const tombstone = { id: customer.id, object: 'customer', created: customer.created, livemode: false as const, deleted: true as const };
    fake.store.put(account, tombstone);
    return tombstone;
  });

  api.get('/v1/payment_methods/:id', ({ fake, account, path }) =>
    fake.store.get<PaymentMethod>(account, path.id ?? '', 'payment_method', 'PaymentMethod', 'payment_method'),
  );

  api.post('/v1/products', ({ fake, account, params }) => {
    allowParams(params, ['name', 'description', 'metadata', 'active']);
    return createProduct(fake, account, params);
  });

  api.get('/v1/products/:id', ({ fake, account, path }) => fake.store.get<Product>(account, path.id ?? '', 'product', 'product', 'id'));

  api.post('/v1/products/:id', ({ fake, account, params, path }) => {
    allowParams(params, ['name', 'description', 'metadata', 'active', 'default_price']);
    const product = fake.store.get<Product>(account, path.id ?? '', 'product', 'product', 'id');
    const previous: Record<string, unknown> = {};
    const name = str(params, 'name');
    if (name === '') throw invalid('You must provide a non-empty name.', 'name');
    change(product, 'name', name, previous);
    change(product, 'description', nullableStr(params, 'description'), previous);
    change(product, 'active', bool(params, 'active'), previous);
    const defaultPrice = nullableStr(params, 'default_price');
    if (defaultPrice) {
      const price = fake.store.get<Price>(account, defaultPrice, 'price', 'price', 'default_price');
      if (price.product !== product.id) throw refused(`The price '${price.id}' does not belong to product '${product.id}'.`, undefined, 'default_price');
    }
    change(product, 'default_price', defaultPrice, previous);
    changeMetadata(product, params, previous);
    product.updated = fake.nowSec();
    fake.webhooks.emit(account, 'product.updated', product, { previous });
    return product;
  });

  api.get('/v1/products', ({ fake, account, params }) => {
    const active = bool(params, 'active');
    return paginate(fake.store.all<Product>(account, 'product', (p) => active === undefined || p.active === active), params, '/v1/products');
  });

  api.delete('/v1/products/:id', ({ fake, account, path }) => {
    const product = fake.store.get<Product>(account, path.id ?? '', 'product', 'product', 'id');
    if (fake.store.all<Price>(account, 'price', (price) => price.product === product.id).length > 0) {
      throw refused('This product cannot be deleted because it has one or more user-created prices.');
    }
    fake.webhooks.emit(account, 'product.deleted', product);
    return fake.store.put(account, { id: product.id, object: 'product', created: product.created, livemode: false as const, deleted: true as const });
  });

  api.post('/v1/prices', ({ fake, account, params }) => {
    allowParams(params, ['product', 'product_data', 'unit_amount', 'currency', 'recurring', 'nickname', 'metadata', 'active', 'lookup_key']);
    return createPrice(fake, account, params);
  });

  api.get('/v1/prices/:id', ({ fake, account, path }) => fake.store.get<Price>(account, path.id ?? '', 'price', 'price', 'id'));

  // Amount, currency and interval are immutable (Stripe API reference, "Update a price"): they are unknown parameters here.
  api.post('/v1/prices/:id', ({ fake, account, params, path }) => {
    allowParams(params, ['active', 'metadata', 'nickname', 'lookup_key']);
    const price = fake.store.get<Price>(account, path.id ?? '', 'price', 'price', 'id');
    const previous: Record<string, unknown> = {};
    change(price, 'active', bool(params, 'active'), previous);
    change(price, 'nickname', nullableStr(params, 'nickname'), previous);
    change(price, 'lookup_key', nullableStr(params, 'lookup_key'), previous);
    changeMetadata(price, params, previous);
    fake.webhooks.emit(account, 'price.updated', price, { previous });
    return price;
  });

  api.get('/v1/prices', ({ fake, account, params }) => {
    const product = str(params, 'product');
    const active = bool(params, 'active');
    const type = str(params, 'type');
    const items = fake.store.all<Price>(
      account,
      'price',
      (price) => (!product || price.product === product) && (active === undefined || price.active === active) && (!type || price.type === type),
    );
    return paginate(items, params, '/v1/prices');
  });
}
