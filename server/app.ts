import { isDatabaseUnavailable } from './db/unavailable';
import fs from 'node:fs';
import path from 'node:path';
import cookieParser from 'cookie-parser';
import express, { type ErrorRequestHandler, type RequestHandler } from 'express';
import helmet from 'helmet';
import { bearerAuthentication, skipForTokens } from './auth/bearer';
import { CredentialLimiter, type CredentialLimits } from './auth/credential-limit';
import { passport } from './auth/passport';
import { absoluteSessionLifetime, createSessionMiddleware } from './auth/session';
import { loadConfig, projectRoot } from './config';
import { db } from './db/connection';
import { HttpError, ValidationError } from './errors';
import { initModels } from './models';
import { buildApiRouter } from './routes';

/** Options of createApp (tests lower limits or trust a proxy; production uses the configuration). */
export interface AppOptions {
  /** Failed credential checks allowed (defaults: the configuration's). */
  limits?: Partial<CredentialLimits>;
  /** Express's `trust proxy` (default: TRUST_PROXY). */
  trustProxy?: boolean | number | string[];
  /** Absolute session lifetime in milliseconds (default: SESSION_MAX_DAYS). */
  sessionMaxAgeMs?: number;
}

/** Cache-Control of files whose name carries a content hash (everything Vite puts under /assets). */
const IMMUTABLE = 'public, max-age=31536000, immutable';

/**
 * The Express app, importable by tests (no listen here). Needs a connected database (`connect()`
 * or `openDatabase()` first): sessions and sign-in limits live in PostgreSQL. Serves the API under
 * /api (Bearer check, sessions, passport, CSRF, guarded routes; never cached) and, when the client
 * has been built, the client from dist/web (hashed assets cached for a year, index.html revalidated)
 * with a fallback to index.html for client routes. Every answer carries the security headers.
 */
export function createApp(options: AppOptions = {}) {
  const config = loadConfig();
  const sequelize = db();
  initModels(sequelize);

  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', options.trustProxy ?? config.trustProxy);
  app.locals.credentialLimiter = new CredentialLimiter(sequelize, { ...config.credentialLimits, ...options.limits });
  app.use(securityHeaders(config.secureCookies));

  const api = express.Router();
  api.use((_req, res, next) => {
    // Answers hold source code and user lists: never kept by a browser or a proxy.
    res.set('Cache-Control', 'no-store');
    next();
  });
  api.use(bearerAuthentication());
  api.use(express.json({ limit: '2mb' }));
  api.use(refuseNul);
  // A request authenticated by an API token never reads cookies or a session.
  api.use(skipForTokens(createSessionMiddleware(sequelize, { idleMs: config.sessionIdleMs })));
  api.use(skipForTokens(cookieParser()));
  api.use(skipForTokens(passport.initialize()));
  api.use(skipForTokens(passport.session()));
  api.use(skipForTokens(absoluteSessionLifetime(options.sessionMaxAgeMs ?? config.sessionMaxAgeMs)));
  api.use(buildApiRouter());
  app.use('/api', api);

  const clientDir = path.join(projectRoot, 'dist', 'web');
  const assetsDir = path.join(clientDir, 'assets');
  if (fs.existsSync(path.join(clientDir, 'index.html'))) {
    app.use(
      express.static(clientDir, {
        index: false,
        cacheControl: false,
        setHeaders: (res, file) => res.setHeader('Cache-Control', file.startsWith(assetsDir + path.sep) ? IMMUTABLE : 'no-cache'),
      }),
    );
    // A missing asset is a 404, not the page (a stale tab asking for an old hash must not cache HTML as script).
    app.use('/assets', (_req, _res, next) => next(new HttpError(404, 'not_found', 'No such file.')));
    app.get('/{*splat}', (_req, res) =>
      res.sendFile(path.join(clientDir, 'index.html'), { cacheControl: false, headers: { 'Cache-Control': 'no-cache' } }),
    );
  }

  app.use(errorHandler);
  return app;
}

/**
 * helmet's headers with a Content-Security-Policy that fits the built client: scripts, styles,
 * fonts and data only from this origin (the build has no inline script or style; React sets style
 * properties through the DOM, which CSP allows), the `data:` favicon, no plugins, no framing.
 * HSTS and upgrade-insecure-requests only behind HTTPS (SECURE_COOKIES), or a plain-HTTP
 * deployment would lock its users out.
 */
function securityHeaders(https: boolean): RequestHandler {
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        scriptSrc: ["'self'"],
        styleSrc: ["'self'"],
        imgSrc: ["'self'", 'data:'],
        fontSrc: ["'self'"],
        connectSrc: ["'self'"],
        objectSrc: ["'none'"],
        baseUri: ["'self'"],
        formAction: ["'self'"],
        frameAncestors: ["'none'"],
        ...(https ? { upgradeInsecureRequests: [] } : {}),
      },
    },
    referrerPolicy: { policy: 'same-origin' },
    strictTransportSecurity: https ? { maxAge: 31_536_000 } : false,
    xFrameOptions: { action: 'deny' },
  });
}

/** Deepest nesting refuseNul walks; deeper values cannot match any schema anyway. */
const MAX_WALK_DEPTH = 64;

/**
 * 400 for a NUL character anywhere in a JSON body or a query string: PostgreSQL text cannot hold
 * one, so it would fail at the database instead of being refused with the field it was in.
 */
const refuseNul: RequestHandler = (req, _res, next) => {
  const stack: { value: unknown; path: string; depth: number }[] = [
    { value: req.body, path: '', depth: 0 },
    { value: req.query, path: '', depth: 0 },
  ];
  while (stack.length > 0) {
    const { value, path: where, depth } = stack.pop()!;
    if (typeof value === 'string') {
      if (value.includes('\u0000')) {
        const field = where || undefined;
        return next(new ValidationError(`${field ? `${field}: ` : ''}text may not contain the NUL character (\\u0000).`, field));
      }
    } else if (value && typeof value === 'object' && depth < MAX_WALK_DEPTH) {
      for (const [key, child] of Object.entries(value)) {
        const childPath = where ? `${where}.${key}` : key;
        if (key.includes('\u0000')) return next(new ValidationError('A field name may not contain the NUL character (\\u0000).'));
        stack.push({ value: child, path: childPath, depth: depth + 1 });
      }
    }
  }
  next();
};

/** What the client is told for each body-parser refusal (never its own message: some quote the body). */
const BODY_ERRORS: Record<string, { code: string; message: string }> = {
  'entity.too.large': { code: 'too_large', message: 'The request body is too large (at most 2 MB).' },
  'entity.parse.failed': { code: 'invalid_json', message: 'The request body is not valid JSON.' },
  'charset.unsupported': { code: 'unsupported_charset', message: 'The request body must be JSON in UTF-8 (charset=utf-8).' },
  'encoding.unsupported': {
    code: 'unsupported_encoding',
    message: 'This Content-Encoding is not supported: send the body as it is, or with gzip, deflate or br.',
  },
  'request.aborted': { code: 'aborted', message: 'The request was aborted before its body arrived.' },
  'request.size.invalid': { code: 'invalid_length', message: 'The request body does not match its Content-Length.' },
};

/**
 * Turns thrown errors into the one JSON error shape; never echoes request bodies (they may hold
 * source code). Errors from Express and body-parser that carry a 4xx status keep it.
 */
const errorHandler: ErrorRequestHandler = (error, _req, res, _next) => {
  if (isDatabaseUnavailable(error)) {
    // PostgreSQL is down or restarting: a temporary condition the pool recovers from by itself.
    res.status(503).set('Retry-After', '5').json({ error: { code: 'database_unavailable', message: 'The database is unavailable right now; try again in a few seconds.' } });
    return;
  }
  if (error instanceof HttpError) {
    const retryAfter = (error as HttpError & { retryAfterSeconds?: number }).retryAfterSeconds;
    if (retryAfter !== undefined) res.set('Retry-After', String(retryAfter));
    res.status(error.status).json({ error: { code: error.code, message: error.message, field: error.field } });
    return;
  }
  const status = Number(error?.status ?? error?.statusCode);
  if (Number.isInteger(status) && status >= 400 && status < 500) {
    const known = BODY_ERRORS[String(error?.type)];
    if (known) {
      res.status(status).json({ error: known });
      return;
    }
    if (error?.code === 'Z_DATA_ERROR' || error?.code === 'Z_BUF_ERROR' || /zlib|header check|decompress/i.test(String(error?.message))) {
      res.status(400).json({ error: { code: 'invalid_encoding', message: 'The request body does not match its Content-Encoding.' } });
      return;
    }
    res.status(status).json({ error: { code: 'bad_request', message: 'The request could not be read: check its URL, headers and body.' } });
    return;
  }
  console.error('unhandled error:', error instanceof Error ? error.stack : error);
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server.' } });
};
