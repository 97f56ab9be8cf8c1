// Turns every error into `{ error: { code, message, details? } }` with the right status.
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { UniqueConstraintError, ValidationError as SequelizeValidationError, ForeignKeyConstraintError } from 'sequelize';
import { ZodError } from 'zod';
import { AppError } from '../errors';

/** `a.b.0` style path of a zod issue; `(body)` for the whole object. */
function issuePath(path: PropertyKey[]): string {
  return path.length ? path.map(String).join('.') : '(body)';
}

/** Maps a ZodError to the 400 body: the message names the first field; details lists every issue. */
export function zodToAppError(error: ZodError, where?: string): AppError {
  const details = error.issues.map((i) => ({ path: issuePath(i.path), message: i.message }));
  const first = details[0];
  const prefix = where && where !== 'body' ? `${where}.` : '';
  return new AppError(400, 'validation_failed', first ? `${prefix}${first.path}: ${first.message}` : 'Invalid request', details);
}

/** 404 for /api paths no row of the route table matches. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new AppError(404, 'not_found', `No API route for ${req.method} ${req.path}`));
};

/** The error middleware (registered last). Unknown errors are logged in full and answered 500 `internal_error`. */
export const errorHandler: ErrorRequestHandler = (err: unknown, req, res, next) => {
  if (res.headersSent) {
    next(err);
    return;
  }
  let appError: AppError;
  if (err instanceof AppError) appError = err;
  else if (err instanceof ZodError) appError = zodToAppError(err);
  else if (err instanceof UniqueConstraintError) {
    const fields = Object.keys(err.fields ?? {});
    appError = new AppError(409, 'conflict', `${fields.join(', ') || 'A value'} is already in use`, { fields });
  } else if (err instanceof ForeignKeyConstraintError) {
    appError = new AppError(409, 'conflict', 'The record is still referenced by other records');
  } else if (err instanceof SequelizeValidationError) {
    const details = err.errors.map((e) => ({ path: e.path ?? '(body)', message: e.message }));
    appError = new AppError(400, 'validation_failed', details[0] ? `${details[0].path}: ${details[0].message}` : err.message, details);
  } else if (isBodyParserError(err)) {
    appError = new AppError(err.status, err.status === 413 ? 'payload_too_large' : 'bad_request', err.status === 413 ? 'The request body is too large' : 'The request body is not valid JSON');
  } else {
    (req.log ?? console).error('unhandled error', { error: err instanceof Error ? err : String(err), path: req.path });
    appError = new AppError(500, 'internal_error', 'Something went wrong on the server; try again, and tell your admin if it keeps happening');
  }
  res.status(appError.status).json({
    error: { code: appError.code, message: appError.message, ...(appError.details !== undefined ? { details: appError.details } : {}) },
  });
};

function isBodyParserError(err: unknown): err is { status: number; type: string } {
  return (
    typeof err === 'object' &&
    err !== null &&
    'type' in err &&
    'status' in err &&
    typeof (err as { status: unknown }).status === 'number' &&
    (err as { status: number }).status >= 400 &&
    (err as { status: number }).status < 500
  );
}
