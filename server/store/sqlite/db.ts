/** Small helpers every SQLite repository shares. */
import type Database from 'better-sqlite3';

export type Db = Database.Database;

const cache = new WeakMap<Db, Map<string, Database.Statement>>();

/** A prepared statement, compiled once per connection. */
export function stmt(db: Db, sql: string): Database.Statement {
  let m = cache.get(db);
  if (!m) {
    m = new Map();
    cache.set(db, m);
  }
  let s = m.get(sql);
  if (!s) {
    s = db.prepare(sql);
    m.set(sql, s);
  }
  return s;
}

export function nowIso(): string {
  return new Date().toISOString();
}

export function parseJson<T>(text: string): T {
  return JSON.parse(text) as T;
}
