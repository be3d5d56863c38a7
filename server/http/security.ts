/**
 * Security headers on every answer, and strict content types on the API.
 *
 * CSP: scripts, styles, images, fonts, workers and connections from this origin
 * only; no inline script, no inline style (loosen style-src here if the client ever
 * needs inline styles), no framing, no plugins.
 */
import type { RequestHandler } from 'express';
import { HttpError } from './errors';

export const CONTENT_SECURITY_POLICY = [
  "default-src 'self'",
  "script-src 'self'",
  "style-src 'self'",
  "img-src 'self' data: blob:",
  "font-src 'self'",
  "connect-src 'self'",
  "worker-src 'self'",
  "manifest-src 'self'",
  "object-src 'none'",
  "base-uri 'self'",
  "form-action 'self'",
  "frame-ancestors 'none'",
].join('; ');

export const securityHeaders: RequestHandler = (_req, res, next) => {
  res.setHeader('Content-Security-Policy', CONTENT_SECURITY_POLICY);
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Referrer-Policy', 'no-referrer');
  res.setHeader('X-Frame-Options', 'DENY');
  res.setHeader('Cross-Origin-Opener-Policy', 'same-origin');
  res.setHeader('Cross-Origin-Resource-Policy', 'same-origin');
  next();
};

/** API answers are never cached by the browser (offline copies are the service worker's business). */
export const noStore: RequestHandler = (_req, res, next) => {
  res.setHeader('Cache-Control', 'no-store');
  next();
};

function hasBody(req: Parameters<RequestHandler>[0]): boolean {
  if (req.headers['transfer-encoding'] !== undefined) return true;
  const len = req.headers['content-length'];
  return len !== undefined && len !== '0';
}

/** A request body that is not JSON is refused with 415 before anything parses it. */
export const requireJsonBody: RequestHandler = (req, _res, next) => {
  if (hasBody(req) && !req.is('application/json')) {
    const type = req.headers['content-type'] ?? 'none';
    next(new HttpError(415, 'unsupported-media-type', `the body must be JSON (Content-Type: application/json), not ${type.slice(0, 100)}`,
      [{ path: '(body)', message: 'must be application/json' }]));
    return;
  }
  next();
};
