/** limit_sets: warn and alarm levels per metric, each with its source; rules kept as JSON checked by zod. */
import { newId } from '../../../../core/ids/uuidv7';
import type { LimitSet, LimitSetInput } from '../../../../core/schemas';
import { conflict, invalid, notFound } from '../../errors';
import type { Db } from '../db';
import { limitSetFromRow, parseRules, type LimitSetRow } from '../../shared/limit-sets';
export { parseRules };
import { requireSite } from './sites';

export async function getLimitSet(db: Db, id: string): Promise<LimitSet | null> {
  const r = (await db.get('SELECT * FROM limit_sets WHERE id = ?', id)) as LimitSetRow | undefined;
  return r ? limitSetFromRow(r) : null;
}

export async function listLimitSets(db: Db, siteId: string): Promise<LimitSet[]> {
  return ((await db.all('SELECT * FROM limit_sets WHERE site_id = ? ORDER BY name, id', siteId)) as LimitSetRow[]).map(limitSetFromRow);
}

export async function limitSetSite(db: Db, id: string): Promise<string | null> {
  const r = (await db.get('SELECT site_id FROM limit_sets WHERE id = ?', id)) as { site_id: string } | undefined;
  return r?.site_id ?? null;
}

export async function insertLimitSet(db: Db, input: LimitSetInput, now: string): Promise<LimitSet> {
  (await requireSite(db, input.siteId));
  const id = input.id ?? newId();
  if (input.id && (await getLimitSet(db, id))) throw conflict(`a limit set with id ${id} already exists`, ['id']);
  (await db.run(`INSERT INTO limit_sets (id, site_id, name, description, rules, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?, ?)`, id, input.siteId, input.name, input.description, JSON.stringify(input.rules), now, now));
  return (await getLimitSet(db, id))!;
}

export async function updateLimitSet(db: Db, id: string, input: LimitSetInput, now: string): Promise<LimitSet> {
  if (input.id !== undefined && input.id !== id) throw invalid('the id in the body differs from the id in the path', ['id']);
  const site = (await limitSetSite(db, id));
  if (site === null) throw notFound(`no limit set with id ${id}`, ['id']);
  if (site !== input.siteId) throw invalid('a limit set cannot move to another site', ['siteId']);
  (await db.run('UPDATE limit_sets SET name = ?, description = ?, rules = ?, updated_at = ? WHERE id = ?', input.name, input.description, JSON.stringify(input.rules), now, id));
  return (await getLimitSet(db, id))!;
}
