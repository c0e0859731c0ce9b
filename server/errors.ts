/**
 * Typed errors that route handlers and commands throw; the error middleware in app.ts turns each
 * into `{ error: { code, message, field? } }` with its status.
 */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly field?: string,
  ) {
    super(message);
  }
}

/** 400: the request body or query failed validation. */
export class ValidationError extends HttpError {
  constructor(message: string, field?: string) {
    super(400, 'invalid_request', message, field);
  }
}

/** 401: no signed-in user (or a bad credential). */
export class AuthenticationError extends HttpError {
  constructor(message = 'Sign in first.') {
    super(401, 'unauthenticated', message);
  }
}

/** 403: signed in, but the role may not do this. */
export class AuthorizationError extends HttpError {
  constructor(message = 'Your role does not allow this.') {
    super(403, 'forbidden', message);
  }
}

/** 404: the record does not exist (or is not visible). */
export class NotFoundError extends HttpError {
  constructor(what: string) {
    super(404, 'not_found', `${what} not found.`);
  }
}

/** 409: the request conflicts with what is stored (a duplicate name, say). */
export class ConflictError extends HttpError {
  constructor(message: string, field?: string) {
    super(409, 'conflict', message, field);
  }
}

/**
 * What each unique constraint a request can run into means, by PostgreSQL's constraint name
 * (the default `<table>_<columns>_key` of the migrations). The message never echoes the stored
 * values: the database's own detail text would.
 */
const UNIQUE_CONSTRAINTS: Record<string, { message: string; field: string }> = {
  repositories_organisation_id_name_key: { message: 'Another repository of this organisation already has this name.', field: 'name' },
  snapshots_repository_id_label_key: { message: 'This repository already has a snapshot with this label.', field: 'label' },
  users_email_key: { message: 'Someone with this e-mail address already has an account.', field: 'email' },
};

/** PostgreSQL's SQLSTATE for a unique-constraint violation. */
const UNIQUE_VIOLATION = '23505';

/**
 * The error a request should answer with: a unique-constraint violation (SQLSTATE 23505, as
 * Sequelize wraps it or as the driver throws it) becomes a 409 ConflictError naming the field;
 * anything else is returned as it is.
 *
 * @example next(fromDatabaseError(error)) // a duplicate repository name → 409 on `name`
 */
export function fromDatabaseError(error: unknown): unknown {
  const cause = (error as { parent?: { code?: unknown; constraint?: unknown } } | null)?.parent ?? error;
  const { code, constraint } = (cause ?? {}) as { code?: unknown; constraint?: unknown };
  if (code !== UNIQUE_VIOLATION) return error;
  const known = typeof constraint === 'string' ? UNIQUE_CONSTRAINTS[constraint] : undefined;
  return known ? new ConflictError(known.message, known.field) : new ConflictError('This would duplicate something already stored.');
}

/**
 * The record, or a 404 naming what was not found.
 *
 * @example const repository = found(await findRepository(organisationId, id), 'Repository');
 */
export function found<T>(record: T | null | undefined, what: string): T {
  if (record === null || record === undefined) throw new NotFoundError(what);
  return record;
}
