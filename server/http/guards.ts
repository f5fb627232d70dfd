/**
 * Request guards that apply to every state-changing API call.
 */
import type { RequestHandler } from 'express';
import { ForbiddenError, UnsupportedMediaTypeError } from './errors.js';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Refuses a state-changing request whose `Origin` is neither this host nor one of `allowed`
 * (e.g. PUBLIC_URL's origin). Requests without an Origin (non-browser clients) pass; browsers
 * always send one on cross-site POSTs.
 */
export function sameOrigin(allowed: readonly string[]): RequestHandler {
  const allow = new Set(allowed.map((o) => o.toLowerCase()));
  return (req, _res, next) => {
    if (SAFE.has(req.method)) return next();
    const origin = req.get('origin');
    if (origin === undefined) return next();
    let host: string | null = null;
    try {
      host = origin === 'null' ? null : new URL(origin).host.toLowerCase();
    } catch {
      host = null;
    }
    if ((host && host === (req.get('host') ?? '').toLowerCase()) || allow.has(origin.toLowerCase())) return next();
    throw new ForbiddenError('This request came from another site and was refused.', 'foreign_origin');
  };
}

/** A request with a body must send JSON or multipart; anything else is 415. */
export function jsonOrMultipart(): RequestHandler {
  return (req, _res, next) => {
    // `req.is` answers null without a body; an empty body (Content-Length: 0, what fetch sends
    // for a bare POST) counts as none too.
    if (req.headers['content-length'] === '0' && req.headers['transfer-encoding'] === undefined) return next();
    const t = req.is(['application/json', 'multipart/form-data']);
    if (t === false) throw new UnsupportedMediaTypeError();
    next();
  };
}
