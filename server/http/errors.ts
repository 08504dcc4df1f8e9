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

export const notFound = (what = 'That item'): AppError => new AppError(404, 'not_found', `${what} was not found`);
export const forbidden = (message = 'Your role on this farm does not allow that'): AppError =>
  new AppError(403, 'forbidden', message);

export const apiNotFound: RequestHandler = (req) => {
  throw new AppError(404, 'not_found', `There is no API at ${req.method} ${req.path}`);
};

interface HttpishError {
  status?: number;
  statusCode?: number;
  type?: string;
  code?: string;
  message?: string;
}

/** Turns every failure into `{ error: { code, message, fields? } }`. */
export function errorHandler(log: (err: unknown) => void): ErrorRequestHandler {
  return (err: unknown, _req, res, next) => {
    if (res.headersSent) return next(err);
    let status = 500;
    let body: ApiErrorBody = { error: { code: 'internal', message: 'Something went wrong on the server; nothing was changed. Try again.' } };
    if (err instanceof AppError) {
      status = err.status;
      body = { error: { code: err.code, message: err.message, ...(err.fields ? { fields: err.fields } : {}), ...(err.extra ?? {}) } };
    } else {
      const e = err as HttpishError;
      const httpStatus = e?.status ?? e?.statusCode;
      if (e?.type === 'entity.parse.failed') {
        status = 400;
        body = { error: { code: 'bad_json', message: 'The request body is not valid JSON' } };
      } else if (e?.type === 'entity.too.large' || e?.code === 'LIMIT_FILE_SIZE') {
        status = 413;
        body = { error: { code: 'too_large', message: 'The upload is larger than Furlong accepts' } };
      } else if (httpStatus && httpStatus >= 400 && httpStatus < 500) {
        status = httpStatus;
        body = { error: { code: 'bad_request', message: e.message ?? 'The request was not understood' } };
      } else {
        log(err);
      }
    }
    res.status(status).json(body);
  };
}
