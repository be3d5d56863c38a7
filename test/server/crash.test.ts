// Crash safety (issue 5): the server runs as a child process on a temporary
// database; three concurrent clients post batches of readings with client-made
// UUIDv7 ids, like the tablet's outbox (a batch without an answer is resent after
// a restart); the server is killed with SIGKILL at seeded random moments and
// restarted, 20 times. Every acknowledged reading must be present exactly once,
// with the value sent, and the database must pass integrity_check.
import Database from 'better-sqlite3';
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, expect, it } from 'vitest';
import { newId } from '../../core/ids/uuidv7';
import { mulberry32 } from '../../server/demo/prng';
import { createRound, createSetup, type SetupIds } from '../helpers/api';

const ROUNDS = 20;
const CLIENTS = 3;
const dir = mkdtempSync(join(tmpdir(), 'chargewalk-crash-'));
const dbPath = join(dir, 'chargewalk.db');
afterAll(() => rmSync(dir, { recursive: true, force: true }));

interface Server { child: ChildProcess; baseUrl: string; exited: Promise<number | null> }

function startServer(): Promise<Server> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    env: { ...process.env, CHARGEWALK_DB: dbPath, PORT: '0', HOST: '127.0.0.1', CHARGEWALK_DEMO: '0', CHARGEWALK_CLIENT_DIR: join(dir, 'no-client') },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
  return new Promise((resolve, reject) => {
    let out = '';
    let err = '';
    child.stdout!.on('data', (d: Buffer) => {
      out += d.toString();
      const m = /chargewalk serving http:\/\/localhost:(\d+)/.exec(out);
      if (m) resolve({ child, baseUrl: `http://127.0.0.1:${m[1]}`, exited });
    });
    child.stderr!.on('data', (d: Buffer) => { err += d.toString(); });
    void exited.then((code) => reject(new Error(`server exited (${code}) before it was ready: ${err}`)));
  });
}

interface Sent { id: string; note: string; value: number }

it(`keeps every acknowledged reading exactly once across ${ROUNDS} SIGKILLs`, async () => {
  const t0 = Date.now();
  const rng = mulberry32(5);
  let srv = await startServer();
  const ids: SetupIds = await createSetup(srv.baseUrl);
  const roundId = await createRound(srv.baseUrl, ids.siteId);

  const acked = new Map<string, Sent>();
  const pending: Sent[][][] = Array.from({ length: CLIENTS }, () => []);
  const seq = Array.from({ length: CLIENTS }, () => 0);
  let conflicts = 0;
  let resent = 0;
  let duplicatesAcked = 0;
  const clientRng = Array.from({ length: CLIENTS }, (_, c) => mulberry32(100 + c));

  const body = (batch: Sent[]) => JSON.stringify({
    readings: batch.map((s, i) => ({
      id: s.id, roundId, spotId: ids.spotIds[i % 3], meterId: ids.meterId, takenAt: '2026-03-02T08:00:00Z',
      value: s.value, unit: 'V/m', polarity: '+', distance: { value: 1, unit: 'inch' }, zeroed: true, note: s.note,
    })),
  });

  /** One client: send (resend first) until the server stops answering. */
  async function client(c: number, baseUrl: string, alive: () => boolean): Promise<void> {
    while (alive()) {
      let batch = pending[c]!.shift();
      if (batch) resent++;
      else {
        const n = 1 + Math.floor(clientRng[c]!.next() * 40);
        batch = Array.from({ length: n }, () => {
          const k = seq[c]!++;
          return { id: newId(), note: `c${c}-${k}`, value: k + c / 10 };
        });
      }
      try {
        const res = await fetch(`${baseUrl}/api/readings`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: body(batch) });
        const answer = await res.json() as { acks: { id: string; status: string }[] };
        if (res.status !== 200) throw new Error(`unexpected ${res.status}: ${JSON.stringify(answer)}`);
        answer.acks.forEach((a, i) => {
          if (a.status === 'conflict') conflicts++;
          if (a.status === 'duplicate') duplicatesAcked++;
          acked.set(a.id, batch[i]!);
        });
      } catch (e) {
        if (e instanceof Error && e.message.startsWith('unexpected')) throw e;
        pending[c]!.unshift(batch); // no answer: the outbox keeps it and resends
        return;
      }
    }
  }

  for (let round = 0; round < ROUNDS; round++) {
    if (round > 0) srv = await startServer();
    let alive = true;
    const running = Array.from({ length: CLIENTS }, (_, c) => client(c, srv.baseUrl, () => alive));
    await new Promise((r) => setTimeout(r, 80 + rng.next() * 420));
    srv.child.kill('SIGKILL');
    alive = false;
    await srv.exited;
    await Promise.all(running);
    const db = new Database(dbPath);
    expect(db.pragma('integrity_check', { simple: true })).toBe('ok');
    db.close();
  }

  // Last start: the outboxes empty themselves, then a clean shutdown.
  srv = await startServer();
  for (let c = 0; c < CLIENTS; c++) {
    while (pending[c]!.length) await client(c, srv.baseUrl, () => pending[c]!.length > 0);
  }
  srv.child.kill('SIGTERM');
  expect(await srv.exited).toBe(0);

  const db = new Database(dbPath, { readonly: true });
  expect(db.pragma('integrity_check', { simple: true })).toBe('ok');
  const rows = db.prepare('SELECT id, note, value FROM readings').all() as Sent[];
  db.close();
  const byId = new Map(rows.map((r) => [r.id, r]));
  const lost = [...acked.values()].filter((s) => byId.get(s.id)?.value !== s.value || byId.get(s.id)?.note !== s.note);
  const notes = new Map<string, number>();
  for (const r of rows) notes.set(r.note, (notes.get(r.note) ?? 0) + 1);
  const duplicated = [...notes.values()].filter((n) => n > 1).length;
  const seconds = (Date.now() - t0) / 1000;
  console.log(`crash test: ${ROUNDS} SIGKILL rounds, ${CLIENTS} clients, ${acked.size} readings acknowledged, `
    + `${rows.length} stored, lost ${lost.length}, duplicated ${duplicated}, `
    + `${resent} batches resent after a kill (${duplicatesAcked} readings acknowledged as duplicate), conflicts ${conflicts}, ${seconds.toFixed(1)} s`);

  expect(lost).toEqual([]);
  expect(duplicated).toBe(0);
  expect(conflicts).toBe(0);
  expect(rows.length).toBe(acked.size); // every reading ever sent was finally acknowledged, and nothing else is stored
  expect(acked.size).toBeGreaterThan(ROUNDS * 20);
  expect(seconds).toBeLessThan(90);
}, 150_000);
