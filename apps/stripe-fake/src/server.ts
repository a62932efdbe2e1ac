import { createApp } from './app';
import { loadEnv } from './env';

const env = loadEnv();
const address = `${env.STRIPE_FAKE_HOST}:${env.STRIPE_FAKE_PORT}`;

const app = createApp({
  stateFile: env.STRIPE_FAKE_STATE_FILE,
  retryBaseMs: env.STRIPE_FAKE_RETRY_BASE_MS,
  maxAttempts: env.STRIPE_FAKE_MAX_ATTEMPTS,
});

const server = app.listen(env.STRIPE_FAKE_PORT, env.STRIPE_FAKE_HOST, (error) => {
  if (error) {
    process.stderr.write(`payment fake could not listen on ${address}: ${error.message}\n`);
    process.exit(1);
  }
  process.stdout.write(`payment fake listening on http://${address}\n`);
});

// The bootstrap stops services with SIGTERM (SIGKILL 5 s later); closing lets in-flight requests finish first,
// then the snapshot is written once more so nothing of the last 200 ms is lost.
for (const signal of ['SIGTERM', 'SIGINT'] as const) {
  process.once(signal, () => {
    server.close(() => {
      app.fake.close();
      process.exit(0);
    });
    server.closeIdleConnections();
  });
}
