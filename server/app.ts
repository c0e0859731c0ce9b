import fs from 'node:fs';
import path from 'node:path';
import express, { type ErrorRequestHandler } from 'express';
import { projectRoot } from './config';
import { HttpError } from './errors';

/**
 * The Express app, importable by tests (no listen here). Serves the API under /api and, when the
 * client has been built, the client from dist/web with a fallback to index.html for client routes.
 */
export function createApp() {
  const app = express();
  app.disable('x-powered-by');
  app.use(express.json({ limit: '2mb' }));

  const api = express.Router();
  api.get('/health', (_req, res) => {
    res.json({ ok: true });
  });
  api.use((req, _res, next) => next(new HttpError(404, 'not_found', `No API route ${req.method} ${req.path}.`)));
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
