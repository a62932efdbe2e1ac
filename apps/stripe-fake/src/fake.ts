import { Store } from './store';
import type { Customer, TestClock } from './types';
import { Webhooks } from './webhooks';

export interface FakeOptions {
  /** JSON snapshot: loaded at start, saved ~200 ms after changes and on close. */
  stateFile?: string;
  /** First webhook retry delay; each later retry doubles it. */
  retryBaseMs?: number;
  /** Delivery attempts per event and endpoint, the first included. */
  maxAttempts?: number;
  /** An endpoint that has not answered within this is counted as failed. */
  deliveryTimeoutMs?: number;
  /** How long the chaos switch's shuffle holds events before delivering them in random order. */
  shuffleWindowMs?: number;
  now?: () => number;
}

const SAVE_DEBOUNCE_MS = 200;

/** The API version the fake answers as: the one stripe-node 22.6 is generated for (its src/apiVersion.ts). */
export const API_VERSION = '2026-08-26.dahlia';

/** The shared state of one fake: its objects, clock, the request being served and its timers. */
export class Fake {
  readonly store = new Store();
  readonly webhooks: Webhooks;
  readonly options: Required<Omit<FakeOptions, 'stateFile'>> & { stateFile: string | undefined };
  /** The API request being served, for the events it causes (`request.id`, `request.idempotency_key`). */
  request: { id: string | null; idempotency_key: string | null } | null = null;
  /** Where the fake was last reached, for the hosted page links it hands out. */
  baseUrl = 'http://127.0.0.1:12111';
  private readonly timers = new Set<NodeJS.Timeout>();
  private saveTimer: NodeJS.Timeout | null = null;
  private closed = false;

  constructor(options: FakeOptions = {}) {
    this.options = {
      stateFile: options.stateFile,
      retryBaseMs: options.retryBaseMs ?? 1000,
      maxAttempts: options.maxAttempts ?? 8,
      deliveryTimeoutMs: options.deliveryTimeoutMs ?? 10_000,
      shuffleWindowMs: options.shuffleWindowMs ?? 300,
      now: options.now ?? Date.now,
    };
    if (this.options.stateFile) this.store.loadFile(this.options.stateFile);
    this.webhooks = new Webhooks(this);
    this.webhooks.resume();
  }

  nowSec(): number {
    return Math.floor(this.options.now() / 1000);
  }

  /** Objects of a customer on a test clock live on the clock's frozen time (Stripe docs, "Test clocks"). */
  timeFor(account: string, customerId: string | null): number {
    const customer = customerId ? this.store.maybe<Customer>(account, customerId, 'customer') : undefined;
    const clock = customer?.test_clock ? this.store.maybe<TestClock>(account, customer.test_clock, 'test_helpers.test_clock') : undefined;
    return clock ? clock.frozen_time : this.nowSec();
  }

  /** Timers that do not hold the process open and are all cleared by close(). */
  later(ms: number, run: () => void | Promise<void>): void {
    if (this.closed) return;
    const timer = setTimeout(() => {
      this.timers.delete(timer);
      if (!this.closed) void run();
    }, ms);
    timer.unref();
    this.timers.add(timer);
  }

  changed(): void {
    if (!this.options.stateFile || this.saveTimer || this.closed) return;
    this.saveTimer = setTimeout(() => {
      this.saveTimer = null;
      this.flush();
    }, SAVE_DEBOUNCE_MS);
    this.saveTimer.unref();
  }

  flush(): void {
    if (this.saveTimer) clearTimeout(this.saveTimer);
    this.saveTimer = null;
    if (this.options.stateFile) this.store.saveFile(this.options.stateFile);
  }

  close(): void {
    if (this.closed) return;
    this.flush();
    this.closed = true;
    for (const timer of this.timers) clearTimeout(timer);
    this.timers.clear();
  }
}
