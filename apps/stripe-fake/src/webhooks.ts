import { createHmac } from 'node:crypto';
import { API_VERSION, type Fake } from './fake';
import { type Delivery, newId, present } from './store';
import type { StripeEvent, StripeObject, WebhookEndpoint } from './types';

/**
 * The signature scheme of Stripe docs, "Verify webhook signatures": `t=<unix>,v1=<hex HMAC-SHA256(secret, "t.body")>`,
 * the payload signed as sent.
 */
export function signatureHeader(secret: string, payload: string, timestamp: number): string {
  const signature = createHmac('sha256', secret).update(`${timestamp}.${payload}`).digest('hex');
  return `t=${timestamp},v1=${signature}`;
}

export class Webhooks {
  /** Events an endpoint's shuffle switch is holding back, in arrival order. */
  private readonly held = new Map<string, Delivery[]>();

  constructor(private readonly fake: Fake) {}

  /**
   * The one event emitter. Events of a connected account live in that account (retrievable with its
   * Stripe-Account header), carry `account`, and go to the platform's `connect` endpoints.
   */
  emit(
    account: string,
    type: string,
    object: StripeObject,
    options: { previous?: Record<string, unknown>; at?: number } = {},
  ): StripeEvent {
    const { store } = this.fake;
    const connected = account !== store.platform;
    const event: StripeEvent = {
      id: newId('evt'),
      object: 'event',
      ...(connected ? { account } : {}),
      api_version: API_VERSION,
      created: options.at ?? this.fake.nowSec(),
      data: { object: present(object) as unknown as Record<string, unknown>, ...(options.previous ? { previous_attributes: present(options.previous) } : {}) },
      livemode: false,
      pending_webhooks: 0,
      request: this.fake.request ?? { id: null, idempotency_key: null },
      type,
    };
    const endpoints = this.endpointsFor(connected, type);
    event.pending_webhooks = endpoints.length;
    store.put(account, event);
    for (const endpoint of endpoints) this.enqueue(endpoint, event);
    return event;
  }

  /** Sends an event again to every endpoint that takes it (the dashboard's "Resend"), chaos included. */
  resend(event: StripeEvent): number {
    const endpoints = this.endpointsFor(event.account !== undefined, event.type);
    for (const endpoint of endpoints) this.enqueue(endpoint, event);
    return endpoints.length;
  }

  /** After a snapshot reload: pending deliveries carry on where they stopped. */
  resume(): void {
    const now = this.fake.options.now();
    for (const delivery of this.fake.store.deliveries.values()) {
      if (delivery.status === 'pending') this.fake.later(Math.max(0, (delivery.nextAttemptAt ?? now) - now), () => this.attempt(delivery));
    }
  }

  private endpointsFor(connected: boolean, type: string): WebhookEndpoint[] {
    return this.fake.store.all<WebhookEndpoint>(
      this.fake.store.platform,
      'webhook_endpoint',
      (endpoint) =>
        endpoint.status === 'enabled' &&
        endpoint.__fake.connect === connected &&
        (endpoint.enabled_events.includes('*') || endpoint.enabled_events.includes(type)),
    );
  }

  private enqueue(endpoint: WebhookEndpoint, event: StripeEvent): void {
    const { chaos } = endpoint.__fake;
    for (let copy = 0; copy <= chaos.duplicates; copy++) {
      const delivery: Delivery = {
        id: newId('dlv'),
        endpoint: endpoint.id,
        event: event.id,
        eventType: event.type,
        status: 'pending',
        attempts: [],
        nextAttemptAt: this.fake.options.now(),
      };
      this.fake.store.deliveries.set(delivery.id, delivery);
      if (chaos.shuffle) this.hold(endpoint.id, delivery);
      else this.fake.later(0, () => this.attempt(delivery));
    }
  }

  private hold(endpointId: string, delivery: Delivery): void {
    const waiting = this.held.get(endpointId);
    if (waiting) {
      waiting.push(delivery);
      return;
    }
    this.held.set(endpointId, [delivery]);
    this.fake.later(this.fake.options.shuffleWindowMs, () => {
      const batch = this.held.get(endpointId) ?? [];
      this.held.delete(endpointId);
      for (let i = batch.length - 1; i > 0; i--) {
        const j = Math.floor(Math.random() * (i + 1));
        [batch[i], batch[j]] = [batch[j] as Delivery, batch[i] as Delivery];
      }
      for (const held of batch) this.fake.later(0, () => this.attempt(held));
    });
  }

  /** At least once: a non-2xx, an error or no answer in time is retried after base × 2^(attempt−1). */
  private async attempt(delivery: Delivery): Promise<void> {
    const { store, options } = this.fake;
    const endpoint = store.find(delivery.endpoint)?.obj as WebhookEndpoint | undefined;
    const event = store.find(delivery.event)?.obj as StripeEvent | undefined;
    if (!endpoint || endpoint.deleted || !event) {
      delivery.status = 'failed';
      delivery.nextAttemptAt = null;
      return;
    }
    const payload = JSON.stringify(present(event), null, 2);
    const at = options.now();
    let status: number | null = null;
    let error: string | null = null;
    try {
      const response = await fetch(endpoint.url, {
        method: 'POST',
        headers: {
          'Content-Type': 'application/json; charset=utf-8',
          'User-Agent': 'Stripe/1.0 (+https://stripe.com/docs/webhooks)',
          'Stripe-Signature': signatureHeader(endpoint.__fake.secret, payload, Math.floor(at / 1000)),
        },
        body: payload,
        redirect: 'manual',
        signal: AbortSignal.timeout(options.deliveryTimeoutMs),
      });
      status = response.status;
      await response.body?.cancel();
    } catch (caught) {
      error = caught instanceof Error ? caught.message : String(caught);
    }
    delivery.attempts.push({ at, status, error });
    if (status !== null && status >= 200 && status < 300) {
      delivery.status = 'succeeded';
      delivery.nextAttemptAt = null;
      this.countPending(event);
    } else if (delivery.attempts.length >= options.maxAttempts) {
      delivery.status = 'failed';
      delivery.nextAttemptAt = null;
    } else {
      const wait = options.retryBaseMs * 2 ** (delivery.attempts.length - 1);
      delivery.nextAttemptAt = options.now() + wait;
      this.fake.later(wait, () => this.attempt(delivery));
    }
    this.fake.changed();
  }

  /** `pending_webhooks`: endpoints that have not yet taken the event. */
  private countPending(event: StripeEvent): void {
    const deliveries = [...this.fake.store.deliveries.values()].filter((delivery) => delivery.event === event.id);
    const endpoints = new Set(deliveries.map((delivery) => delivery.endpoint));
    const done = new Set(deliveries.filter((delivery) => delivery.status === 'succeeded').map((delivery) => delivery.endpoint));
    event.pending_webhooks = endpoints.size - done.size;
  }
}
