// Shapes of the objects the fake keeps: the fields of the real API objects the fake fills in
// (Stripe API reference, "The ... object" of each resource). Fields the fake never sets are left out.

export type Metadata = Record<string, string>;

export interface StripeObject {
  id: string;
  object: string;
  created: number;
  livemode: false;
  /** State the real service keeps behind the API; stripped from every answer. */
  __fake?: Record<string, unknown>;
  deleted?: true;
}

export interface Account extends StripeObject {
  object: 'account';
  type: string;
  country: string;
  email: string | null;
  default_currency: string;
  business_profile: { name: string | null; url: string | null };
  charges_enabled: boolean;
  details_submitted: boolean;
  payouts_enabled: boolean;
  metadata: Metadata;
}

export interface Customer extends StripeObject {
  object: 'customer';
  email: string | null;
  name: string | null;
  description: string | null;
  phone: string | null;
  balance: number;
  currency: string | null;
  delinquent: boolean;
  invoice_settings: { default_payment_method: string | null; custom_fields: null; footer: null; rendering_options: null };
  metadata: Metadata;
  test_clock: string | null;
}

export interface Product extends StripeObject {
  object: 'product';
  name: string;
  description: string | null;
  active: boolean;
  default_price: string | null;
  images: string[];
  metadata: Metadata;
  updated: number;
}

export interface Price extends StripeObject {
  object: 'price';
  active: boolean;
  billing_scheme: 'per_unit';
  currency: string;
  nickname: string | null;
  product: string;
  recurring: { interval: Interval; interval_count: number; usage_type: 'licensed'; trial_period_days: null } | null;
  type: 'one_time' | 'recurring';
  unit_amount: number;
  unit_amount_decimal: string;
  lookup_key: string | null;
  tax_behavior: 'unspecified';
  metadata: Metadata;
}

export type Interval = 'day' | 'week' | 'month' | 'year';

/** How a test card behaves (Stripe docs, "Testing": test card numbers and PaymentMethods). */
export type CardBehaviour = 'succeed' | 'decline' | 'authenticate' | 'charge_customer_fail';

export interface PaymentMethod extends StripeObject {
  object: 'payment_method';
  type: 'card';
  card: { brand: string; last4: string; exp_month: number; exp_year: number; funding: 'credit' };
  customer: string | null;
  metadata: Metadata;
  __fake: { behaviour: CardBehaviour };
}

export interface LastPaymentError {
  type: 'card_error' | 'invalid_request_error';
  code: string;
  decline_code?: string;
  message: string;
  payment_method?: PaymentMethod;
}

export interface PaymentIntent extends StripeObject {
  object: 'payment_intent';
  amount: number;
  amount_capturable: number;
  amount_received: number;
  application_fee_amount: number | null;
  canceled_at: number | null;
  cancellation_reason: string | null;
  capture_method: 'automatic';
  client_secret: string;
  confirmation_method: 'automatic';
  currency: string;
  customer: string | null;
  description: string | null;
  last_payment_error: LastPaymentError | null;
  latest_charge: string | null;
  metadata: Metadata;
  next_action: { type: 'redirect_to_url'; redirect_to_url: { url: string; return_url: string | null } } | null;
  payment_method: string | null;
  payment_method_types: string[];
  receipt_email: string | null;
  status:
    | 'requires_payment_method'
    | 'requires_confirmation'
    | 'requires_action'
    | 'processing'
    | 'succeeded'
    | 'canceled';
}

export interface Charge extends StripeObject {
  object: 'charge';
  amount: number;
  amount_captured: number;
  amount_refunded: number;
  application_fee: string | null;
  application_fee_amount: number | null;
  captured: boolean;
  currency: string;
  customer: string | null;
  description: string | null;
  failure_code: string | null;
  failure_message: string | null;
  metadata: Metadata;
  outcome: { type: 'authorized' | 'issuer_declined'; network_status: string; seller_message: string };
  paid: boolean;
  payment_intent: string;
  payment_method: string;
  payment_method_details: { type: 'card'; card: PaymentMethod['card'] };
  receipt_email: string | null;
  refunded: boolean;
  status: 'succeeded' | 'failed';
}

export interface Refund extends StripeObject {
  object: 'refund';
  amount: number;
  charge: string;
  currency: string;
  metadata: Metadata;
  payment_intent: string;
  reason: string | null;
  status: 'succeeded';
}

export interface ApplicationFee extends StripeObject {
  object: 'application_fee';
  account: string;
  amount: number;
  amount_refunded: number;
  charge: string;
  currency: string;
  originating_transaction: null;
  refunded: boolean;
}

export interface LineItem {
  id: string;
  object: 'item';
  amount_discount: 0;
  amount_subtotal: number;
  amount_tax: 0;
  amount_total: number;
  currency: string;
  description: string;
  price: Price;
  quantity: number;
}

export interface CheckoutSession extends StripeObject {
  object: 'checkout.session';
  mode: 'payment' | 'subscription';
  status: 'open' | 'complete' | 'expired';
  payment_status: 'unpaid' | 'paid';
  amount_subtotal: number;
  amount_total: number;
  currency: string;
  cancel_url: string | null;
  success_url: string;
  client_reference_id: string | null;
  customer: string | null;
  customer_email: string | null;
  customer_details: { email: string | null; name: null } | null;
  expires_at: number;
  invoice: string | null;
  metadata: Metadata;
  payment_intent: string | null;
  payment_method_types: string[];
  subscription: string | null;
  url: string | null;
  __fake: {
    lineItems: LineItem[];
    paymentIntentData: { application_fee_amount: number | null; metadata: Metadata; description: string | null };
    subscriptionData: { application_fee_percent: number | null; metadata: Metadata };
    pendingCard?: { paymentMethod: string; email: string };
    /** Subscription mode has no payment intent of its own; failed attempts at the page are recorded on this one. */
    attemptIntent?: string;
  };
}

export interface Period {
  start: number;
  end: number;
}

export interface SubscriptionItem {
  id: string;
  object: 'subscription_item';
  created: number;
  current_period_start: number;
  current_period_end: number;
  metadata: Metadata;
  price: Price;
  quantity: number;
  subscription: string;
}

export interface Subscription extends StripeObject {
  object: 'subscription';
  application_fee_percent: number | null;
  billing_cycle_anchor: number;
  cancel_at: number | null;
  cancel_at_period_end: boolean;
  canceled_at: number | null;
  collection_method: 'charge_automatically';
  currency: string;
  current_period_start: number;
  current_period_end: number;
  customer: string;
  default_payment_method: string | null;
  ended_at: number | null;
  items: { object: 'list'; data: SubscriptionItem[]; has_more: false; url: string };
  latest_invoice: string | null;
  metadata: Metadata;
  start_date: number;
  status: 'incomplete' | 'active' | 'past_due' | 'canceled';
  test_clock: string | null;
}

export interface InvoiceLine {
  id: string;
  object: 'line_item';
  amount: number;
  currency: string;
  description: string;
  period: Period;
  quantity: number;
  pricing: { type: 'price_details'; price_details: { price: string; product: string }; unit_amount_decimal: string };
  price: Price;
}

export interface Invoice extends StripeObject {
  object: 'invoice';
  amount_due: number;
  amount_paid: number;
  amount_remaining: number;
  application_fee_amount: number | null;
  attempt_count: number;
  attempted: boolean;
  billing_reason: 'subscription_create' | 'subscription_cycle';
  collection_method: 'charge_automatically';
  currency: string;
  customer: string;
  customer_email: string | null;
  default_payment_method: string | null;
  lines: { object: 'list'; data: InvoiceLine[]; has_more: false; url: string };
  metadata: Metadata;
  next_payment_attempt: number | null;
  number: string;
  parent: { type: 'subscription_details'; subscription_details: { subscription: string; metadata: Metadata } };
  /** Pre-2025 top-level links, kept because the API reads them (the brief asks for them). */
  subscription: string;
  payment_intent: string | null;
  period_start: number;
  period_end: number;
  status: 'draft' | 'open' | 'paid' | 'void' | 'uncollectible';
  status_transitions: { finalized_at: number | null; paid_at: number | null };
  subtotal: number;
  total: number;
  test_clock: string | null;
}

export interface TestClock extends StripeObject {
  object: 'test_helpers.test_clock';
  deletes_after: number;
  frozen_time: number;
  name: string | null;
  status: 'ready' | 'advancing';
  status_details: Record<string, never>;
}

export interface WebhookEndpoint extends StripeObject {
  object: 'webhook_endpoint';
  api_version: string | null;
  application: null;
  description: string | null;
  enabled_events: string[];
  metadata: Metadata;
  status: 'enabled' | 'disabled';
  url: string;
  secret?: string;
  __fake: { secret: string; connect: boolean; chaos: { duplicates: number; shuffle: boolean } };
}

export interface StripeEvent extends StripeObject {
  object: 'event';
  account?: string;
  api_version: string;
  data: { object: Record<string, unknown>; previous_attributes?: Record<string, unknown> };
  pending_webhooks: number;
  request: { id: string | null; idempotency_key: string | null };
  type: string;
}
