/** limit_sets: what both store implementations share (row shape, rules parsing, mapping). */
import { z } from 'zod';
import type { LimitRule } from '../../../core/limits/evaluate';
import { LimitRuleSchema, type LimitSet } from '../../../core/schemas';

export interface LimitSetRow {
  id: string;
  site_id: string;
  name: string;
  description: string;
  rules: string;
  created_at: string;
  updated_at: string;
}

const RulesSchema = z.array(LimitRuleSchema);

/** Parses the rules column; a row edited by hand into an invalid shape fails loudly here, not in a verdict. */
export function parseRules(json: string | null): LimitRule[] {
  if (json === null) return [];
  return RulesSchema.parse(JSON.parse(json));
}

export function limitSetFromRow(r: LimitSetRow): LimitSet {
  return {
    id: r.id, siteId: r.site_id, name: r.name, description: r.description, rules: parseRules(r.rules),
    createdAt: r.created_at, updatedAt: r.updated_at,
  };
}
