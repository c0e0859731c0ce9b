import { isDatabaseUnavailable } from './db/unavailable';
import fs from 'node:fs';
import path from 'node:path';
import express, { type ErrorRequestHandler } from 'express';
import { passport } from './auth/passport';
import { createSessionMiddleware } from './auth/session';
import { projectRoot } from './config';
import { db } from './db/connection';
import { HttpError } from './errors';
import { initModels } from './models';
import { buildApiRouter, type ApiRouterOptions } from './routes';

/** Options of createApp (tests lower limits; production uses the defaults). */
export type AppOptions = ApiRouterOptions;

/**
 * The Express app, importable by tests (no listen here). Needs a connected database (`connect()`
 * or `openDatabase()` first): sessions live in PostgreSQL. Serves the API under /api (sessions,
 * passport, CSRF, guarded routes) and, when the client has been built, the client from dist/web
 * with a fallback to index.html for client routes.
 */
export function createApp(options: AppOptions = {}) {
  const sequelize = db();
  initModels(sequelize);

  const app = express();
  app.disable('x-powered-by');
  app.use(express.json({ limit: '2mb' }));

  const api = express.Router();
  api.use(createSessionMiddleware(sequelize));
  api.use(passport.initialize());
  api.use(passport.session());
  api.use(buildApiRouter(options));
  app.use('/api', api);

  const clientDir = path.join(projectRoot, 'dist', 'web');
  if (fs.existsSync(path.join(clientDir, 'index.html'))) {
    app.use(express.static(clientDir, { index: false }));
    app.get('/{*splat}', (_req, res) => res.sendFile(path.join(clientDir, 'index.html')));
  }

  app.use(errorHandler);
  return app;
}

/** Turns thrown errors into the one JSON error shape; never echoes request bodies (they may hold source code). */
const errorHandler: ErrorRequestHandler = (error, _req, res, _next) => {
  if (isDatabaseUnavailable(error)) {
    // PostgreSQL is down or restarting: a temporary condition the pool recovers from by itself.
    res.status(503).set('Retry-After', '5').json({ error: { code: 'database_unavailable', message: 'The database is unavailable right now; try again in a few seconds.' } });
    return;
  }
  if (error instanceof HttpError) {
    res.status(error.status).json({ error: { code: error.code, message: error.message, field: error.field } });
    return;
  }
  if (error?.type === 'entity.too.large') {
    res.status(413).json({ error: { code: 'too_large', message: 'The request body is too large.' } });
    return;
  }
  if (error?.type === 'entity.parse.failed') {
    res.status(400).json({ error: { code: 'invalid_json', message: 'The request body is not valid JSON.' } });
    return;
  }
  console.error('unhandled error:', error instanceof Error ? error.stack : error);
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server.' } });
};
