import { createApp } from './app';
import { createServer } from './http/server';
import { loadEnv } from './env';
import { startWorker } from './jobs/worker';
import { ensureWebhookEndpoints } from './lib/payment-settings';

const env = loadEnv();
const { app, logger, close, payments, mailer } = createApp(env);
const server = createServer(app).listen(env.PORT, env.HOST, () => logger.info(`Rinkwright API on http://${env.HOST}:${env.PORT}`));

// Webhooks need the endpoints registered; a payment service that is down is retried, and the rest still works.
const register = () =>
  ensureWebhookEndpoints(env, payments, logger).catch((error: unknown) => {
    logger.warn({ err: error }, 'payment webhook endpoints not registered yet; retrying in 30 s');
    setTimeout(() => void register(), 30_000).unref();
  });
void register();
const stopWorker = env.WORKER_ENABLED ? startWorker({ env, mailer, logger }) : () => undefined;

for (const signal of ['SIGTERM', 'SIGINT'] as const) {
  process.on(signal, () => {
    stopWorker();
    server.close(() => void close().then(() => process.exit(0)));
    setTimeout(() => process.exit(0), 5000).unref();
  });
}
