import { afterEach, describe, expect, it, vi } from 'vitest';

// The outbox's rules with a stand-in network: the server is a function of the request, so each test decides
// what "the connection drops" or "the server refuses" means. (In Node there is no IndexedDB: the outbox keeps
// its list in memory, which is the part under test here.)

interface Sent {
  path: string;
  key: string | null;
}

function network(answer: (sent: Sent) => Response | 'down') {
  const sent: Sent[] = [];
  vi.stubGlobal('fetch', async (path: string, init: RequestInit) => {
    const s = { path, key: new Headers(init.headers).get('Idempotency-Key') };
    sent.push(s);
    const a = answer(s);
    if (a === 'down') throw new TypeError('Failed to fetch');
    return a;
  });
  return sent;
}

const ok = (body: unknown) => new Response(JSON.stringify(body), { status: 201 });

async function freshOutbox() {
  vi.resetModules();
  return import('./outbox');
}

afterEach(() => vi.unstubAllGlobals());

describe('the counter outbox', () => {
  it('sends a write at once when the server answers, with its key, and keeps nothing', async () => {
    const sent = network(() => ok({ id: 't1' }));
    const outbox = await freshOutbox();
    const outcome = await outbox.send({ key: 'w-aaaaaaaa', rinkSlug: 'ice-harbor', method: 'POST', path: '/api/x', body: {}, label: 'Pair 1' });
    expect(outcome).toEqual({ queued: false, result: { id: 't1' } });
    expect(sent).toEqual([{ path: '/api/x', key: 'w-aaaaaaaa' }]);
  });

  it('keeps writes while the network is down and sends each once, in order, with the same key, when it is back', async () => {
    let up = false;
    const sent = network(() => (up ? ok({}) : 'down'));
    const outbox = await freshOutbox();
    const a = await outbox.send({ key: 'w-first001', rinkSlug: 'r', method: 'POST', path: '/api/a', body: {}, label: 'a' });
    const b = await outbox.send({ key: 'w-second01', rinkSlug: 'r', method: 'POST', path: '/api/b', body: {}, label: 'b' });
    expect([a, b]).toEqual([{ queued: true }, { queued: true }]);
    up = true;
    await outbox.flush();
    await outbox.flush();
    // Two tries of the first while down (the second write waits behind it, to keep the order), then each once.
    expect(sent.map((s) => `${s.path} ${s.key}`)).toEqual(['/api/a w-first001', '/api/a w-first001', '/api/a w-first001', '/api/b w-second01']);
  });

  it('gives a refused write back to the form and keeps it visible, without sending it again', async () => {
    const sent = network(() => new Response(JSON.stringify({ error: { code: 'conflict', message: 'Already logged' } }), { status: 409 }));
    const outbox = await freshOutbox();
    await expect(outbox.send({ key: 'w-refused1', rinkSlug: 'r', method: 'POST', path: '/api/c', body: {}, label: 'c' })).rejects.toThrow('Already logged');
    await outbox.flush();
    expect(sent).toHaveLength(1);
  });

  it('sends a write saved while an earlier pass is still running (that pass took its list before it)', async () => {
    let release: () => void = () => undefined;
    const slow = new Promise<void>((resolve) => (release = resolve));
    const sent = network(() => ok({ id: 'late' }));
    const outbox = await freshOutbox();
    // An earlier pass is busy with an older write when the new one is saved.
    vi.stubGlobal('fetch', async (path: string, init: RequestInit) => {
      sent.push({ path, key: new Headers(init.headers).get('Idempotency-Key') });
      if (path === '/api/old') await slow;
      return ok({ id: path });
    });
    const older = outbox.send({ key: 'w-older001', rinkSlug: 'r', method: 'POST', path: '/api/old', body: {}, label: 'old' });
    const newer = outbox.send({ key: 'w-newer001', rinkSlug: 'r', method: 'POST', path: '/api/new', body: {}, label: 'new' });
    release();
    expect(await older).toEqual({ queued: false, result: { id: '/api/old' } });
    expect(await newer).toEqual({ queued: false, result: { id: '/api/new' } });
  });
});
