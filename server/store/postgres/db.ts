/**
 * Small helpers every PostgreSQL repository shares: a query interface over one
 * pg client (the transaction's), with SQLite-style `?` placeholders turned into
 * `$1, $2, ...` so the repositories read like their SQLite twins.
 */
import pg from 'pg';

export interface Db {
  /** The first row, or undefined. */
  get(sql: string, ...params: unknown[]): Promise<unknown>;
  all(sql: string, ...params: unknown[]): Promise<unknown[]>;
  /** changes: the number of rows written. */
  run(sql: string, ...params: unknown[]): Promise<{ changes: number }>;
}

const converted = new Map<string, string>();

/** `?` -> `$n` outside quotes (the SQL of the repositories never uses `?` otherwise). */
export function toPgSql(sql: string): string {
  let out = converted.get(sql);
  if (out !== undefined) return out;
  let n = 0;
  let quote: string | null = null;
  out = '';
  for (const ch of sql) {
    if (quote) {
      if (ch === quote) quote = null;
      out += ch;
    } else if (ch === "'" || ch === '"') {
      quote = ch;
      out += ch;
    } else if (ch === '?') {
      out += `$${++n}`;
    } else {
      out += ch;
    }
  }
  converted.set(sql, out);
  return out;
}

/** Type parsers of this store's pools: BIGINT and COUNT as numbers (ms timestamps fit), JSON columns as their text. */
export const TYPES = {
  getTypeParser: ((oid: number, format?: 'text' | 'binary') => {
    if (oid === 20) return (v: string) => Number(v); // int8
    if (oid === 114 || oid === 3802) return (v: string) => v; // json, jsonb: the repositories parse the text themselves
    return pg.types.getTypeParser(oid, format);
  }) as typeof pg.types.getTypeParser,
};

export function clientDb(client: pg.PoolClient | pg.Client): Db {
  return {
    async get(sql, ...params) {
      const r = await client.query(toPgSql(sql), params);
      return r.rows[0] as unknown;
    },
    async all(sql, ...params) {
      const r = await client.query(toPgSql(sql), params);
      return r.rows as unknown[];
    },
    async run(sql, ...params) {
      const r = await client.query(toPgSql(sql), params);
      return { changes: r.rowCount ?? 0 };
    },
  };
}

export function nowIso(): string {
  return new Date().toISOString();
}
