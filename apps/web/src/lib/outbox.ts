import { createStore, del, entries, set } from 'idb-keyval';
import { useSyncExternalStore } from 'react';
import { ApiError, api } from './api-client';

// Counter writes go through this outbox so that nothing is lost or doubled when the tablet sleeps, the network
// drops or a button is pressed twice. Each write gets its Idempotency-Key when the action is taken, is kept in
// IndexedDB until the server has answered, and is sent (again) with the same key whenever the connection is
// back; the server answers a repeat of a key with its first answer, so a resend never makes a second record.

export interface PendingWrite {
  key: string;
  rinkSlug: string;
  method: 'POST' | 'PUT';
  path: string;
  body: unknown;
  /** What the counter shows while it waits, e.g. "Pair 3 on ticket 12". */
  label: string;
  createdAt: number;
  /** Set when the server refused the write: it is kept to be shown, and not sent again. */
  refused?: string;
}

type Listener = () => void;
type Answered = (write: PendingWrite, result: unknown) => void;

const store = typeof indexedDB === 'undefined' ? undefined : createStore('rinkwright', 'outbox');
let pending: PendingWrite[] = [];
let loaded: Promise<void> | undefined;
/** Passes over the outbox run one after another; each call to flush() queues one that starts after it was called. */
let passes: Promise<void> = Promise.resolve();
const listeners = new Set<Listener>();
const answeredListeners = new Set<Answered>();
const waiters = new Map<string, { resolve: (v: unknown) => void; reject: (e: unknown) => void }>();

function publish(next: PendingWrite[]) {
  pending = next.sort((a, b) => a.createdAt - b.createdAt);
  for (const l of listeners) l();
}

function load(): Promise<void> {
  loaded ??= (async () => {
    if (!store) return;
    const saved = await entries<string, PendingWrite>(store);
    publish([...pending.filter((p) => !saved.some(([k]) => k === p.key)), ...saved.map(([, v]) => v)]);
  })();
  return loaded;
}

/**
 * A new key per user action: made once when the action is taken, and reused by every resend of it. randomUUID
 * exists only in secure contexts; a counter tablet on a plain-http LAN address still needs a key.
 */
export function newKey(): string {
  if (typeof crypto.randomUUID === 'function') return `w-${crypto.randomUUID()}`;
  return `w-${Array.from(crypto.getRandomValues(new Uint8Array(16)), (b) => b.toString(16).padStart(2, '0')).join('')}`;
}

const isNetworkError = (e: unknown) => e instanceof ApiError && e.code === 'network';
const shouldRetry = (e: unknown) => isNetworkError(e) || (e instanceof ApiError && (e.status >= 500 || e.status === 409 && /still running/.test(e.message)));

/** Sends every waiting write, oldest first; stops at the first that cannot get through, to keep their order. */
export function flush(): Promise<void> {
  // Chained rather than shared: a pass already running took its list before a newer write was saved, so the
  // newer write needs a pass of its own.
  passes = passes.then(sendPending, sendPending);
  return passes;
}

async function sendPending(): Promise<void> {
  await load();
  for (const write of [...pending]) {
    if (write.refused) continue;
    try {
      const result = await api(write.path, { method: write.method, body: write.body, headers: { 'Idempotency-Key': write.key } });
      if (store) await del(write.key, store);
      publish(pending.filter((p) => p.key !== write.key));
      for (const l of answeredListeners) l(write, result);
      waiters.get(write.key)?.resolve(result);
      waiters.delete(write.key);
    } catch (error) {
      if (shouldRetry(error)) break;
      // Refused for good (a 4xx): keep it visible so nothing disappears silently, but do not resend.
      const refused = { ...write, refused: error instanceof Error ? error.message : 'Refused' };
      if (store) await set(write.key, refused, store);
      publish(pending.map((p) => (p.key === write.key ? refused : p)));
      waiters.get(write.key)?.reject(error);
      waiters.delete(write.key);
    }
  }
}

/**
 * Saves the write, then tries to send it. Resolves with the server's answer when it gets through now; when the
 * network is down it resolves with `queued` and the write goes out by itself later.
 */
export async function send<T>(write: Omit<PendingWrite, 'createdAt'>): Promise<{ queued: false; result: T } | { queued: true }> {
  await load();
  const full: PendingWrite = { ...write, createdAt: Date.now() };
  if (store) await set(full.key, full, store);
  publish([...pending.filter((p) => p.key !== full.key), full]);
  const answer = new Promise<unknown>((resolve, reject) => waiters.set(full.key, { resolve, reject }));
  await flush();
  const still = pending.find((p) => p.key === full.key);
  if (!still) return { queued: false, result: (await answer) as T };
  // Refused: the waiter was rejected with the server's error, which this rethrows for the form to show.
  if (still.refused) await answer;
  // Still waiting for the network: a later flush settles the promise, which nobody awaits any more.
  answer.catch(() => undefined);
  return { queued: true };
}

/** Forgets a refused write once the technician has seen it. */
export async function dismiss(key: string): Promise<void> {
  if (store) await del(key, store);
  publish(pending.filter((p) => p.key !== key));
}

export function onAnswered(listener: Answered): () => void {
  answeredListeners.add(listener);
  return () => answeredListeners.delete(listener);
}

function subscribe(listener: Listener) {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

/** The writes of this rink still waiting (or refused), for the banner and the lists that show them. */
export function usePendingWrites(rinkSlug: string): PendingWrite[] {
  const all = useSyncExternalStore(subscribe, () => pending);
  return all.filter((p) => p.rinkSlug === rinkSlug);
}

/** Starts the outbox: loads what a sleeping tab left, and sends whenever the connection or the tab comes back. */
export function startOutbox(): () => void {
  void load().then(flush);
  const kick = () => void flush();
  const onVisible = () => document.visibilityState === 'visible' && kick();
  window.addEventListener('online', kick);
  document.addEventListener('visibilitychange', onVisible);
  const timer = window.setInterval(kick, 15_000);
  return () => {
    window.removeEventListener('online', kick);
    document.removeEventListener('visibilitychange', onVisible);
    window.clearInterval(timer);
  };
}
