import { randomBytes } from 'node:crypto';
import { existsSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { invalid, int, noSuch, type Params, str } from './errors';
import type { StripeObject } from './types';

export interface Entry {
  account: string;
  seq: number;
  obj: StripeObject;
}

export interface IdempotencyEntry {
  state: 'running' | 'done';
  fingerprint: string;
  at: number;
  status?: number;
  body?: string;
  requestId?: string;
}

export interface DeliveryAttempt {
  at: number;
  status: number | null;
  error: string | null;
}

export interface Delivery {
  id: string;
  endpoint: string;
  event: string;
  eventType: string;
  status: 'pending' | 'succeeded' | 'failed';
  attempts: DeliveryAttempt[];
  nextAttemptAt: number | null;
}

interface Snapshot {
  version: 1;
  platform: string;
  seq: number;
  objects: Entry[];
  idempotency: [string, IdempotencyEntry][];
  deliveries: Delivery[];
}

export interface ListPage<T> {
  object: 'list';
  data: T[];
  has_more: boolean;
  url: string;
}

const ID_ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789';

export function randomToken(length: number): string {
  const bytes = randomBytes(length);
  return Array.from(bytes, (byte) => ID_ALPHABET[byte % ID_ALPHABET.length]).join('');
}

/** Real ids are a prefix and 24 base62 characters (e.g. cus_NffrFeUfNV2Hib). */
export function newId(prefix: string): string {
  return `${prefix}_${randomToken(24)}`;
}

/** Drops the fake's own state from an answer: a deep copy without `__fake` on any API object. */
export function present<T>(value: T): T {
  return JSON.parse(
    JSON.stringify(value, function (this: Record<string, unknown>, key, inner: unknown) {
      return key === '__fake' && typeof this.object === 'string' ? undefined : inner;
    }),
  ) as T;
}

/**
 * One cursor pagination for every list: `limit` 1..100 (default 10), `starting_after` / `ending_before`
 * (Stripe API reference, "Pagination"). Items arrive already ordered (newest first for stored objects).
 */
export function paginate<T extends { id: string }>(items: T[], params: Params, url: string): ListPage<T> {
  const limit = int(params, 'limit') ?? 10;
  if (limit < 1 || limit > 100) throw invalid('This value must be greater than or equal to 1 and less than or equal to 100.', 'limit');
  const after = str(params, 'starting_after');
  const before = str(params, 'ending_before');
  if (after && before) throw invalid('You may only specify one of these parameters: ending_before, starting_after.', 'ending_before');
  const position = (id: string, param: string): number => {
    const index = items.findIndex((item) => item.id === id);
    if (index < 0) throw invalid(`Invalid ${param}: no object with id '${id}' in this list.`, param);
    return index;
  };
  if (after) {
    const from = position(after, 'starting_after') + 1;
    return { object: 'list', data: items.slice(from, from + limit), has_more: from + limit < items.length, url };
  }
  if (before) {
    const to = position(before, 'ending_before');
    const from = Math.max(0, to - limit);
    return { object: 'list', data: items.slice(from, to), has_more: from > 0, url };
  }
  return { object: 'list', data: items.slice(0, limit), has_more: items.length > limit, url };
}

/** Every object of every account, in memory. Each account (the platform and each connected one) has its own space. */
export class Store {
  platform: string = newId('acct');
  private seq = 0;
  private entries = new Map<string, Entry>();
  readonly idempotency = new Map<string, IdempotencyEntry>();
  readonly deliveries = new Map<string, Delivery>();

  put<T extends StripeObject>(account: string, obj: T): T {
    const existing = this.entries.get(obj.id);
    this.entries.set(obj.id, { account, seq: existing?.seq ?? ++this.seq, obj });
    return obj;
  }

  find(id: string): Entry | undefined {
    return this.entries.get(id);
  }

  maybe<T extends StripeObject>(account: string, id: string, kind: T['object']): T | undefined {
    const entry = this.entries.get(id);
    if (!entry || entry.account !== account || entry.obj.object !== kind || entry.obj.deleted) return undefined;
    return entry.obj as T;
  }

  /** The object of this account, or the real service's 404 ("No such customer: 'cus_...'"). */
  get<T extends StripeObject>(account: string, id: string, kind: T['object'], noun: string, param?: string): T {
    const found = this.maybe<T>(account, id, kind);
    if (!found) throw noSuch(noun, id, param);
    return found;
  }

  /** Live objects of one kind, newest first (by `created`, then by creation order). */
  all<T extends StripeObject>(account: string, kind: T['object'], keep: (obj: T) => boolean = () => true): T[] {
    return [...this.entries.values()]
      .filter((entry) => entry.account === account && entry.obj.object === kind && !entry.obj.deleted && keep(entry.obj as T))
      .sort((a, b) => b.obj.created - a.obj.created || b.seq - a.seq)
      .map((entry) => entry.obj as T);
  }

  everything(): Entry[] {
    return [...this.entries.values()].sort((a, b) => b.seq - a.seq);
  }

  /**
   * `expand[]` (Stripe API reference, "Expanding responses"): each dotted path replaces an id with its object;
   * `data.` walks a list. `virtual` supplies fields that exist only when expanded (checkout session line_items).
   */
  expand(body: unknown, paths: string[], account: string, virtual: (node: Record<string, unknown>, key: string) => unknown): unknown {
    const walk = (node: unknown, segments: string[]): void => {
      const [key, ...rest] = segments;
      if (!key || typeof node !== 'object' || node === null) return;
      const record = node as Record<string, unknown>;
      if (record.object === 'list' && key === 'data' && Array.isArray(record.data)) {
        for (const item of record.data) walk(item, rest);
        return;
      }
      let value = record[key];
      if (value === undefined) {
        value = virtual(record, key);
        if (value === undefined) throw invalid(`This property cannot be expanded (${key}).`, 'expand');
      } else if (typeof value === 'string') {
        const entry = this.entries.get(value);
        if (entry && (entry.account === account || entry.account === this.platform)) value = present(entry.obj);
      }
      record[key] = value;
      walk(value, rest);
    };
    for (const path of paths) {
      if (path.split('.').length > 4) throw invalid(`You cannot expand more than 4 levels of a property (${path}).`, 'expand');
      walk(body, path.split('.'));
    }
    return body;
  }

  snapshot(): Snapshot {
    return {
      version: 1,
      platform: this.platform,
      seq: this.seq,
      objects: [...this.entries.values()],
      idempotency: [...this.idempotency.entries()].filter(([, entry]) => entry.state === 'done'),
      deliveries: [...this.deliveries.values()],
    };
  }

  restore(snapshot: Snapshot): void {
    this.platform = snapshot.platform;
    this.seq = snapshot.seq;
    this.entries = new Map(snapshot.objects.map((entry) => [entry.obj.id, entry]));
    this.idempotency.clear();
    for (const [key, entry] of snapshot.idempotency) this.idempotency.set(key, entry);
    this.deliveries.clear();
    for (const delivery of snapshot.deliveries) this.deliveries.set(delivery.id, delivery);
  }

  loadFile(path: string): void {
    if (!existsSync(path)) return;
    const parsed = JSON.parse(readFileSync(path, 'utf8')) as Snapshot;
    if (parsed.version !== 1) throw new Error(`payment fake state file ${path} has an unknown version`);
    this.restore(parsed);
  }

  /** Written to a temporary file and renamed, so a crash mid-write never leaves half a snapshot. */
  saveFile(path: string): void {
    const temporary = `${path}.${process.pid}.tmp`;
    writeFileSync(temporary, JSON.stringify(this.snapshot()));
    renameSync(temporary, path);
  }
}
