/**
 * The one place the tablet talks HTTP. Every answer that is not 2xx becomes an
 * ApiError carrying the server's error envelope ({ code, message, fields });
 * a request that never got an answer (offline, DNS, reset, timeout) becomes a
 * NetworkError, which the sync treats as "try again later".
 */
export interface FieldError { path: string; message: string }

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: FieldError[] = [],
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

export class NetworkError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'NetworkError';
  }
}

const TIMEOUT_MS = 20_000;

export async function api<T>(method: 'GET' | 'POST' | 'PUT' | 'DELETE', path: string, body?: unknown): Promise<T> {
  const ctl = new AbortController();
  const timer = setTimeout(() => ctl.abort(), TIMEOUT_MS);
  let res: Response;
  try {
    res = await fetch(path, {
      method,
      headers: body === undefined ? { accept: 'application/json' } : { 'content-type': 'application/json', accept: 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
      cache: 'no-store',
      signal: ctl.signal,
    });
  } catch (e) {
    throw new NetworkError(ctl.signal.aborted ? 'the server did not answer in time' : `no connection (${(e as Error).message})`);
  } finally {
    clearTimeout(timer);
  }
  let data: unknown = null;
  const text = await res.text().catch(() => '');
  if (text) {
    try { data = JSON.parse(text); } catch { data = null; }
  }
  if (!res.ok) {
    const env = (data as { error?: { code?: string; message?: string; fields?: FieldError[] } } | null)?.error;
    throw new ApiError(res.status, env?.code ?? `http-${res.status}`, env?.message ?? `${res.status} ${res.statusText}`, Array.isArray(env?.fields) ? env.fields : []);
  }
  return data as T;
}

/** True when the error means "the request may not have reached the server or it failed there": retry later. */
export function isRetryable(e: unknown): boolean {
  if (e instanceof NetworkError) return true;
  if (e instanceof ApiError) return e.status >= 500 || e.status === 429 || e.status === 408;
  return false;
}

/**
 * Sends a raw body (an uploaded plan image) with its own Content-Type; the answer
 * is JSON like every other. Errors become ApiError / NetworkError as in api().
 */
export async function apiUpload<T>(method: 'PUT' | 'POST', path: string, body: Blob, contentType: string): Promise<T> {
  const ctl = new AbortController();
  const timer = setTimeout(() => ctl.abort(), 60_000);
  let res: Response;
  try {
    res = await fetch(path, { method, headers: { 'content-type': contentType, accept: 'application/json' }, body, cache: 'no-store', signal: ctl.signal });
  } catch (e) {
    throw new NetworkError(ctl.signal.aborted ? 'the server did not answer in time' : `no connection (${(e as Error).message})`);
  } finally {
    clearTimeout(timer);
  }
  const text = await res.text().catch(() => '');
  let data: unknown = null;
  if (text) { try { data = JSON.parse(text); } catch { data = null; } }
  if (!res.ok) {
    const env = (data as { error?: { code?: string; message?: string; fields?: FieldError[] } } | null)?.error;
    throw new ApiError(res.status, env?.code ?? `http-${res.status}`, env?.message ?? `${res.status} ${res.statusText}`, Array.isArray(env?.fields) ? env.fields : []);
  }
  return data as T;
}

/** A short sentence for an error shown on screen: the server's message and its field messages. */
export function errorText(e: unknown): string {
  if (e instanceof ApiError) {
    const f = e.fields.filter((x) => x.message).map((x) => (x.path && x.path !== '(body)' ? `${x.path}: ${x.message}` : x.message));
    return f.length ? `${e.message} (${f.join('; ')})` : e.message;
  }
  if (e instanceof NetworkError) return `No connection to the server: ${e.message}`;
  return e instanceof Error ? e.message : String(e);
}
