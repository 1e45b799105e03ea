import { ZodError } from 'zod';

/** Field name → messages, as sent to forms and API clients. */
export type FieldErrors = Record<string, string[]>;

/** Base of the errors we raise on purpose; each maps to an HTTP status and a stable code. */
export class AppError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly code: string,
    readonly fieldErrors?: FieldErrors,
  ) {
    super(message);
    this.name = new.target.name;
  }
}

/** 400: input failed validation; `fieldErrors` says which fields and why. */
export class InvalidInputError extends AppError {
  constructor(message = 'Some fields need attention.', fieldErrors: FieldErrors = {}) {
    super(message, 400, 'invalid_input', fieldErrors);
  }
}
/** 401: the action needs a signed-in user. */
export class UnauthenticatedError extends AppError {
  constructor(message = 'Please sign in first.') {
    super(message, 401, 'unauthenticated');
  }
}
/** 403: the signed-in user may not do this. */
export class ForbiddenError extends AppError {
  constructor(message = 'You do not have permission to do that.') {
    super(message, 403, 'forbidden');
  }
}
/** 404: no such thing (or not visible to this user). */
export class NotFoundError extends AppError {
  constructor(message = 'Not found.') {
    super(message, 404, 'not_found');
  }
}
/** 409: the thing changed since the caller last saw it. */
export class ConflictError extends AppError {
  constructor(message: string) {
    super(message, 409, 'conflict');
  }
}
/** 413: the upload or body is too large. */
export class PayloadTooLargeError extends AppError {
  constructor(message = 'That is too large.') {
    super(message, 413, 'payload_too_large');
  }
}
/** 415: the upload is not of a type we accept (judged by its content, not its name). */
export class UnsupportedMediaTypeError extends AppError {
  constructor(message = 'That type of file is not accepted.', fieldErrors?: FieldErrors) {
    super(message, 415, 'unsupported_media_type', fieldErrors);
  }
}
/** 429: too many requests; try again later. */
export class RateLimitedError extends AppError {
  constructor(
    message = 'Too many requests; please wait and try again.',
    readonly retryAfterSeconds = 60,
  ) {
    super(message, 429, 'rate_limited');
  }
}

/** 503: a service we depend on (the mail server) is not answering; try again shortly. */
export class UnavailableError extends AppError {
  constructor(message = 'That is not possible just now; please try again in a minute.') {
    super(message, 503, 'unavailable');
  }
}

/** Turns a ZodError into field messages keyed by dotted path ("dose.amount"). */
export function zodFieldErrors(err: ZodError): FieldErrors {
  const out: FieldErrors = {};
  for (const issue of err.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_form';
    (out[key] ??= []).push(issue.message);
  }
  return out;
}

/** The JSON body and status for an error in a route handler; unknown errors become a generic 500. */
export function toErrorResponse(err: unknown): { status: number; body: { error: { code: string; message: string; fieldErrors?: FieldErrors } } } {
  if (err instanceof ZodError) {
    return { status: 400, body: { error: { code: 'invalid_input', message: 'Some fields need attention.', fieldErrors: zodFieldErrors(err) } } };
  }
  if (err instanceof AppError) {
    return { status: err.status, body: { error: { code: err.code, message: err.message, ...(err.fieldErrors ? { fieldErrors: err.fieldErrors } : {}) } } };
  }
  console.error(err);
  return { status: 500, body: { error: { code: 'internal', message: 'Something went wrong on our side.' } } };
}

/**
 * The state a server action returns to its form (`useActionState`). On
 * failure `code` is the error's stable code (`unauthenticated`, `forbidden`,
 * `invalid_input` …), as in the JSON error body of route handlers.
 */
export type ActionState = { ok: boolean; message?: string; fieldErrors?: FieldErrors; code?: string };

/** Maps an error to a server-action state for the form that called it. */
export function toActionState(err: unknown): ActionState {
  const { body } = toErrorResponse(err);
  return { ok: false, code: body.error.code, message: body.error.message, fieldErrors: body.error.fieldErrors };
}
