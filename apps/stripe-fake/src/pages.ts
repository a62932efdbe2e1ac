import type { Express, Request, Response } from 'express';
import { attemptPayment, cardForNumber, createPaymentMethod, failAuthentication, TEST_CARDS } from './billing';
import type { Fake } from './fake';
import { completeOnboarding } from './resources/accounts';
import { failCheckoutAuthentication, payCheckout, refreshExpiry } from './resources/checkout';
import { present } from './store';
import type { Account, CheckoutSession, Customer, PaymentIntent, PaymentMethod, StripeEvent, WebhookEndpoint } from './types';

// The fake's own HTML: the hosted checkout page and its second step, the onboarding page, the developer page,
// and the `/_fake/` switches tests use. Plain HTML from template strings; every page says it is a test stand-in.

function escape(value: unknown): string {
  return String(value).replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

function money(amount: number, currency: string): string {
  return new Intl.NumberFormat('en-US', { style: 'currency', currency: currency.toUpperCase() }).format(amount / 100);
}

function layout(title: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escape(title)}</title>
<style>
body { font-family: system-ui, sans-serif; max-width: 40rem; margin: 2rem auto; padding: 0 1rem; line-height: 1.5; color: #1a1a1a; }
label { display: block; margin-top: 0.75rem; font-weight: 600; }
input { font: inherit; padding: 0.4rem; width: 100%; box-sizing: border-box; }
button { font: inherit; margin-top: 1rem; padding: 0.5rem 1rem; }
[role="alert"] { border: 2px solid #b00020; color: #b00020; padding: 0.5rem; }
.note { background: #fff6d6; padding: 0.5rem; border: 1px solid #e0c060; }
table { border-collapse: collapse; width: 100%; font-size: 0.9rem; } td, th { border-bottom: 1px solid #ddd; padding: 0.2rem 0.4rem; text-align: left; }
</style>
</head>
<body>
<main>
${body}
</main>
</body>
</html>`;
}

function sendPage(res: Response, status: number, title: string, body: string): void {
  res.status(status).type('html').send(layout(title, body));
}

function notFound(res: Response, what: string): void {
  sendPage(res, 404, 'Not found', `<h1>Not found</h1><p>This payment service test fake has no ${escape(what)} with that id.</p>`);
}

function testCardList(): string {
  const items = Object.values(TEST_CARDS)
    .map((card) => `<li><code>${escape(card.number.replace(/(\d{4})(?=\d)/g, '$1 '))}</code> ${escape(card.label)}</li>`)
    .join('');
  return `<h2>Test cards</h2><p>Any future expiry date (MM / YY) and any 3-digit CVC.</p><ul>${items}</ul>`;
}

function lookup<T extends { object: string }>(fake: Fake, id: string, kind: T['object']): { account: string; obj: T } | undefined {
  const entry = fake.store.find(id);
  if (!entry || entry.obj.object !== kind || entry.obj.deleted) return undefined;
  return { account: entry.account, obj: entry.obj as unknown as T };
}

function formField(body: unknown, name: string): string {
  const value = (body as Record<string, unknown> | undefined)?.[name];
  return typeof value === 'string' ? value.trim() : '';
}

/**
 * Stripe API reference, checkout session `customer`: "If the Customer already has a valid email set, the email will
 * be prefilled and not editable in Checkout."
 */
function customerEmailOf(fake: Fake, account: string, session: CheckoutSession): string | null {
  return session.customer ? (fake.store.maybe<Customer>(account, session.customer, 'customer')?.email ?? null) : null;
}

function checkoutPage(session: CheckoutSession, options: { error?: string; email?: string; fixedEmail?: string | null } = {}): string {
  const email = options.fixedEmail ?? options.email ?? session.customer_details?.email ?? session.customer_email ?? '';
  const items = session.__fake.lineItems
    .map((item) => {
      const recurring = item.price.recurring;
      const every = recurring ? ` every ${recurring.interval_count > 1 ? `${recurring.interval_count} ${recurring.interval}s` : recurring.interval}` : '';
      return `<li>${escape(item.description)} × ${item.quantity}: ${escape(money(item.amount_total, item.currency))}${escape(every)}</li>`;
    })
    .join('');
  const total = money(session.amount_total, session.currency);
  return `<h1>Payment service test checkout</h1>
<p class="note">This is a test payment page of the local payment service fake. No real card is charged.</p>
<h2>Order</h2>
<ul>${items}</ul>
<p>Total due today: <strong>${escape(total)}</strong></p>
${options.error ? `<p role="alert">${escape(options.error)}</p>` : ''}
<form method="post" action="/checkout/${escape(session.id)}">
<label for="email">E-mail</label>
<input id="email" name="email" type="email" autocomplete="email" required value="${escape(email)}"${options.fixedEmail ? ' readonly' : ''}>
<label for="card_number">Card number</label>
<input id="card_number" name="card_number" inputmode="numeric" autocomplete="cc-number" required placeholder="4242 4242 4242 4242">
<label for="expiry">Expiry (MM / YY)</label>
<input id="expiry" name="expiry" autocomplete="cc-exp" required placeholder="12 / 34">
<label for="cvc">CVC</label>
<input id="cvc" name="cvc" inputmode="numeric" autocomplete="cc-csc" required placeholder="123">
<button type="submit">Pay ${escape(total)}</button>
</form>
${session.cancel_url ? `<p><a href="${escape(session.cancel_url)}">Cancel and go back</a></p>` : ''}
${testCardList()}`;
}

function confirmPage(action: string, amount: string, error?: string): string {
  return `<h1>Confirm this payment</h1>
<p class="note">Test second step of the payment service fake: this stands in for the bank's confirmation (3D Secure).</p>
<p>Amount: <strong>${escape(amount)}</strong></p>
${error ? `<p role="alert">${escape(error)}</p>` : ''}
<form method="post" action="${escape(action)}">
<button type="submit" name="outcome" value="complete">Complete authentication</button>
<button type="submit" name="outcome" value="fail">Fail authentication</button>
</form>`;
}

/** Card checks of the hosted page: a known test card, an expiry in the future, a 3–4 digit CVC. */
function readCard(body: unknown, nowSec: number): { card: NonNullable<ReturnType<typeof cardForNumber>>; month: number; year: number } | string {
  const number = formField(body, 'card_number');
  const card = cardForNumber(number);
  if (!card) return /^[\d\s]{12,23}$/.test(number) ? 'Your card was declined. This test page accepts only the test cards listed below.' : 'Your card number is incorrect.';
  const expiry = /^(\d{1,2})\s*\/\s*(\d{2}|\d{4})$/.exec(formField(body, 'expiry'));
  if (!expiry) return "Your card's expiration date is incomplete.";
  const month = Number(expiry[1]);
  const year = Number(expiry[2]) < 100 ? 2000 + Number(expiry[2]) : Number(expiry[2]);
  const now = new Date(nowSec * 1000);
  if (month < 1 || month > 12) return "Your card's expiration month is invalid.";
  if (year < now.getUTCFullYear() || (year === now.getUTCFullYear() && month < now.getUTCMonth() + 1)) return "Your card's expiration date is in the past.";
  if (!/^\d{3,4}$/.test(formField(body, 'cvc'))) return "Your card's security code is incomplete.";
  return { card, month, year };
}

function successRedirect(session: CheckoutSession): string {
  return session.success_url.replaceAll('{CHECKOUT_SESSION_ID}', session.id);
}

const AUTH_FAILED = 'We are unable to authenticate your payment method. Please choose a different payment method and try again.';

function isLoopback(req: Request): boolean {
  const address = req.socket.remoteAddress ?? '';
  return address === '127.0.0.1' || address === '::1' || address === '::ffff:127.0.0.1';
}

export function registerPages(app: Express, fake: Fake): void {
  const remember = (req: Request) => {
    fake.baseUrl = `${req.protocol}://${req.get('host') ?? '127.0.0.1'}`;
  };

  const openSession = (req: Request, res: Response): { account: string; session: CheckoutSession } | undefined => {
    const found = lookup<CheckoutSession>(fake, req.params.id as string, 'checkout.session');
    if (!found) {
      notFound(res, 'checkout session');
      return undefined;
    }
    const session = refreshExpiry(fake, found.account, found.obj);
    if (session.status !== 'open') {
      const text = session.status === 'complete' ? 'This checkout session is already paid.' : 'This checkout session has expired.';
      sendPage(res, 410, 'Checkout session closed', `<h1>Payment service test checkout</h1><p>${escape(text)}</p>`);
      return undefined;
    }
    return { account: found.account, session };
  };

  app.get('/checkout/:id', (req, res) => {
    remember(req);
    const open = openSession(req, res);
    if (open) sendPage(res, 200, 'Payment service test checkout', checkoutPage(open.session, { fixedEmail: customerEmailOf(fake, open.account, open.session) }));
  });

  app.post('/checkout/:id', (req, res) => {
    remember(req);
    const open = openSession(req, res);
    if (!open) return;
    const { account, session } = open;
    const fixedEmail = customerEmailOf(fake, account, session);
    const email = fixedEmail ?? formField(req.body, 'email');
    const card = readCard(req.body, fake.nowSec());
    if (!email || typeof card === 'string') {
      sendPage(res, 400, 'Payment service test checkout', checkoutPage(session, { error: typeof card === 'string' ? card : 'Your e-mail is incomplete.', email, fixedEmail }));
      return;
    }
    const method = createPaymentMethod(fake, account, card.card, session.customer, fake.timeFor(account, session.customer), { month: card.month, year: card.year });
    const result = payCheckout(fake, account, session, method, email, false);
    fake.changed();
    if (result === 'succeeded') {
      res.redirect(303, successRedirect(session));
    } else if (result === 'requires_action') {
      session.__fake.pendingCard = { paymentMethod: method.id, email };
      res.redirect(303, `/checkout/${session.id}/authenticate`);
    } else {
      sendPage(res, 402, 'Payment service test checkout', checkoutPage(session, { error: 'Your card was declined.', email, fixedEmail }));
    }
  });

  app.get('/checkout/:id/authenticate', (req, res) => {
    const open = openSession(req, res);
    if (!open) return;
    if (!open.session.__fake.pendingCard) {
      res.redirect(303, `/checkout/${open.session.id}`);
      return;
    }
    sendPage(res, 200, 'Confirm this payment', confirmPage(`/checkout/${open.session.id}/authenticate`, money(open.session.amount_total, open.session.currency)));
  });

  app.post('/checkout/:id/authenticate', (req, res) => {
    remember(req);
    const open = openSession(req, res);
    if (!open) return;
    const { account, session } = open;
    const pending = session.__fake.pendingCard;
    const method = pending ? fake.store.maybe<PaymentMethod>(account, pending.paymentMethod, 'payment_method') : undefined;
    if (!pending || !method) {
      res.redirect(303, `/checkout/${session.id}`);
      return;
    }
    if (formField(req.body, 'outcome') !== 'complete') {
      failCheckoutAuthentication(fake, account, session);
      fake.changed();
      sendPage(res, 402, 'Payment service test checkout', checkoutPage(session, { error: AUTH_FAILED, email: pending.email }));
      return;
    }
    const result = payCheckout(fake, account, session, method, pending.email, true);
    fake.changed();
    if (result === 'succeeded') res.redirect(303, successRedirect(session));
    else sendPage(res, 402, 'Payment service test checkout', checkoutPage(session, { error: 'Your card was declined.', email: pending.email }));
  });

  // The second step of a payment intent confirmed through the API (next_action.redirect_to_url).
  app.get('/authenticate/:id', (req, res) => {
    const found = lookup<PaymentIntent>(fake, req.params.id, 'payment_intent');
    if (!found || found.obj.status !== 'requires_action') {
      notFound(res, 'payment waiting for confirmation');
      return;
    }
    sendPage(res, 200, 'Confirm this payment', confirmPage(`/authenticate/${found.obj.id}`, money(found.obj.amount, found.obj.currency)));
  });

  app.post('/authenticate/:id', (req, res) => {
    const found = lookup<PaymentIntent>(fake, req.params.id, 'payment_intent');
    const intent = found?.obj;
    const method = intent?.payment_method && found ? fake.store.maybe<PaymentMethod>(found.account, intent.payment_method, 'payment_method') : undefined;
    if (!found || !intent || intent.status !== 'requires_action' || !method) {
      notFound(res, 'payment waiting for confirmation');
      return;
    }
    const returnUrl = intent.next_action?.redirect_to_url.return_url ?? null;
    const at = fake.timeFor(found.account, intent.customer);
    if (formField(req.body, 'outcome') === 'complete') attemptPayment(fake, found.account, intent, method, { at, onSession: false, authenticated: true });
    else failAuthentication(fake, found.account, intent, at);
    fake.changed();
    if (returnUrl) {
      const url = new URL(returnUrl);
      url.searchParams.set('payment_intent', intent.id);
      res.redirect(303, url.toString());
      return;
    }
    const text = (intent.status as PaymentIntent['status']) === 'succeeded' ? 'The payment is confirmed.' : AUTH_FAILED;
    sendPage(res, 200, 'Confirm this payment', `<h1>Confirm this payment</h1><p role="status">${escape(text)}</p>`);
  });

  app.get('/onboarding/:id', (req, res) => {
    const found = lookup<Account>(fake, req.params.id, 'account');
    if (!found) {
      notFound(res, 'account');
      return;
    }
    const account = found.obj;
    const returnUrl = typeof req.query.return_url === 'string' ? req.query.return_url : '';
    sendPage(
      res,
      200,
      'Payment service test onboarding',
      `<h1>Payment service test onboarding</h1>
<p class="note">This stands in for the payment service's account onboarding. Nothing is verified.</p>
<p>Account: <code>${escape(account.id)}</code>${account.business_profile.name ? ` (${escape(account.business_profile.name)})` : ''}</p>
<p>Status: ${account.details_submitted ? 'onboarding complete' : 'onboarding not complete'}</p>
<form method="post" action="/onboarding/${escape(account.id)}">
<input type="hidden" name="return_url" value="${escape(returnUrl)}">
<button type="submit">Complete onboarding</button>
</form>`,
    );
  });

  app.post('/onboarding/:id', (req, res) => {
    const found = lookup<Account>(fake, req.params.id, 'account');
    if (!found) {
      notFound(res, 'account');
      return;
    }
    const account = completeOnboarding(fake, found.obj);
    const returnUrl = formField(req.body, 'return_url');
    if (returnUrl) res.redirect(303, returnUrl);
    else res.json(present(account));
  });

  app.get('/', (_req, res) => {
    sendPage(res, 200, 'Payment service fake', developerPage(fake));
  });
}

function developerPage(fake: Fake): string {
  const entries = fake.store.everything();
  const counts = new Map<string, number>();
  for (const entry of entries) {
    if (entry.obj.deleted) continue;
    const key = `${entry.account === fake.store.platform ? 'platform' : entry.account} ${entry.obj.object}`;
    counts.set(key, (counts.get(key) ?? 0) + 1);
  }
  const countRows = [...counts.entries()]
    .sort(([a], [b]) => a.localeCompare(b))
    .map(([key, count]) => {
      const [account, object] = key.split(' ');
      return `<tr><td>${escape(account)}</td><td>${escape(object)}</td><td>${count}</td></tr>`;
    })
    .join('');
  const link = (id: string) => `<a href="/_fake/objects/${escape(id)}">${escape(id)}</a>`;
  const recent = entries
    .filter((entry) => entry.obj.object !== 'event')
    .slice(0, 20)
    .map((entry) => `<tr><td>${link(entry.obj.id)}</td><td>${escape(entry.obj.object)}</td><td>${new Date(entry.obj.created * 1000).toISOString()}</td></tr>`)
    .join('');
  const deliveries = [...fake.store.deliveries.values()];
  const events = entries
    .filter((entry) => entry.obj.object === 'event')
    .slice(0, 20)
    .map((entry) => {
      const event = entry.obj as StripeEvent;
      const sent = deliveries
        .filter((delivery) => delivery.event === event.id)
        .map((delivery) => `${escape(delivery.endpoint)}: ${escape(delivery.status)} (${delivery.attempts.map((a) => a.status ?? 'no answer').join(', ') || 'not yet sent'})`)
        .join('<br>');
      return `<tr><td>${link(event.id)}</td><td>${escape(event.type)}</td><td>${escape(event.account ?? 'platform')}</td><td>${sent || 'no endpoint'}</td></tr>`;
    })
    .join('');
  const endpoints = fake.store
    .all<WebhookEndpoint>(fake.store.platform, 'webhook_endpoint')
    .map((endpoint) => `<li>${link(endpoint.id)} ${escape(endpoint.url)} (${endpoint.__fake.connect ? 'connected accounts' : 'platform'}, ${escape(endpoint.enabled_events.join(' '))})</li>`)
    .join('');
  return `<h1>Payment service fake</h1>
<p class="note">Local in-memory stand-in for the payment service API. Platform account <code>${escape(fake.store.platform)}</code>.</p>
<h2>Objects by type</h2>
<table><thead><tr><th>Account</th><th>Type</th><th>Count</th></tr></thead><tbody>${countRows}</tbody></table>
<h2>Webhook endpoints</h2><ul>${endpoints || '<li>none</li>'}</ul>
<h2>Recent objects</h2>
<table><thead><tr><th>Id</th><th>Type</th><th>Created</th></tr></thead><tbody>${recent}</tbody></table>
<h2>Recent events</h2>
<table><thead><tr><th>Id</th><th>Type</th><th>Account</th><th>Deliveries</th></tr></thead><tbody>${events}</tbody></table>`;
}

/** Test switches that are not part of the payment API: no key needed, loopback callers only. */
export function registerFakeRoutes(app: Express, fake: Fake): void {
  app.use('/_fake', (req, res, next) => {
    if (isLoopback(req)) next();
    else res.status(403).json({ error: { type: 'invalid_request_error', message: 'The /_fake/ switches answer loopback callers only.' } });
  });

  app.post('/_fake/webhook_endpoints/:id/chaos', (req, res) => {
    const endpoint = fake.store.maybe<WebhookEndpoint>(fake.store.platform, req.params.id, 'webhook_endpoint');
    if (!endpoint) {
      res.status(404).json({ error: { type: 'invalid_request_error', message: `No such webhook endpoint: '${req.params.id}'` } });
      return;
    }
    const body = (req.body ?? {}) as Record<string, unknown>;
    const duplicates = body.duplicates === undefined ? endpoint.__fake.chaos.duplicates : Number(body.duplicates);
    if (!Number.isInteger(duplicates) || duplicates < 0 || duplicates > 10) {
      res.status(400).json({ error: { type: 'invalid_request_error', message: 'duplicates must be an integer from 0 to 10', param: 'duplicates' } });
      return;
    }
    const shuffle = body.shuffle === undefined ? endpoint.__fake.chaos.shuffle : body.shuffle === true || body.shuffle === 'true';
    endpoint.__fake.chaos = { duplicates, shuffle };
    fake.changed();
    res.json({ endpoint: endpoint.id, ...endpoint.__fake.chaos });
  });

  app.post('/_fake/events/:id/resend', (req, res) => {
    const entry = fake.store.find(req.params.id);
    if (!entry || entry.obj.object !== 'event') {
      res.status(404).json({ error: { type: 'invalid_request_error', message: `No such event: '${req.params.id}'` } });
      return;
    }
    res.json({ event: entry.obj.id, endpoints: fake.webhooks.resend(entry.obj as StripeEvent) });
  });

  app.get('/_fake/deliveries', (req, res) => {
    const endpoint = typeof req.query.endpoint === 'string' ? req.query.endpoint : undefined;
    const event = typeof req.query.event === 'string' ? req.query.event : undefined;
    res.json({
      data: [...fake.store.deliveries.values()].filter((delivery) => (!endpoint || delivery.endpoint === endpoint) && (!event || delivery.event === event)),
    });
  });

  app.post('/_fake/accounts/:id/complete_onboarding', (req, res) => {
    const account = fake.store.maybe<Account>(fake.store.platform, req.params.id, 'account');
    if (!account) {
      res.status(404).json({ error: { type: 'invalid_request_error', message: `No such account: '${req.params.id}'` } });
      return;
    }
    res.json(present(completeOnboarding(fake, account)));
  });

  app.get('/_fake/objects/:id', (req, res) => {
    const entry = fake.store.find(req.params.id);
    if (!entry) {
      res.status(404).json({ error: { type: 'invalid_request_error', message: `No such object: '${req.params.id}'` } });
      return;
    }
    res.json({ account: entry.account, object: present(entry.obj) });
  });
}
