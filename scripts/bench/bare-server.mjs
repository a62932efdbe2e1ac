// The yardstick of `pnpm bench`: the same single-row locked redemption the ledger does, in bare Express and mysql2
// with nothing around it (no session, no tenant lookup, no idempotency table, no logging, no response schema).
// What the API costs on top of this is what the bench reports.
import { randomUUID } from 'node:crypto';
import http from 'node:http';
import { createRequire } from 'node:module';
import mysql from 'mysql2/promise';

// Express is the API's own dependency; under pnpm it resolves from the API's folder only.
const express = createRequire(new URL('../../apps/api/package.json', import.meta.url))('express');

const port = Number(process.env.BARE_PORT ?? 3302);
const pool = mysql.createPool({
  uri: process.env.DATABASE_URL,
  timezone: 'Z',
  connectionLimit: Number(process.env.DB_POOL_SIZE ?? 10),
  supportBigNumbers: true,
});

const app = express();
app.disable('x-powered-by');
app.use(express.json());

app.get('/ping', (_req, res) => {
  res.json({ ok: true });
});

app.post('/tenants/:tenantId/accounts/:accountId/redemptions', async (req, res) => {
  const { tenantId, accountId } = req.params;
  const key = req.get('idempotency-key');
  if (!key) return res.status(400).json({ error: 'Idempotency-Key required' });
  res.setHeader('Idempotency-Key', key);
  const conn = await pool.getConnection();
  try {
    await conn.beginTransaction();
    const [accounts] = await conn.query('SELECT id FROM credit_account WHERE tenant_id = ? AND id = ? FOR UPDATE', [tenantId, accountId]);
    if (accounts.length === 0) {
      await conn.rollback();
      return res.status(404).json({ error: 'no such account' });
    }
    const [lots] = await conn.query(
      `SELECT id, credits, remaining, price_minor FROM credit_lot
        WHERE tenant_id = ? AND account_id = ? AND remaining > 0 AND (expires_at IS NULL OR expires_at > NOW(3))
        ORDER BY expires_at IS NULL, expires_at, created_at LIMIT 1`,
      [tenantId, accountId],
    );
    const lot = lots[0];
    if (!lot) {
      await conn.rollback();
      return res.status(409).json({ error: 'insufficient credits' });
    }
    // The credit's value by the same cumulative rounding the ledger uses, so the two write equal rows.
    const used = lot.credits - lot.remaining;
    const value = Math.round((lot.price_minor * (used + 1)) / lot.credits) - Math.round((lot.price_minor * used) / lot.credits);
    await conn.query('UPDATE credit_lot SET remaining = remaining - 1 WHERE tenant_id = ? AND id = ? AND remaining >= 1', [tenantId, lot.id]);
    const id = randomUUID();
    await conn.query(
      `INSERT INTO credit_entry (id, tenant_id, account_id, lot_id, kind, credits, value_minor, source, operation_id, idem_key, created_at)
       VALUES (?, ?, ?, ?, 'redeem', -1, ?, 'staff', ?, ?, NOW(3))`,
      [id, tenantId, accountId, lot.id, -value, id, `redeem:${key}`],
    );
    await conn.commit();
    res.status(201).json({ entry: { id, lotId: lot.id, credits: -1, valueMinor: -value }, lotRemaining: lot.remaining - 1 });
  } catch (error) {
    await conn.rollback().catch(() => undefined);
    // A repeated key hits the unique key of credit_entry: the first one already redeemed.
    if (error?.code === 'ER_DUP_ENTRY') return res.status(409).json({ error: 'key already used' });
    console.error(error);
    res.status(500).json({ error: 'failed' });
  } finally {
    conn.release();
  }
});

// Requests and responses made with Express's prototypes, as the API's server makes them (apps/api/src/http/server.ts):
// what that saves is Express's cost, not the API's, so the yardstick saves it too.
function Request(socket) {
  http.IncomingMessage.call(this, socket);
}
Request.prototype = app.request;
function Response(req, options) {
  http.ServerResponse.call(this, req, options);
}
Response.prototype = app.response;
const server = http.createServer({ IncomingMessage: Request, ServerResponse: Response }, app);
server.listen(port, '127.0.0.1', () => console.log(`bare endpoint on http://127.0.0.1:${port}`));
for (const signal of ['SIGTERM', 'SIGINT']) {
  process.on(signal, () => {
    server.close(() => void pool.end().then(() => process.exit(0)));
    setTimeout(() => process.exit(0), 3000).unref();
  });
}
