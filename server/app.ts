import cookieParser from 'cookie-parser';
import express, { type Express, type RequestHandler } from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import { existsSync } from 'node:fs';
import type { IncomingMessage } from 'node:http';
import path from 'node:path';
import type Stripe from 'stripe';
import type { AppConfig } from './config.ts';
import { authenticate } from './features/auth/authenticate.ts';
import { createAuthRouter } from './features/auth/auth.routes.ts';
import { createFeesRouter } from './features/fees/fees.routes.ts';
import { createPaymentsClient } from './features/fees/payments-client.ts';
import { createFuelRouter } from './features/fuel/fuel.routes.ts';
import { createGoalsRouter } from './features/goals/goals.routes.ts';
import { createPlansRouter } from './features/plans/plans.routes.ts';
import { createPrescribeRouter } from './features/plans/prescribe.routes.ts';
import { createCalendarRouter } from './features/calendar/calendar.routes.ts';
import { createSquadsRouter } from './features/squads/squads.routes.ts';
import { createOutboxRouter } from './features/mail/outbox.routes.ts';
import { createWeeksRouter } from './features/weeks/weeks.routes.ts';
import { createNotesRouter } from './features/notes/notes.routes.ts';
import { createNoticesRouter } from './features/notices/notices.routes.ts';
import { warmPasswordPool } from './features/auth/password-pool.ts';
import { warmComputePool } from './features/compute/compute-pool.ts';
import { createHealthRouter } from './features/health/health.routes.ts';
import { createHistoryRouter } from './features/history/history.routes.ts';
import { buildOpenApiDocument, renderApiPage } from './features/openapi/openapi.ts';
import { createRunsRouter } from './features/runs/runs.routes.ts';
import { createToolsRouter } from './features/tools/tools.routes.ts';
import { createUsersRouter } from './features/users/users.routes.ts';
import { errorHandler, notFoundHandler } from './lib/error-handler.ts';
import { loggableUrl, logger } from './lib/logger.ts';
import { createSmtpMailer, type Mailer } from './lib/mailer.ts';
import { csrfProtection } from './lib/session.ts';
import { rememberWritePositions } from './lib/read-replica.ts';
import { createFsStore, type FileStore } from './lib/storage.ts';

export interface AppDeps {
  config: AppConfig;
  /** Built client to serve (dist/client); omitted in API tests. */
  clientDir?: string;
  /** Where original files go; local disk under DATA_DIR by default. */
  store?: FileStore;
  /** Outgoing e-mail; SMTP to SMTP_URL or the local mail catcher by default. */
  mailer?: Mailer;
  /** The payment service's SDK client; built from config.payments by default (null: payments not set up). */
  payments?: Stripe | null;
}

const API_VERSION = '0.1.0';

/**
 * pino-http's request lines (at 'info'). It builds a child logger per request and serialises the request
 * into it even when the line will be dropped, about 3-5 % of a kept read's CPU (tests/bench/README.md,
 * session 9): below 'info' (tests, `npm run load`) a request gets only its id, from the same counter.
 * The level is read per request, so `captureLogLines` still sees every line it saw before.
 */
function requestLogs(): RequestHandler {
  let lastRequestId = 0;
  // pino-http's own default: 1, 2, 3… wrapping at 2^31 - 1.
  const nextRequestId = (req: IncomingMessage) => req.id || (lastRequestId = (lastRequestId + 1) & 0x7fffffff);
  const withLines = pinoHttp({
    logger,
    genReqId: nextRequestId,
    autoLogging: { ignore: (req) => req.url === '/api/health' },
    serializers: { req: (req: { url?: string }) => ({ ...req, url: req.url && loggableUrl(req.url) }) },
  });
  return (req, res, next) => {
    if (withLines.logger.isLevelEnabled('info')) return withLines(req, res, next);
    req.id = nextRequestId(req);
    // No server code reads req.log; it stays a logger (without the request's bindings) for any that would.
    req.log = res.log = withLines.logger;
    next();
  };
}

/** Builds the Express app: middleware, feature routers under /api, the API docs, the client, then errors. */
export function createApp({
  config,
  clientDir,
  store = createFsStore(config.dataDir),
  mailer = createSmtpMailer(config),
  payments = createPaymentsClient(config),
}: AppDeps): Express {
  // The compute pool's first thread starts loading now rather than on the first upload.
  warmComputePool();
  // Likewise the password thread, before the first sign-in.
  warmPasswordPool();
  const app = express();
  app.disable('x-powered-by');
  if (process.env.TRUST_PROXY) app.set('trust proxy', process.env.TRUST_PROXY);

  app.use(helmet());
  app.use(requestLogs());
  // The payment service signs the exact bytes it sends: its webhook gets the raw body (same size limit).
  app.use('/api/payments/webhook', express.raw({ type: () => true, limit: config.jsonLimit }));
  app.use(express.json({ limit: config.jsonLimit }));
  app.use(cookieParser());

  const features = [
    createHealthRouter(),
    createAuthRouter(config, mailer),
    createUsersRouter(),
    createRunsRouter(store, config, mailer),
    createGoalsRouter(),
    createToolsRouter(),
    createPrescribeRouter(),
    createCalendarRouter(config),
    createPlansRouter(config),
    createSquadsRouter(mailer, config),
    createOutboxRouter(config),
    createWeeksRouter(mailer, config),
    createNotesRouter(),
    createFuelRouter(mailer, config),
    createNoticesRouter(config),
    createHistoryRouter(store, config),
    createFeesRouter(config, payments),
  ];
  const openApi = buildOpenApiDocument(
    features.flatMap((f) => f.specs),
    API_VERSION,
  );

  const api = express.Router();
  api.use(csrfProtection(config));
  api.use(authenticate(config));
  // With a read replica: a user's writes are remembered so their next reads see them (read-your-writes).
  api.use(rememberWritePositions());
  api.get('/openapi.json', (_req, res) => {
    res.json(openApi);
  });
  api.get('/docs', (_req, res) => {
    res.type('html').send(renderApiPage(openApi));
  });
  for (const feature of features) api.use(feature.router);
  api.use(notFoundHandler);
  app.use('/api', api);

  if (clientDir && existsSync(path.join(clientDir, 'index.html'))) {
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
    // Client-side routes: every other GET gets the app shell.
    app.get(/.*/, (_req, res) => {
      res.sendFile(path.join(clientDir, 'index.html'));
    });
  }

  app.use(errorHandler);
  return app;
}
