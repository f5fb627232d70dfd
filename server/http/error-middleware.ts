/**
 * The one error middleware: every failure becomes `{ error: { code, message, fields } }`;
 * unexpected errors are logged on the server and answered with a plain 500, never a stack.
 */
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { HttpError, NotFoundError } from './errors.js';

export type ErrorLogger = (error: unknown) => void;

export function apiNotFound(): RequestHandler {
  return (req) => {
    throw new NotFoundError(`There is no API route ${req.method} ${req.originalUrl.split('?')[0]}.`);
  };
}

export function errorMiddleware(log: ErrorLogger): ErrorRequestHandler {
  return (err, _req, res, next) => {
    if (res.headersSent) return next(err);
    if (err instanceof HttpError) {
      res.status(err.status).json({ error: { code: err.code, message: err.message, ...(err.fields ? { fields: err.fields } : {}) } });
      return;
    }
    // body-parser's own errors (bad JSON, too large, wrong charset) carry `type` and `status`.
    const e = err as { type?: string; status?: number };
    if (e?.type === 'entity.parse.failed') {
      res.status(400).json({ error: { code: 'invalid_json', message: 'The request body is not valid JSON.' } });
      return;
    }
    if (e?.type === 'entity.too.large') {
      res.status(413).json({ error: { code: 'too_large', message: 'The request body is too large.' } });
      return;
    }
    if (e?.status === 404) {
      res.status(404).json({ error: { code: 'not_found', message: 'Not found.' } });
      return;
    }
    if (typeof e?.status === 'number' && e.status >= 400 && e.status < 500) {
      res.status(e.status).json({ error: { code: 'bad_request', message: 'The request could not be read.' } });
      return;
    }
    log(err);
    res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server. The error has been logged; please try again.' } });
  };
}
