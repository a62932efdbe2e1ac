import { randomUUID } from 'node:crypto';
import { existsSync } from 'node:fs';
import path from 'node:path';
import express, { type Express } from 'express';
import helmet from 'helmet';
import { rateLimit } from 'express-rate-limit';
import { pino, type Logger } from 'pino';
import { pinoHttp } from 'pino-http';
import { toNodeHandler } from 'better-auth/node';
// The folder of the API docs' files only: the package's main module loads the whole browser bundle as well.
import swaggerUiFolder from 'swagger-ui-dist/absolute-path.js';
import { connectDb, connectReportsDb, disconnectDb, disconnectReportsDb } from '@rinkwright/db';
import { currentDb } from '@rinkwright/db/unscoped';
import { createAuth, CLIENT_IP_HEADER, trustedOrigins, type Auth } from './auth';
import type { Env } from './env';
import { AppError } from './http/errors';
import { mountRoutes } from './http/mount';
import { buildOpenApi } from './http/openapi';
import type { Route } from './http/route';
import { createMailer, type Mailer } from './lib/mailer';
import { errorHandler, notFoundHandler } from './middleware/errors';
import { checkOrigin } from './middleware/origin';
import { meRoutes } from './features/me/router';
import { platformRoutes } from './features/platform/router';
import { reportRoutes } from './features/reports/router';
import { rinkRoutes } from './features/rinks/router';
import { staffRoutes } from './features/staff/router';
import { stationRoutes } from './features/stations/router';
import { customerRoutes } from './features/customers/router';
import { catalogRoutes } from './features/catalog/router';
import { ticketRoutes } from './features/tickets/router';
import { systemRoutes } from './features/system/router';
import { followActiveStations } from './features/billing/plan';
import { billingRoutes, mountWebhooks } from './features/billing/router';
import type { SalesDeps } from './features/billing/sales';
import { createPayments, type Payments } from './lib/payments';

export interface AppBundle {
  app: Express;
  auth: Auth;
  payments: Payments;
  mailer: Mailer;
  routes: Route[];
  logger: Logger;
  close(): Promise<void>;
}

/** Every route of the API, in one table: mounted, documented and swept for tenancy from here. */
export function routeTable(env: Env, auth: Auth, mailer: Mailer, logger: Logger, sales: SalesDeps): Route[] {
  const routes: Route[] = [];
  const openApi = () => buildOpenApi(routes, env.APP_URL);
  routes.push(
    ...systemRoutes(env, openApi),
    ...meRoutes,
    ...rinkRoutes(auth),
    ...staffRoutes(auth),
    ...stationRoutes({ logger, activeStationsChanged: (tenantId, changeId) => followActiveStations(tenantId, sales, changeId) }),
    ...customerRoutes,
    ...catalogRoutes,
    ...ticketRoutes({ mailer, logger }),
    ...platformRoutes(env),
    ...reportRoutes,
    ...billingRoutes(sales),
  );
  return routes;
}

export function createApp(env: Env): AppBundle {
  const logger = pino({ level: env.LOG_LEVEL, redact: ['req.headers.cookie', 'req.headers.authorization', 'res.headers["set-cookie"]'] });
  connectDb(env.DATABASE_URL, { connectionLimit: env.DB_POOL_SIZE });
  if (env.REPORTS_DATABASE_URL) connectReportsDb(env.REPORTS_DATABASE_URL, { connectionLimit: env.DB_POOL_SIZE });
  const mailer = createMailer(env, logger);
  const auth = createAuth(env, currentDb(), mailer, logger);
  const payments = createPayments(env);
  const sales: SalesDeps = { env, payments, mailer };
  const routes = routeTable(env, auth, mailer, logger, sales);

  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', env.TRUST_PROXY_HOPS);
  const https = env.APP_URL.startsWith('https://');
  // Over plain http (the local demo) asking the browser to upgrade requests would break every asset.
  app.use(helmet({ contentSecurityPolicy: { directives: { upgradeInsecureRequests: https ? [] : null } }, hsts: https }));
  app.use(
    pinoHttp({
      logger,
      genReqId: (req, res) => {
        const given = req.headers['x-request-id'];
        const id = typeof given === 'string' && /^[\w-]{8,64}$/.test(given) ? given : randomUUID();
        res.setHeader('x-request-id', id);
        return id;
      },
      autoLogging: { ignore: (req) => req.url === '/api/health' },
    }),
  );

  const limitedAnswer = { error: { code: 'rate_limited', message: 'Too many requests; wait a minute and try again' } };
  app.use('/api', rateLimit({ windowMs: 60_000, limit: env.API_RATE_LIMIT_MAX, standardHeaders: 'draft-8', legacyHeaders: false, message: limitedAnswer }));

  // better-auth reads the client address from a header we set ourselves (never the client's own value).
  app.use('/api/auth', (req, _res, next) => {
    req.headers[CLIENT_IP_HEADER] = req.ip ?? req.socket.remoteAddress ?? 'unknown';
    next();
  });
  // Rinks, members and invitations change only through our own routes, which check the tenant and the role
  // and validate the input; better-auth's organization endpoints are called server-side, never over HTTP.
  app.all('/api/auth/organization/*splat', notFoundHandler);
  app.all('/api/auth/*splat', toNodeHandler(auth));

  mountWebhooks(app, sales);
  app.use(express.json({ limit: '1mb' }));
  app.use('/api', checkOrigin(trustedOrigins(env)));
  mountRoutes(app, routes, auth);

  app.get('/api/docs/swagger-initializer.js', (_req, res) => {
    res.type('application/javascript').send(
      "window.onload=function(){window.ui=SwaggerUIBundle({url:'/api/openapi.json',dom_id:'#swagger-ui',presets:[SwaggerUIBundle.presets.apis,SwaggerUIStandalonePreset],layout:'StandaloneLayout'});};",
    );
  });
  app.use('/api/docs', express.static(swaggerUiFolder(), { index: 'index.html' }));
  app.use('/api', notFoundHandler);

  const webDist = env.WEB_DIST ? path.resolve(env.WEB_DIST) : undefined;
  if (webDist && existsSync(path.join(webDist, 'index.html'))) {
    app.use(express.static(webDist, { index: false, maxAge: '1h', setHeaders: immutableAssets }));
    app.get('/{*splat}', (_req, res) => res.sendFile(path.join(webDist, 'index.html')));
  }
  app.use((_req, _res, next) => next(AppError.notFound('No such page')));
  app.use(errorHandler);

  return {
    app,
    auth,
    payments,
    mailer,
    routes,
    logger,
    async close() {
      mailer.close();
      await disconnectReportsDb();
      await disconnectDb();
    },
  };
}

function immutableAssets(res: express.Response, file: string) {
  if (file.includes(`${path.sep}assets${path.sep}`)) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
}
