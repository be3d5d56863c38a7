/**
 * npm run bench: the issue-4 benchmarks on a temporary SQLite database with 500
 * spots and 1,000,000 readings over a year (bench/data.ts), never part of npm test.
 *
 * Each figure is measured side by side with its baseline, the bare SQL that fetches
 * the same rows, alternating runs, median of RUNS each (after one warm-up):
 * - review.week: the weekly review assembly (server/review/weekly.ts, through the
 *   Store, with verdicts, estimates and statistics) for one week, with the kept
 *   aggregates of the weeks before already filled, against the bare query of that
 *   week's readings (SITE_WEEK_SQL);
 * - review.week.cold: the same review with no kept aggregates (the first review of
 *   a week after a restart of the data), against the bare queries of all 14 weeks
 *   it reads;
 * - trend.year: one spot's one-year trend (server/review/trend.ts) against the bare
 *   query of its rows (SPOT_RANGE_SQL).
 * Target: each under 3x its baseline. Prints a table and merges the figures into
 * bench/results.json.
 *
 * Options: --keep (keep the database and print its path), --db <file> (reuse a
 * database built by an earlier --keep run), --runs <n>.
 */
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { cpus, release, tmpdir, totalmem } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { median } from '../core/stats';
import { previousWeek, weeksBack, weekStart } from '../core/time';
import { spotTrend } from '../server/review/trend';
import { USUAL_WEEKS, weeklyReview } from '../server/review/weekly';
import { openSqliteStore } from '../server/store/sqlite';
import { SITE_WEEK_SQL, SPOT_RANGE_SQL } from '../server/store/sqlite/repos/review';
import { buildBenchData } from './data';

const args = process.argv.slice(2);
const opt = (name: string) => {
  const i = args.indexOf(name);
  return i >= 0 ? args[i + 1] : undefined;
};
const RUNS = Math.max(5, Number(opt('--runs') ?? 7));
const keep = args.includes('--keep');
const reuse = opt('--db');

const here = dirname(fileURLToPath(import.meta.url));
const resultsPath = join(here, 'results.json');
const DAY = 86_400_000;

interface Figure { value: number; unit: 'ms'; baseline: number; ratio: number }

async function time<T>(f: () => T | Promise<T>): Promise<number> {
  const t0 = performance.now();
  await f();
  return performance.now() - t0;
}

/** Alternates the two, RUNS times each after a warm-up, and answers the medians. */
async function sideBySide(measured: () => unknown, baseline: () => unknown): Promise<{ value: number; baseline: number }> {
  await measured();
  await baseline();
  const a: number[] = [];
  const b: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    b.push(await time(baseline));
    a.push(await time(measured));
  }
  return { value: median(a), baseline: median(b) };
}

const r2 = (x: number) => Math.round(x * 100) / 100;
const figure = (m: { value: number; baseline: number }): Figure => ({ value: r2(m.value), unit: 'ms', baseline: r2(m.baseline), ratio: r2(m.value / m.baseline) });

async function main(): Promise<void> {
  const dir = reuse ? null : mkdtempSync(join(tmpdir(), 'chargewalk-bench-'));
  const path = reuse ?? join(dir!, 'bench.db');
  const store = openSqliteStore({ path });
  try {
    let siteId: string;
    let spotIds: string[];
    let nowMs: number;
    if (reuse && !(await store.isEmpty())) {
      siteId = (store.db.prepare('SELECT id FROM sites LIMIT 1').get() as { id: string }).id;
      spotIds = (store.db.prepare('SELECT id FROM spots WHERE site_id = ? ORDER BY rowid').all(siteId) as { id: string }[]).map((r) => r.id);
      nowMs = Date.parse((store.db.prepare('SELECT MAX(taken_at) AS t FROM readings').get() as { t: string }).t) + 3_600_000;
      console.log(`bench: reusing ${path}`);
    } else {
      console.log('bench: building 500 spots and 1,000,000 readings over a year ...');
      const data = await buildBenchData(store, { log: (m) => { if (/000500 readings|set-up/.test(m)) console.log(m); } });
      console.log(`bench: built ${data.readings} readings (${data.corrections} corrections, ${data.tombstones} deletions) in ${data.buildSeconds.toFixed(1)} s`);
      siteId = data.siteId;
      spotIds = data.spotIds;
      nowMs = data.lastMs;
    }
    const site = (await store.getSite(siteId))!;
    const db = store.db;

    // ---------- review.week ----------
    const week = previousWeek(previousWeek(weekStart(nowMs, site.timeZone)));
    const iso = (ms: number) => new Date(ms).toISOString();
    const weekSql = db.prepare(SITE_WEEK_SQL);
    const bareWeek = () => weekSql.all(iso(week.startMs), iso(week.endMs), siteId);
    const history = weeksBack(previousWeek(week), USUAL_WEEKS);
    db.exec('DELETE FROM review_week_cache');
    const cold = await time(() => weeklyReview(store, siteId, week.isoWeek, nowMs));
    const bareAll = () => { bareWeek(); for (const w of history) weekSql.all(iso(w.startMs), iso(w.endMs), siteId); };
    const coldBaseline = median(await Promise.all([0, 1, 2].map(() => time(bareAll))));
    const review = await sideBySide(() => weeklyReview(store, siteId, week.isoWeek, nowMs), bareWeek);
    const sample = await weeklyReview(store, siteId, week.isoWeek, nowMs);
    const weekRows = bareWeek().length;

    // ---------- trend.year ----------
    const spotId = spotIds[0]!; // C-01-00, the unwind roll: line model, so every point has a charge estimate
    const rangeSql = db.prepare(SPOT_RANGE_SQL);
    const bareTrend = () => rangeSql.all(spotId, iso(nowMs - 365 * DAY), iso(nowMs + 3_600_000));
    const trend = await sideBySide(() => spotTrend(store, spotId, '1y', nowMs), bareTrend);
    const t = await spotTrend(store, spotId, '1y', nowMs);

    const figures: Record<string, Figure> = {
      'review.week': figure(review),
      'review.week.cold': figure({ value: cold, baseline: coldBaseline }),
      'trend.year': figure(trend),
    };
    const rows = [
      ['figure', 'value (ms)', 'baseline (ms)', 'ratio', 'target', 'what'],
      ['review.week', figures['review.week']!.value, figures['review.week']!.baseline, figures['review.week']!.ratio, '< 3',
        `${week.isoWeek}: ${weekRows} readings, ${sample!.spots.length} spots ranked; aggregates of the ${USUAL_WEEKS} weeks before kept`],
      ['review.week.cold', figures['review.week.cold']!.value, figures['review.week.cold']!.baseline, figures['review.week.cold']!.ratio, '',
        `first review with no kept aggregates (1 run) vs bare SQL of all ${USUAL_WEEKS + 1} weeks it reads`],
      ['trend.year', figures['trend.year']!.value, figures['trend.year']!.baseline, figures['trend.year']!.ratio, '< 3',
        `${t!.counts.readings} readings, ${t!.counts.days} days, ${t!.counts.withCharge} charge estimates`],
    ].map((r) => r.map(String));
    const widths = rows[0]!.map((_, i) => Math.max(...rows.map((r) => r[i]!.length)));
    for (const r of rows) console.log(r.map((c, i) => c.padEnd(widths[i]!)).join('  '));

    const cpu = cpus();
    let existing: { figures?: Record<string, unknown> } = {};
    if (existsSync(resultsPath)) {
      try {
        existing = JSON.parse(readFileSync(resultsPath, 'utf8')) as typeof existing;
      } catch {
        existing = {};
      }
    }
    const results = {
      machine: {
        cpus: cpu.length, model: cpu[0]?.model ?? 'unknown', memGiB: Math.round((totalmem() / 2 ** 30) * 10) / 10,
        node: process.version, platform: `${process.platform} ${release()}`,
      },
      date: new Date().toISOString(),
      figures: { ...(existing.figures ?? {}), ...figures },
    };
    writeFileSync(resultsPath, `${JSON.stringify(results, null, 2)}\n`);
    console.log(`bench: wrote ${resultsPath}`);
    const failed = (['review.week', 'trend.year'] as const).filter((k) => figures[k]!.ratio >= 3);
    if (failed.length) console.log(`bench: above the 3x target: ${failed.join(', ')}`);
  } finally {
    await store.close();
    if (keep || reuse) console.log(`bench: database kept at ${path}`);
    else if (dir) rmSync(dir, { recursive: true, force: true });
  }
}

await main();
