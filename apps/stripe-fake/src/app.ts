import express, { type Express } from 'express';

/** Builds the fake without listening, so tests can drive it in-process. */
export function createApp(): Express {
  const app = express();
  app.disable('x-powered-by');
  // The payment SDK sends form bodies with bracketed keys (line_items[0][price]); extended parsing nests them.
  app.use(express.urlencoded({ extended: true }));

  app.get('/health', (_req, res) => {
    res.json({ status: 'ok' });
  });

  return app;
}
