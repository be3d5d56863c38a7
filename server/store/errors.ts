/**
 * What a store reports when a request cannot be carried out. The HTTP layer maps
 * the codes to statuses (not-found 404, conflict 409, invalid 400, unavailable 503); anything else
 * a store throws is a fault of ours (500).
 *
 * Field paths are relative to the object the caller passed (e.g. ['spotId'], or
 * [3, 'spotId'] for the fourth reading of a batch); the route prefixes them.
 */
export type StoreErrorCode = 'not-found' | 'conflict' | 'invalid' | 'unavailable';

export interface StoreFieldError {
  path: (string | number)[];
  message: string;
}

export class StoreError extends Error {
  constructor(
    readonly code: StoreErrorCode,
    message: string,
    readonly fields: StoreFieldError[] = [],
  ) {
    super(message);
    this.name = 'StoreError';
  }
}

export function notFound(message: string, path?: (string | number)[]): StoreError {
  return new StoreError('not-found', message, path ? [{ path, message }] : []);
}

export function conflict(message: string, path?: (string | number)[]): StoreError {
  return new StoreError('conflict', message, path ? [{ path, message }] : []);
}

export function invalid(message: string, path?: (string | number)[]): StoreError {
  return new StoreError('invalid', message, path ? [{ path, message }] : []);
}

/** A database the server must not run on: damaged, from a newer version, not ours. */
export class StoreStartupError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'StoreStartupError';
  }
}
