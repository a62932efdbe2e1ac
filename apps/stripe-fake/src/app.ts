import express, { type Express, type NextFunction, type Request, type Response } from 'express';
import { ApiError, type ErrorBody, type Params, strList } from './errors';
import { Fake, type FakeOptions } from './fake';
import { registerFakeRoutes, registerPages } from './pages';
import { registerAccounts } from './resources/accounts';
import { registerBilling } from './resources/billing';
import { registerCatalog } from './resources/catalog';
import { registerCheckout } from './resources/checkout';
import { registerEvents } from './resources/events';
import { registerPayments } from './resources/payments';
import { newId, present } from './store';
import type { Account, CheckoutSession } from './types';

export interface Ctx {
  fake: Fake;
  /** The account the request acts on: the Stripe-Account header's, else the platform. */
  account: string;
  params: Params;
  path: Record<string, string>;
}

export type Handler = (ctx: Ctx) => unknown;

export interface Api {
  get(path: string, handler: Handler): void;
  post(path: string, handler: Handler): void;
  delete(path: string, handler: Handler): void;
}

export type FakeApp = Express & { fake: Fake };

/** Stripe API reference, "Idempotent requests": keys are kept for at least 24 hours. */
export const IDEMPOTENCY_WINDOW_MS = 24 * 60 * 60 * 1000;

/** Key order does not matter to the comparison of a replayed request's parameters. */
function canonical(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonical).join(',')}]`;
  if (value && typeof value === 'object') {
    const record = value as Record<string, unknown>;
    return `{${Object.keys(record)
      .sort()
      .map((key) => `${JSON.stringify(key)}:${canonical(record[key])}`)
      .join(',')}}`;
  }
  return JSON.stringify(value ?? null);
}

function sendError(res: Response, status: number, body: ErrorBody): void {
  res.status(status).type('application/json').send(JSON.stringify({ error: body }, null, 2));
}

/** Line items exist on a checkout session only when expanded (Stripe API reference, checkout session `line_items`). */
function virtualField(fake: Fake, node: Record<string, unknown>, key: string): unknown {
  if (node.object !== 'checkout.session' || key !== 'line_items' || typeof node.id !== 'string') return undefined;
  const session = fake.store.find(node.id)?.obj as CheckoutSession | undefined;
  if (!session) return undefined;
  return { object: 'list', data: present(session.__fake.lineItems), has_more: false, url: `/v1/checkout/sessions/${session.id}/line_items` };
}

function handle(fake: Fake, handler: Handler) {
  return async (req: Request, res: Response): Promise<void> => {
    const auth = req.get('authorization');
    const key = /^Bearer (\S+)$/.exec(auth ?? '')?.[1];
    if (!key) {
      sendError(res, 401, {
        type: 'invalid_request_error',
        message:
          "You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. 'Authorization: Bearer YOUR_SECRET_KEY').",
      });
      return;
    }
    if (!key.startsWith('sk_test_')) {
      sendError(res, 401, { type: 'invalid_request_error', message: `Invalid API Key provided: ${key.slice(0, 8)}${'*'.repeat(Math.max(0, key.length - 12))}${key.slice(-4)}` });
      return;
    }
    const { store } = fake;
    const header = req.get('stripe-account');
    const account = header && header !== store.platform ? header : store.platform;
    if (account !== store.platform && !store.maybe<Account>(store.platform, account, 'account')) {
      sendError(res, 403, {
        type: 'invalid_request_error',
        code: 'account_invalid',
        message: `The provided key '${key.slice(0, 8)}****' does not have access to account '${account}' (or that account does not exist). Application access may have been revoked.`,
      });
      return;
    }
    fake.baseUrl = `${req.protocol}://${req.get('host') ?? '127.0.0.1'}`;
    const writes = req.method === 'POST' || req.method === 'DELETE';
    const params = ((req.method === 'GET' || req.method === 'DELETE' ? req.query : req.body) ?? {}) as Params;
    const requestId = newId('req');
    res.set('Request-Id', requestId);

    const idempotencyKey = writes ? (req.get('idempotency-key') ?? null) : null;
    const slot = idempotencyKey ? `${account} ${idempotencyKey}` : null;
    const fingerprint = canonical({ method: req.method, path: req.path, params });
    if (slot) {
      const now = fake.options.now();
      const previous = fake.store.idempotency.get(slot);
      if (previous && previous.at + IDEMPOTENCY_WINDOW_MS > now) {
        if (previous.state === 'running') {
          sendError(res, 409, {
            type: 'invalid_request_error',
            code: 'idempotency_key_in_use',
            message: `There is currently another in-progress request using this Idempotent Key (that probably means you submitted twice, and the other request is still going through): ${idempotencyKey}. Please try again later.`,
          });
          return;
        }
        if (previous.fingerprint !== fingerprint) {
          sendError(res, 400, {
            type: 'idempotency_error',
            message: `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${idempotencyKey}' if you meant to execute a different request.`,
          });
          return;
        }
        res.status(previous.status ?? 200).set('Idempotent-Replayed', 'true').set('Original-Request', previous.requestId ?? requestId);
        res.type('application/json').send(previous.body);
        return;
      }
      fake.store.idempotency.set(slot, { state: 'running', fingerprint, at: now });
    }

    let status = 200;
    let text: string;
    let keep = true;
    fake.request = { id: requestId, idempotency_key: idempotencyKey };
    try {
      const body = present(await handler({ fake, account, params, path: req.params as Record<string, string> }));
      const expand = strList(params, 'expand') ?? [];
      text = JSON.stringify(store.expand(body, expand, account, (node, field) => virtualField(fake, node, field)), null, 2);
    } catch (error) {
      const apiError =
        error instanceof ApiError ? error : new ApiError(500, { type: 'api_error', message: error instanceof Error ? error.message : String(error) });
      if (!(error instanceof ApiError)) process.stderr.write(`payment fake: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`);
      status = apiError.status;
      text = JSON.stringify({ error: apiError.body }, null, 2);
      keep = !apiError.validation;
    } finally {
      fake.request = null;
    }
    if (slot) {
      if (keep) fake.store.idempotency.set(slot, { state: 'done', fingerprint, at: fake.options.now(), status, body: text, requestId });
      else fake.store.idempotency.delete(slot);
    }
    if (writes) fake.changed();
    res.status(status).type('application/json').send(text);
  };
}

/** Builds the fake without listening, so tests can drive it in-process; `app.fake.close()` stops its timers. */
export function createApp(options: FakeOptions = {}): FakeApp {
  const fake = new Fake(options);
  const app = express();
  app.disable('x-powered-by');
  // stripe-node sends GET and DELETE parameters as bracketed query strings (expand[0]=..., limit=...).
  app.set('query parser', 'extended');
  // The payment SDK sends form bodies with bracketed keys (line_items[0][price_data][product_data][name]); extended
  // parsing nests them (body-parser 2 allows 32 levels). Many line items with metadata pass the default 1000 keys.
  app.use(express.urlencoded({ extended: true, parameterLimit: 10_000 }));
  app.use(express.json());

  app.get('/health', (_req, res) => {
    res.json({ status: 'ok' });
  });

  const router = express.Router();
  const api: Api = {
    get: (path, handler) => router.get(path, handle(fake, handler)),
    post: (path, handler) => router.post(path, handle(fake, handler)),
    delete: (path, handler) => router.delete(path, handle(fake, handler)),
  };
  for (const register of [registerAccounts, registerCatalog, registerCheckout, registerPayments, registerBilling, registerEvents]) register(api);
  app.use(router);
  app.use('/v1', (req, res) => {
    sendError(res, 404, { type: 'invalid_request_error', message: `Unrecognized request URL (${req.method}: ${req.originalUrl.split('?')[0]}).` });
  });
  registerFakeRoutes(app, fake);
  registerPages(app, fake);

  // Body parser failures (too deep, malformed) answer in the API's error shape.
  app.use((error: unknown, _req: Request, res: Response, next: NextFunction) => {
    if (res.headersSent) {
      next(error);
      return;
    }
    const status = typeof (error as { status?: unknown }).status === 'number' ? (error as { status: number }).status : 500;
    sendError(res, status, { type: status < 500 ? 'invalid_request_error' : 'api_error', message: error instanceof Error ? error.message : 'Request failed' });
  });

  return Object.assign(app, { fake });
}
