import { createServer, type IncomingMessage, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';
import { createApp, type FakeApp } from './app';
import type { FakeOptions } from './fake';

// Test support shared by the fake's test files: the fake on port 0 with the official SDK as its client,
// and a webhook receiver that records what it was sent.

export interface RunningFake {
  app: FakeApp;
  stripe: Stripe;
  url: string;
  close(): Promise<void>;
}

function listen(server: Server): Promise<string> {
  return new Promise((resolve) => {
    server.listen(0, '127.0.0.1', () => resolve(`http://127.0.0.1:${(server.address() as AddressInfo).port}`));
  });
}

function shut(server: Server): Promise<void> {
  server.closeAllConnections();
  return new Promise((resolve) => server.close(() => resolve()));
}

export async function startFake(options: FakeOptions = {}): Promise<RunningFake> {
  const app = createApp(options);
  const server = createServer(app);
  const url = await listen(server);
  const stripe = new Stripe('sk_test_fake', { host: '127.0.0.1', port: Number(new URL(url).port), protocol: 'http', maxNetworkRetries: 0 });
  return {
    app,
    stripe,
    url,
    close: async () => {
      app.fake.close();
      await shut(server);
    },
  };
}

export interface Received {
  body: string;
  signature: string;
  headers: IncomingMessage['headers'];
  at: number;
}

export interface Receiver {
  url: string;
  received: Received[];
  /** Answers these statuses to the next requests, then 200. */
  failNext(...statuses: number[]): void;
  waitFor(count: number, timeoutMs?: number): Promise<Received[]>;
  close(): Promise<void>;
}

export async function startReceiver(): Promise<Receiver> {
  const received: Received[] = [];
  const failures: number[] = [];
  const server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (chunk: Buffer) => chunks.push(chunk));
    req.on('end', () => {
      received.push({ body: Buffer.concat(chunks).toString('utf8'), signature: String(req.headers['stripe-signature']), headers: req.headers, at: Date.now() });
      res.statusCode = failures.shift() ?? 200;
      res.end();
    });
  });
  const url = await listen(server);
  return {
    url,
    received,
    failNext: (...statuses) => failures.push(...statuses),
    waitFor: async (count, timeoutMs = 5000) => {
      const deadline = Date.now() + timeoutMs;
      while (received.length < count) {
        if (Date.now() > deadline) throw new Error(`webhook receiver got ${received.length} of ${count} requests`);
        await new Promise((resolve) => setTimeout(resolve, 10));
      }
      return received;
    },
    close: () => shut(server),
  };
}

/** Submits a form of the fake's HTML pages like a browser would, without following redirects. */
export async function submit(url: string, fields: Record<string, string>): Promise<{ status: number; location: string | null; text: string }> {
  const response = await fetch(url, { method: 'POST', body: new URLSearchParams(fields), redirect: 'manual' });
  return { status: response.status, location: response.headers.get('location'), text: await response.text() };
}

export async function until<T>(read: () => Promise<T>, done: (value: T) => boolean, timeoutMs = 5000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await read();
    if (done(value)) return value;
    if (Date.now() > deadline) throw new Error('condition not reached in time');
    await new Promise((resolve) => setTimeout(resolve, 10));
  }
}
