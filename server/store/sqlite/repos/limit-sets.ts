/** limit_sets: warn and alarm levels per metric, each with its source; rules kept as JSON checked by zod. */
import { newId } from '../../../../core/ids/uuidv7';
import type { LimitSet, LimitSetInput } from '../../../../core/schemas';
import { conflict, invalid, notFound } from '../../errors';
import { stmt, type Db } from '../db';
import { limitSetFromRow, parseRules, type LimitSetRow } from '../../shared/limit-sets';
export { parseRules };
import { requireSite } from './sites';

export function getLimitSet(db: Db, id: string): LimitSet | null {
  const r = stmt(db, 'SELECT * FROM limit_sets WHERE id = ?').get(id) as LimitSetRow | undefined;
  return r ? limitSetFromRow(r) : null;
}

export function listLimitSets(db: Db, siteId: string): LimitSet[] {
  return (stmt(db, 'SELECT * FROM limit_sets WHERE site_id = ? ORDER BY name, id').all(siteId) as LimitSetRow[]).map(limitSetFromRow);
}

export function limitSetSite(db: Db, id: string): string | null {
  const r = stmt(db, 'SELECT site_id FROM limit_sets WHERE id = ?').get(id) as { site_id: string } | undefined;
  return r?.site_id ?? null;
}

export function insertLimitSet(db: Db, input: LimitSetInput, now: string): LimitSet {
  requireSite(db, input.siteId);
  const id = input.id ?? newId();
  if (input.id && getLimitSet(db, id)) throw conflict(`a limit set with id ${id} already exists`, ['id']);
  stmt(db, `INSERT INTO limit_sets (id, site_id, name, description, rules, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?, ?)`)
    .run(id, input.siteId, input.name, input.description, JSON.stringify(input.rules), now, now);
  return getLimitSet(db, id)!;
}

export function updateLimitSet(db: Db, id: string, input: LimitSetInput, now: string): LimitSet {
  if (input.id !== undefined && input.id !== id) throw invalid('the id in the body differs from the id in the path', ['id']);
  const site = limitSetSite(db, id);
  if (site === null) throw notFound(`no limit set with id ${id}`, ['id']);
  if (site !== input.siteId) throw invalid('a limit set cannot move to another site', ['siteId']);
  stmt(db, 'UPDATE limit_sets SET name = ?, description = ?, rules = ?, updated_at = ? WHERE id = ?')
    .run(input.name, input.description, JSON.stringify(input.rules), now, id);
  return getLimitSet(db, id)!;
}
