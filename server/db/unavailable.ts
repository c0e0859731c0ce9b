/**
 * Telling "the database cannot be reached right now" apart from every other failure, so the API
 * can answer 503 (try again) instead of 500 (a bug) while PostgreSQL restarts, and recover by
 * itself once it is back: the pool drops broken connections and opens new ones on demand.
 */

// Node's socket errors on connect or mid-query.
const SOCKET_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENETUNREACH', 'EPIPE', 'EAI_AGAIN']);

// SQLSTATEs (PostgreSQL manual, appendix A): 57P01 admin_shutdown, 57P02 crash_shutdown,
// 57P03 cannot_connect_now (starting up or shutting down), 53300 too_many_connections;
// the whole class 08 is "connection exception".
const SQLSTATES = new Set(['57P01', '57P02', '57P03', '53300']);

// Sequelize wraps connection failures in these (sequelize/lib/errors/connection/*).
const SEQUELIZE_NAMES = new Set([
  'SequelizeConnectionError',
  'SequelizeConnectionRefusedError',
  'SequelizeConnectionTimedOutError',
  'SequelizeConnectionAcquireTimeoutError',
  'SequelizeHostNotReachableError',
]);

// node-postgres says these in plain messages, without a code, when a connection dies under it.
const PG_MESSAGES = [
  /^Connection terminated/,
  /Client has encountered a connection error and is not queryable/,
  /^Client was closed and is not queryable/,
  /the database system is (shutting down|starting up|in recovery mode)/,
];

function oneLevel(error: object): boolean {
  const { code, name, message } = error as { code?: unknown; name?: unknown; message?: unknown };
  if (typeof code === 'string' && (SOCKET_CODES.has(code) || SQLSTATES.has(code) || /^08[0-9A-Z]{3}$/.test(code))) return true;
  if (typeof name === 'string' && SEQUELIZE_NAMES.has(name)) return true;
  return typeof message === 'string' && PG_MESSAGES.some((pattern) => pattern.test(message));
}

/**
 * True when the error (or what it wraps: Sequelize's `parent`/`original`, a standard `cause`)
 * means PostgreSQL is unreachable or refusing connections for now, not that a query is wrong.
 *
 * @example
 * isDatabaseUnavailable(Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:5432'), { code: 'ECONNREFUSED' })) // true
 * isDatabaseUnavailable(new Error('relation "x" does not exist')) // false
 */
export function isDatabaseUnavailable(error: unknown): boolean {
  const seen = new Set<object>();
  let current: unknown = error;
  while (current !== null && typeof current === 'object' && !seen.has(current)) {
    seen.add(current);
    if (oneLevel(current)) return true;
    const wrapper = current as { parent?: unknown; original?: unknown; cause?: unknown };
    current = wrapper.parent ?? wrapper.original ?? wrapper.cause;
  }
  return false;
}
