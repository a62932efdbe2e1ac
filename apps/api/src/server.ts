import { createApp } from './app';
import { loadEnv } from './env';

const env = loadEnv();
const { app, logger, close } = createApp(env);
const server = app.listen(env.PORT, env.HOST, () => logger.info(`Rinkwright API on http://${env.HOST}:${env.PORT}`));

for (const signal of ['SIGTERM', 'SIGINT'] as const) {
  process.on(signal, () => {
    server.close(() => void close().then(() => process.exit(0)));
    setTimeout(() => process.exit(0), 5000).unref();
  });
}
