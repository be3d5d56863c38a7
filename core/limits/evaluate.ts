import { formatSi } from '../units/format';
import { LIMIT_METRIC_INFO, type LimitMetric } from './metrics';

export type VerdictLevel = 'ok' | 'warn' | 'alarm';

/** One rule of a limit set: warn and alarm levels for one metric, with the source of each. */
export interface LimitRule {
  metric: LimitMetric;
  /** Warn at or above this magnitude (SI); null: no warn level. */
  warn: number | null;
  /** Alarm at or above this magnitude (SI); null: no alarm level. */
  alarm: number | null;
  /** Where the numbers come from: standard and clause, 'common practice', 'from memory', or the site's own rule. */
  source: string;
  /**
   * The material classes of spot the rule is meant for (e.g. the 35 V rule of an ESD
   * programme is for isolated conductors only). Absent or empty: every spot.
   */
  appliesTo?: MaterialClass[] | undefined;
}

/** What a spot's object is made of, electrically (see core/schemas/domain MATERIAL_CLASSES). */
export type MaterialClass = 'conductor' | 'insulator' | 'person' | 'unknown';

/** True when the rule is meant for a spot of this material class. Unknown material: every rule applies. */
export function ruleApplies(rule: LimitRule, materialClass: string | null | undefined): boolean {
  if (!rule.appliesTo || rule.appliesTo.length === 0) return true;
  if (!materialClass || materialClass === 'unknown') return true;
  return (rule.appliesTo as readonly string[]).includes(materialClass);
}

export interface MetricCheck {
  metric: LimitMetric;
  level: VerdictLevel;
  /** |value| compared, SI. */
  value: number;
  /** The limit that decided the level (alarm for alarm, warn for warn, the nearest level for ok), or null. */
  limit: number | null;
  /** |value| / alarm level, when an alarm level exists: the severity used for ranking. */
  ratioToAlarm: number | null;
  source: string;
  reason: string;
}

export interface LimitVerdict {
  level: VerdictLevel;
  /** The check that decided the overall level (the worst; ties broken by ratio to alarm). Null when no rule applied. */
  decidedBy: MetricCheck | null;
  checks: MetricCheck[];
  /** One plain sentence. */
  reason: string;
}

const RANK: Record<VerdictLevel, number> = { ok: 0, warn: 1, alarm: 2 };

/**
 * Checks one metric value against one rule. A value at the level counts as reaching
 * it (limits in ESD programmes are written "below X", so X itself is not within).
 * Non-finite values are not judged (the caller gets level 'ok' with a reason saying so
 * never happens: they are filtered by evaluateLimits).
 *
 * @example checkMetric({ metric: 'fieldVPerM', warn: 2500, alarm: 4921, source: 'S20.20' }, -5000)
 *   // level 'alarm', value 5000, limit 4921
 */
export function checkMetric(rule: LimitRule, value: number): MetricCheck {
  const v = Math.abs(value);
  const info = LIMIT_METRIC_INFO[rule.metric];
  const ratioToAlarm = rule.alarm !== null && rule.alarm > 0 ? v / rule.alarm : null;
  if (rule.alarm !== null && v >= rule.alarm) {
    return {
      metric: rule.metric, level: 'alarm', value: v, limit: rule.alarm, ratioToAlarm, source: rule.source,
      reason: `${info.label} ${formatSi(v, info.unit)} is at or above the alarm level ${formatSi(rule.alarm, info.unit)}`,
    };
  }
  if (rule.warn !== null && v >= rule.warn) {
    return {
      metric: rule.metric, level: 'warn', value: v, limit: rule.warn, ratioToAlarm, source: rule.source,
      reason: `${info.label} ${formatSi(v, info.unit)} is at or above the warn level ${formatSi(rule.warn, info.unit)}`
        + (rule.alarm !== null ? ` (alarm at ${formatSi(rule.alarm, info.unit)})` : ''),
    };
  }
  const nearest = rule.warn ?? rule.alarm;
  return {
    metric: rule.metric, level: 'ok', value: v, limit: nearest, ratioToAlarm, source: rule.source,
    reason: nearest !== null
      ? `${info.label} ${formatSi(v, info.unit)} is below the ${rule.warn !== null ? 'warn' : 'alarm'} level ${formatSi(nearest, info.unit)}`
      : `${info.label} ${formatSi(v, info.unit)}: no level set`,
  };
}

/**
 * Evaluates every rule whose metric has a finite value and that is meant for the
 * spot's material class (a spot of unknown material is judged by every rule, the
 * cautious choice). The overall level is the
 * worst; among equal levels the highest ratio to the alarm level decides.
 * Metrics without a value (e.g. charge when no model applies) are skipped, and a
 * set with no applicable rule gives 'ok' with a reason that says nothing was judged.
 */
export function evaluateLimits(
  rules: readonly LimitRule[],
  values: Partial<Record<LimitMetric, number | null | undefined>>,
  opts: { materialClass?: string | null } = {},
): LimitVerdict {
  const checks: MetricCheck[] = [];
  for (const rule of rules) {
    if (!ruleApplies(rule, opts.materialClass)) continue;
    const value = values[rule.metric];
    if (value === null || value === undefined || !Number.isFinite(value)) continue;
    checks.push(checkMetric(rule, value));
  }
  if (checks.length === 0) {
    return { level: 'ok', decidedBy: null, checks, reason: 'No limit in this set applies to this reading' };
  }
  let worst = checks[0]!;
  for (const c of checks.slice(1)) {
    if (RANK[c.level] > RANK[worst.level]
      || (RANK[c.level] === RANK[worst.level] && (c.ratioToAlarm ?? 0) > (worst.ratioToAlarm ?? 0))) {
      worst = c;
    }
  }
  return { level: worst.level, decidedBy: worst, checks, reason: worst.reason };
}

/** The worse of two levels. */
export function worseLevel(a: VerdictLevel, b: VerdictLevel): VerdictLevel {
  return RANK[a] >= RANK[b] ? a : b;
}
