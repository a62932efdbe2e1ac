import { createApp } from './app';
import { loadEnv } from './env';

const env = loadEnv();
const address = `${env.STRIPE_FAKE_HOST}:${env.STRIPE_FAKE_PORT}`;

const server = createApp().listen(env.STRIPE_FAKE_PORT, env.STRIPE_FAKE_HOST, (error) => {
  if (error) {
    process.stderr.write(`payment fake could not listen on ${address}: ${error.message}\n`);
    process.exit(1);
  }
  process.stdout.write(`payment fake listening on http://${address}\n`);
});

// The bootstrap stops services with SIGTERM (SIGKILL 5 s later); closing lets in-flight requests finish first.
for (const signal of ['SIGTERM', 'SIGINT'] as const) {
  process.once(signal, () => {
    server.close(() => process.exit(0));
  });
}
