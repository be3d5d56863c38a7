/**
 * The one error envelope, { error: { code, message, fields? } }, and the error
 * handler that is registered LAST in app.ts. Codes (DEVELOPERS.md): invalid 400,
 * not-found 404, conflict 409, too-large 413, unsupported-media-type 415,
 * unavailable 503 (database busy), internal 500 (a fault of ours, never for client input).
 */
import type { ErrorRequestHandler } from 'express';
import { z } from 'zod';
import { issuesToFields } from '../../core/schemas';
import { StoreError, type StoreFieldError } from '../store/errors';

export interface FieldMessage {
  path: string;
  message: string;
}

export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: FieldMessage[] = [],
  ) {
    super(message);
    this.name = 'HttpError';
  }
}

const STORE_STATUS: Record<StoreError['code'], number> = { 'not-found': 404, conflict: 409, invalid: 400, unavailable: 503 };

/** Dotted field path: ['readings', 3, 'distance', 'value'] -> 'readings.3.distance.value'. */
export function dotted(path: (string | number)[]): string {
  return path.length ? path.map(String).join('.') : '(body)';
}

export function storeFields(fields: StoreFieldError[], prefix: (string | number)[] = []): FieldMessage[] {
  return fields.map((f) => ({ path: dotted([...prefix, ...f.path]), message: f.message }));
}

export function fromStoreError(e: StoreError, prefix: (string | number)[] = []): HttpError {
  return new HttpError(STORE_STATUS[e.code], e.code, e.message, storeFields(e.fields, prefix));
}

/** A 400 from a zod error, with dotted paths under `prefix`. */
export function fromZodError(e: z.ZodError, what = 'the request body'): HttpError {
  const fields = issuesToFields(e);
  const first = fields[0];
  const message = first
    ? `${what} is not valid: ${first.path === '(body)' ? '' : `${first.path}: `}${first.message}${fields.length > 1 ? ` (and ${fields.length - 1} more)` : ''}`
    : `${what} is not valid`;
  return new HttpError(400, 'invalid', message, fields);
}

function envelope(e: HttpError) {
  return { error: { code: e.code, message: e.message, ...(e.fields.length ? { fields: e.fields } : {}) } };
}

interface BodyParserError extends Error {
  type?: string;
  status?: number;
  expose?: boolean;
  limit?: number;
  length?: number;
}

/** What the body parser (express.json) and Express report, as our envelope. */
function fromFrameworkError(err: BodyParserError): HttpError | null {
  switch (err.type) {
    case 'entity.parse.failed':
      return new HttpError(400, 'invalid', `the body is not valid JSON (${err.message})`, [{ path: '(body)', message: 'must be valid JSON' }]);
    case 'entity.too.large':
      return new HttpError(413, 'too-large', `the body is larger than the limit of ${err.limit ?? '?'} bytes; send readings in smaller batches`,
        [{ path: '(body)', message: 'too large' }]);
    case 'encoding.unsupported':
    case 'charset.unsupported':
      return new HttpError(415, 'unsupported-media-type', `${err.message}: send UTF-8 JSON`, [{ path: '(body)', message: 'must be UTF-8 JSON' }]);
    case 'request.aborted':
    case 'request.size.invalid':
    case 'entity.verify.failed':
      return new HttpError(400, 'invalid', err.message, [{ path: '(body)', message: err.message }]);
    default:
      break;
  }
  if (typeof err.status === 'number' && err.status >= 400 && err.status < 500) {
    // e.g. a path that cannot be URI-decoded
    return new HttpError(err.status, err.status === 404 ? 'not-found' : 'invalid', err.expose ? err.message : 'the request is not valid');
  }
  return null;
}

export function toHttpError(err: unknown): HttpError | null {
  if (err instanceof HttpError) return err;
  if (err instanceof StoreError) return fromStoreError(err);
  if (err instanceof z.ZodError) return fromZodError(err);
  if (err instanceof Error) return fromFrameworkError(err as BodyParserError);
  return null;
}

/** Registered last. Answers every error with the envelope; logs only our own faults. */
export function errorHandler(log: (msg: string) => void): ErrorRequestHandler {
  return (err, req, res, next) => {
    if (res.headersSent) {
      next(err);
      return;
    }
    let e = toHttpError(err);
    if (!e) {
      log(`chargewalk: internal error on ${req.method} ${req.originalUrl}: ${err instanceof Error ? err.stack ?? err.message : String(err)}`);
      e = new HttpError(500, 'internal', 'something went wrong on the server; it has been logged');
    }
    if (e.status === 503) res.setHeader('Retry-After', '2');
    res.status(e.status).json(envelope(e));
  };
}
