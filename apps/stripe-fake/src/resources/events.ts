import type { Api, Ctx } from '../app';
import { allowParams, bool, invalid, mergeMetadata, nullableStr, refused, requireStr, str, strList } from '../errors';
import { newId, paginate, randomToken } from '../store';
import type { StripeEvent, WebhookEndpoint } from '../types';
import { change, changeMetadata } from './catalog';

// Webhook endpoints and events.

function enabledEvents(params: Record<string, unknown>): string[] | undefined {
  const events = strList(params, 'enabled_events');
  if (events && events.length === 0) throw invalid('You must specify at least one event type in enabled_events.', 'enabled_events');
  return events;
}

function endpointOf({ fake, account, path }: Ctx): WebhookEndpoint {
  return fake.store.get<WebhookEndpoint>(account, path.id ?? '', 'webhook_endpoint', 'webhook endpoint', 'id');
}

function checkUrl(url: string | undefined): void {
  if (url !== undefined && !/^https?:\/\/\S+$/.test(url)) throw invalid(`Invalid URL: ${url}`, 'url');
}

export function registerEvents(api: Api): void {
  /** Endpoints live on the platform; `connect: true` ones receive the connected accounts' events. */
  api.post('/v1/webhook_endpoints', ({ fake, account, params }) => {
    if (account !== fake.store.platform) throw refused('The fake keeps webhook endpoints on the platform; create them without Stripe-Account and set `connect`.');
    allowParams(params, ['url', 'enabled_events', 'connect', 'description', 'metadata', 'api_version']);
    const url = requireStr(params, 'url');
    checkUrl(url);
    const events = enabledEvents(params);
    if (!events) throw invalid('Missing required param: enabled_events.', 'enabled_events', 'parameter_missing');
    const secret = `whsec_${randomToken(32)}`;
    const endpoint = fake.store.put<WebhookEndpoint>(account, {
      id: newId('we'),
      object: 'webhook_endpoint',
      created: fake.nowSec(),
      livemode: false,
      api_version: str(params, 'api_version') ?? null,
      application: null,
      description: nullableStr(params, 'description') ?? null,
      enabled_events: events,
      metadata: mergeMetadata({}, params),
      status: 'enabled',
      url,
      __fake: { secret, connect: bool(params, 'connect') ?? false, chaos: { duplicates: 0, shuffle: false } },
    });
    // The secret is shown on create only (Stripe API reference, webhook endpoint `secret`).
    return { ...endpoint, secret };
  });

  api.get('/v1/webhook_endpoints/:id', (ctx) => endpointOf(ctx));

  api.post('/v1/webhook_endpoints/:id', (ctx) => {
    const { params } = ctx;
    allowParams(params, ['url', 'enabled_events', 'description', 'metadata', 'disabled']);
    const endpoint = endpointOf(ctx);
    const url = str(params, 'url');
    checkUrl(url);
    const previous: Record<string, unknown> = {};
    change(endpoint, 'url', url, previous);
    change(endpoint, 'enabled_events', enabledEvents(params), previous);
    change(endpoint, 'description', nullableStr(params, 'description'), previous);
    const disabled = bool(params, 'disabled');
    if (disabled !== undefined) endpoint.status = disabled ? 'disabled' : 'enabled';
    changeMetadata(endpoint, params, previous);
    return endpoint;
  });

  api.get('/v1/webhook_endpoints', ({ fake, account, params }) =>
    paginate(fake.store.all<WebhookEndpoint>(account, 'webhook_endpoint'), params, '/v1/webhook_endpoints'),
  );

  api.delete('/v1/webhook_endpoints/:id', (ctx) => {
    const endpoint = endpointOf(ctx);
    return ctx.fake.store.put(ctx.account, { id: endpoint.id, object: endpoint.object, created: endpoint.created, livemode: false as const, deleted: true as const });
  });

  api.get('/v1/events/:id', ({ fake, account, path }) => fake.store.get<StripeEvent>(account, path.id ?? '', 'event', 'event', 'id'));

  api.get('/v1/events', ({ fake, account, params }) => {
    const type = str(params, 'type');
    const types = strList(params, 'types');
    // `type` takes a `*` wildcard (Stripe API reference, "List all events": e.g. `invoice.*`).
    const pattern = type ? new RegExp(`^${type.replace(/[.+?^${}()|[\]\\]/g, '\\$&').replace(/\*/g, '.*')}$`) : undefined;
    const items = fake.store.all<StripeEvent>(account, 'event', (event) => (!pattern || pattern.test(event.type)) && (!types || types.includes(event.type)));
    return paginate(items, params, '/v1/events');
  });
}
