import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { ApiErrorBody } from '../../shared/schemas/common';

/** A failure the client should hear about, with a message a farmer understands. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
    readonly extra?: Record<string, unknown>,
  ) {
    super(message);
  }
}

/** The body an AppError is answered with (the error handler's), for answers built inside a route too. */
export const errorBodyOf = (err: AppError, requestId?: string): ApiErrorBody => ({
  error: {
    code: err.code,
    message: err.message,
    ...(err.fields ? { fields: err.fields } : {}),
    ...(err.extra ?? {}),
    ...(requestId ? { requestId } : {}),
  },
});

export const notFound = (what = 'That item'): AppError => new AppError(404, 'not_found', `${what} was not found`);
export const forbidden = (message = 'Your role on this farm does not allow that'): AppError => new AppError(403, 'forbidden', message);

export const apiNotFound: RequestHandler = (req) => {
  throw new AppError(404, 'not_found', `There is no API at ${req.method} ${req.path}`);
};

interface HttpishError {
  status?: number;
  statusCode?: number;
  type?: string;
  code?: string;
  name?: string;
  message?: string;
  cause?: unknown;
  errors?: unknown[];
}

export const DB_UNAVAILABLE_MESSAGE = "The farm's database is not answering; your work is not lost. Try again in a minute.";

/**
 * PostgreSQL's own codes for "the server is going away or cannot take you" (PostgreSQL manual,
 * Appendix A "PostgreSQL Error Codes": class 57 operator intervention, class 08 connection
 * exception, 53300 too_many_connections), and the socket errors Node reports for the same.
 */
const DB_DOWN_CODES = new Set([
  '57P01',
  '57P02',
  '57P03',
  '08000',
  '08001',
  '08003',
  '08004',
  '08006',
  '53300',
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EPIPE',
]);
/** What pg and knex say when a connection is lost or never came (their messages have no code). */
const DB_DOWN_MESSAGES =
  /Connection terminated|Connection ended unexpectedly|Timeout acquiring a connection|Client has encountered a connection error|Client was closed and is not queryable|timeout exceeded when trying to connect/i;

/** True when the failure means the database cannot be reached now, not that the request was wrong. */
export function isDbUnavailable(err: unknown, depth = 0): boolean {
  if (depth > 4 || typeof err !== 'object' || err === null) return false;
  const e = err as HttpishError;
  if (typeof e.code === 'string' && DB_DOWN_CODES.has(e.code)) return true;
  if (e.name === 'KnexTimeoutError') return true;
  if (typeof e.message === 'string' && DB_DOWN_MESSAGES.test(e.message)) return true;
  if (Array.isArray(e.errors) && e.errors.some((x) => isDbUnavailable(x, depth + 1))) return true;
  return isDbUnavailable(e.cause, depth + 1);
}

/**
 * Data errors PostgreSQL raises on a value it cannot store (PostgreSQL manual, Appendix A: class 22
 * data exception, 23514 check_violation). They come from what was sent, not from a fault of the
 * server, so they are a 400 with a plain reason. zod catches nearly all of these first; these are
 * the ones it let through (a check constraint, a number beyond a column's range).
 */
const DATA_ERRORS: Record<string, string> = {
  '22P02': 'One of the values is not in the form Furlong expects (for example text where a number belongs)',
  '22003': 'One of the numbers is too large or too small for Furlong to store',
  '22001': 'One of the texts is longer than Furlong can store',
  '22P05': 'One of the texts holds a character Furlong cannot store',
  '22021': 'One of the texts holds a character Furlong cannot store',
  '22007': 'One of the dates or times is not written in a form Furlong understands',
  '22008': 'One of the dates or times is outside the range Furlong can store',
  '22012': 'One of the values leads to a division by zero',
  '23514': 'One of the values is outside what Furlong accepts for it',
};

/** How the statements knex writes begin (it puts one in front of a failed query's message). */
const SQL_START =
  /^\s*\(?\s*(select|insert|update|delete|with|begin|commit|rollback|savepoint|release|set|create|alter|drop|lock|copy|truncate|values)\b/i;

/** A PostgreSQL SQLSTATE: five characters of digits and capitals. */
const isSqlState = (code: unknown): code is string => typeof code === 'string' && /^[0-9A-Z]{5}$/.test(code);

/**
 * The message of an error, fit for the log: knex puts the statement in front of PostgreSQL's
 * message ("<sql> - <message>"), and PostgreSQL quotes the offending value after a colon
 * ('invalid input syntax for type integer: "abc"'). Neither the statement nor a value (which may
 * be a person's data) is logged.
 */
export function logMessage(err: unknown): string {
  const e = (err ?? {}) as HttpishError;
  let message = typeof e.message === 'string' ? e.message : String(err);
  const cut = message.lastIndexOf(' - ');
  const withSql = SQL_START.test(message) && cut >= 0;
  if (withSql) message = message.slice(cut + 3);
  if (withSql || isSqlState(e.code)) message = message.replace(/:\s*["'(].*$/s, ': …');
  return message.slice(0, 300);
}

/** What is logged for a failed request: never the SQL, its bound values or the request body. */
export interface RequestFailureLog {
  code: string;
  message: string;
  route: string;
  /** Where the failure came from, for errors that are not the database's (no SQL in them). */
  stack?: string;
}

/**
 * Turns every failure into `{ error: { code, message, fields?, requestId? } }`. A failure worth
 * logging goes to the request's own logger (`req.log`, so the line carries the request id) and to
 * `log` when given (tests capture it); with neither, to stderr.
 */
export function errorHandler(log?: (err: unknown) => void): ErrorRequestHandler {
  return (err: unknown, req, res, next) => {
    if (res.headersSent) return next(err);
    const report = (failure: RequestFailureLog) => {
      if (req.log) req.log.error(failure, 'request failed');
      if (log) log(failure);
      else if (!req.log) console.error(failure);
    };
    let status = 500;
    let body: ApiErrorBody = {
      error: { code: 'internal', message: 'Something went wrong on the server; nothing was changed. Try again.' },
    };
    const route = `${req.method} ${req.originalUrl.split('?')[0]}`;
    if (err instanceof AppError) {
      status = err.status;
      body = errorBodyOf(err);
    } else {
      const e = err as HttpishError;
      const httpStatus = e?.status ?? e?.statusCode;
      if (e?.type === 'entity.parse.failed') {
        status = 400;
        body = { error: { code: 'bad_json', message: 'The request body is not valid JSON' } };
      } else if (e?.type === 'entity.too.large' || e?.code === 'LIMIT_FILE_SIZE') {
        status = 413;
        body = { error: { code: 'too_large', message: 'The upload is larger than Furlong accepts' } };
      } else if (isDbUnavailable(err)) {
        status = 503;
        body = { error: { code: 'db_unavailable', message: DB_UNAVAILABLE_MESSAGE } };
        res.set('Retry-After', '30');
        report({ code: e.code ?? e.name ?? 'db_unavailable', message: logMessage(err), route });
      } else if (isSqlState(e?.code) && DATA_ERRORS[e.code]) {
        status = 400;
        body = { error: { code: 'invalid_input', message: `${DATA_ERRORS[e.code]}; nothing was changed.` } };
      } else if (httpStatus && httpStatus >= 400 && httpStatus < 500) {
        status = httpStatus;
        body = { error: { code: 'bad_request', message: e.message ?? 'The request was not understood' } };
      } else {
        const fromDb = isSqlState(e?.code) || SQL_START.test(e?.message ?? '') || (typeof err === 'object' && err !== null && 'sql' in err);
        report({
          code: e?.code ?? 'internal',
          message: logMessage(err),
          route,
          ...(!fromDb && err instanceof Error && err.stack ? { stack: err.stack.split('\n').slice(1, 8).join('\n') } : {}),
        });
      }
    }
    // Set by the request logger (server/logging/request-log.ts); an app without it has no id to give.
    if (typeof req.id === 'string') body.error.requestId = req.id;
    res.status(status).json(body);
  };
}
