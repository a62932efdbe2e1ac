import http from 'node:http';
import type { AddressInfo } from 'node:net';
import express from 'express';
import { afterEach, describe, expect, it } from 'vitest';
import { createServer } from './server';

const open: http.Server[] = [];
afterEach(async () => {
  await Promise.all(open.splice(0).map((server) => new Promise((resolve) => server.close(resolve))));
});

function probeApp() {
  const app = express();
  app.get('/probe', (req, res) => {
    res.status(201).set('x-seen', req.get('x-probe') ?? '').json({ path: req.path, query: req.query });
  });
  return app;
}

/** Serves `app` on a free loopback port; `seen` gets, per request, whether it was made with the app's prototypes. */
async function serve(app: express.Express, server: http.Server) {
  const seen: boolean[] = [];
  // Before Express's own listener, so what it records is how Node made the pair, not what Express made of it.
  server.prependListener('request', (req, res) => {
    seen.push(Object.getPrototypeOf(req) === app.request && Object.getPrototypeOf(res) === app.response);
  });
  open.push(server);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  return { seen, base: `http://127.0.0.1:${(server.address() as AddressInfo).port}` };
}

describe('createServer', () => {
  it("makes every request and response with the app's prototypes, and Express answers through them as usual", async () => {
    const app = probeApp();
    const { seen, base } = await serve(app, createServer(app));
    for (const n of [1, 2, 3]) {
      const response = await fetch(`${base}/probe?n=${n}`, { headers: { 'x-probe': `p${n}` } });
      expect(response.status).toBe(201);
      expect(response.headers.get('x-seen')).toBe(`p${n}`);
      expect(await response.json()).toEqual({ path: '/probe', query: { n: String(n) } });
    }
    const head = await fetch(`${base}/probe`, { method: 'HEAD' });
    expect(head.status).toBe(201);
    expect(await head.text()).toBe('');
    expect(seen).toEqual([true, true, true, true]);
  });

  it("is what tells it from Node's own server, whose pairs Express has to re-prototype", async () => {
    const app = probeApp();
    const { seen, base } = await serve(app, http.createServer(app));
    expect((await fetch(`${base}/probe`)).status).toBe(201);
    expect(seen).toEqual([false]);
  });
});
