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
