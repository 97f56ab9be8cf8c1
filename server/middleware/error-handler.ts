// Turns every error into `{ error: { code, message, details? } }` with the right status.
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { BaseError as SequelizeBaseError, ConnectionError as SequelizeConnectionError, UniqueConstraintError, ValidationError as SequelizeValidationError, ForeignKeyConstraintError } from 'sequelize';
import { ZodError } from 'zod';
import { AppError } from '../errors';
import { loggablePath } from './request-id';
import { isLockConflict } from '../db/retry';

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
    appError = bodyParserAppError(err);
  } else if (isLockConflict(err)) {
    // A deadlock or lock-wait timeout that escaped a transaction without retry: safe to send again.
    (req.log ?? console).warn('lock conflict', { error: loggableError(err), path: loggablePath(req.originalUrl ?? req.path) });
    res.setHeader('Retry-After', '1');
    appError = new AppError(503, 'busy', 'Someone else was changing the same records; nothing was saved. Try again');
  } else if (isDatabaseUnavailable(err)) {
    (req.log ?? console).warn('database unavailable', { error: loggableError(err), path: loggablePath(req.originalUrl ?? req.path) });
    res.setHeader('Retry-After', '10');
    appError = new AppError(503, 'database_unavailable', 'The database is not answering right now; nothing was saved. Try again in a minute, and tell your admin if it keeps happening');
  } else if (err instanceof URIError) {
    // Express decodes path parameters before any route runs; a malformed %-escape throws here.
    appError = new AppError(400, 'bad_request', 'The address has a malformed %-escape; check the link or type the address again');
  } else if (clientErrorStatus(err) !== null) {
    // Any other 4xx thrown by middleware before a route's validation (http-errors style).
    appError = new AppError(clientErrorStatus(err)!, 'bad_request', 'The request could not be read; check the address and what was sent, then try again');
  } else {
    const log = req.log ?? console;
    log.error('unhandled error', { error: loggableError(err), path: loggablePath(req.originalUrl ?? req.path) });
    const sql = sqlOf(err);
    if (sql) log.debug('failed statement', { sql });
    appError = new AppError(500, 'internal_error', 'Something went wrong on the server; try again, and tell your admin if it keeps happening');
  }
  res.status(appError.status).json({
    error: { code: appError.code, message: appError.message, ...(appError.details !== undefined ? { details: appError.details } : {}) },
  });
};

/** Driver codes of a database that is down, restarting or unreachable (mariadb connector 3 names). */
const UNAVAILABLE_CODES = new Set([
  'ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'ER_GET_CONNECTION_TIMEOUT', 'ER_CONNECTION_TIMEOUT', 'ER_SOCKET_UNEXPECTED_CLOSE',
  'ER_CONNECTION_ALREADY_CLOSED', 'ER_CMD_CONNECTION_CLOSED', 'ER_SERVER_SHUTDOWN', 'ER_CON_COUNT_ERROR', 'PROTOCOL_CONNECTION_LOST',
]);

/** Whether `err` says the database cannot be reached (as opposed to a query it refused). */
function isDatabaseUnavailable(err: unknown): boolean {
  if (err instanceof SequelizeConnectionError) return true;
  let e: unknown = err;
  for (let depth = 0; depth < 3 && typeof e === 'object' && e !== null; depth += 1) {
    const x = e as { code?: unknown; fatal?: unknown; errno?: unknown; original?: unknown; parent?: unknown };
    if (typeof x.code === 'string' && UNAVAILABLE_CODES.has(x.code)) return true;
    // 1053 server shutdown in progress, 2006 server has gone away, 2013 lost connection during query.
    if (typeof x.errno === 'number' && [1053, 2006, 2013].includes(x.errno)) return true;
    e = x.original ?? x.parent;
  }
  return false;
}

/** The 4xx status an http-errors style error carries (`status`/`statusCode`), else null. */
function clientErrorStatus(err: unknown): number | null {
  if (typeof err !== 'object' || err === null) return null;
  const e = err as { status?: unknown; statusCode?: unknown };
  const status = typeof e.status === 'number' ? e.status : typeof e.statusCode === 'number' ? e.statusCode : null;
  return status !== null && Number.isInteger(status) && status >= 400 && status < 500 ? status : null;
}

/** The SQL text a database error carries (Sequelize `sql`, the driver's `sql`), if any. */
function sqlOf(err: unknown): string | undefined {
  if (!(err instanceof SequelizeBaseError)) return undefined;
  const e = err as SequelizeBaseError & { sql?: string; original?: { sql?: string } };
  return e.sql ?? e.original?.sql;
}

/**
 * An error as a log field without the statement and its values: the mariadb driver appends
 * `sql: …` (with the submitted values inlined by Sequelize) to its messages, and Sequelize copies
 * them; those must not reach a log at the default level. The statement goes to `debug` only.
 */
export function loggableError(err: unknown): Record<string, unknown> | string {
  if (!(err instanceof Error)) return String(err);
  if (!(err instanceof SequelizeBaseError)) return err as unknown as Record<string, unknown>;
  const e = err as SequelizeBaseError & { original?: { code?: string; errno?: number; sqlState?: string; text?: string } };
  const strip = (text: string) => text.split('\nsql: ')[0]!;
  return {
    name: e.name,
    message: strip(e.original?.text ?? e.message),
    code: e.original?.code,
    errno: e.original?.errno,
    sqlState: e.original?.sqlState,
    stack: (e.stack ?? '').split('\n').filter((line) => line.trimStart().startsWith('at ')).join('\n'),
  };
}

/** The body parser's 4xx in the one error shape, with a message saying what to send instead. */
function bodyParserAppError(err: { status: number; type: string }): AppError {
  if (err.status === 413) return new AppError(413, 'payload_too_large', 'The request body is too large');
  if (err.type === 'charset.unsupported' || err.type === 'encoding.unsupported') {
    return new AppError(415, 'unsupported_media_type', 'Send the request body as uncompressed UTF-8 JSON');
  }
  if (err.type === 'entity.parse.failed') return new AppError(400, 'bad_request', 'The request body is not valid JSON');
  return new AppError(err.status, 'bad_request', 'The request body could not be read; send it again as JSON');
}

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
