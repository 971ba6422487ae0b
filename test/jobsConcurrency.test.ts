import { spawn, type ChildProcess } from 'node:child_process';
import { createInterface } from 'node:readline';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { recomputeDays, type VesselDay } from '../lib/jobs/dailyRollup';
import { readFleetFile } from '../lib/register/fleetFile';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { registerFleet, smallFleet, uniqueSuffix } from './helpers/fleet';
import { PROJECT_ROOT } from './helpers/nextServer';

/**
 * Issue 9: the daily computation run from two processes at once never
 * computes the same vessel-day twice at the same time, and leaves exactly
 * the rows one process leaves.
 *
 * Each process runs the job's own code (lib/jobs/dailyRollup.ts) on a pool
 * whose connections note, for each transaction, when its per-vessel advisory
 * lock was asked for and granted, which vessel-days it rewrote (the
 * parameters of its DELETE FROM daily_vessel) and when it sent COMMIT. The
 * SQL is the job's, unchanged; the note is taken on the clock all processes
 * share (CLOCK_MONOTONIC, process.hrtime). A vessel-day is "being computed"
 * from the lock's grant until COMMIT is sent, while the lock is certainly
 * held; two such spans of one vessel-day must never overlap.
 *
 * The processes wait for one "go" so they really start together, and the
 * test checks that one of them did wait for a lock the other held (else it
 * would prove nothing).
 */
const VESSELS = 8;
const DAYS = 25;
const FIRST_DAY = '2026-11-01';

/**
 * The probing job process: runs `dirty` (drain dirty_day as the pg-boss job does, 20 marks a
 * transaction instead of 100 so the two processes take turns several times) or `days`
 * (recomputeDays, as `holdfast jobs run` and the nightly run do).
 */
const PROBE = `
const root = process.env.PROBE_ROOT;
const { createPool } = await import(root + '/lib/db/pool.ts');
const { recomputeDays, recomputeDirtyDays } = await import(root + '/lib/jobs/dailyRollup.ts');
const us = () => Number(process.hrtime.bigint() / 1000n);
const spans = [];
const pool = createPool(process.env.PROBE_URL, 4);
pool.on('connect', (client) => {
  const query = client.query.bind(client);
  let held;
  let days = [];
  client.query = (text, ...rest) => {
    const sql = typeof text === 'string' ? text : text.text;
    if (sql.includes('pg_advisory_xact_lock')) {
      const asked = us();
      return query(text, ...rest).then((r) => { held = { asked, granted: us() }; return r; });
    }
    if (sql.startsWith('DELETE FROM daily_vessel')) days = rest[0][0].map((v, i) => v + '/' + rest[0][1][i]);
    if (sql === 'COMMIT' && held) for (const vd of days) spans.push({ vd, pid: process.pid, ...held, end: us() });
    if (sql === 'COMMIT' || sql === 'ROLLBACK') { held = undefined; days = []; }
    return query(text, ...rest);
  };
});
// Connected before "go", so neither process starts late by a connection's set-up.
const warm = await Promise.all([pool.connect(), pool.connect()]);
for (const c of warm) c.release();
process.stdout.write('ready\\n');
await new Promise((resolve) => process.stdin.once('data', resolve));
const claimed = [];
if (process.env.PROBE_MODE === 'dirty') {
  for (;;) {
    const done = await recomputeDirtyDays(pool, 'UTC', 20);
    if (done.length === 0) break;
    claimed.push(...done.map((d) => d.vesselId + '/' + d.day));
  }
} else await recomputeDays(pool, JSON.parse(process.env.PROBE_DAYS), 'UTC');
await pool.end();
process.stdout.write(JSON.stringify({ spans, claimed }) + '\\n');
`;

interface Span {
  vd: string;
  pid: number;
  asked: number;
  granted: number;
  end: number;
}
interface ProbeResult {
  spans: Span[];
  claimed: string[];
}

/** Start a probing process and resolve once it is ready. */
async function startProbe(env: Record<string, string>): Promise<{ go(): void; result: Promise<ProbeResult> }> {
  const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', PROBE], {
    cwd: PROJECT_ROOT,
    env: { ...process.env, PROBE_ROOT: PROJECT_ROOT, ...env },
    stdio: ['pipe', 'pipe', 'pipe'],
  });
  let stderr = '';
  child.stderr!.on('data', (d: Buffer) => (stderr += d.toString()));
  const lines = createInterface({ input: child.stdout! });
  const ready = new Promise<void>((resolve) => lines.once('line', () => resolve()));
  const result = new Promise<ProbeResult>((resolve, reject) => {
    let last = '';
    lines.on('line', (l) => (last = l));
    child.once('exit', (code) => (code === 0 ? resolve(JSON.parse(last) as ProbeResult) : reject(new Error(`job process exited ${code}: ${stderr}`))));
  });
  await Promise.race([ready, result]);
  return { go: () => child.stdin!.end('go\n'), result };
}

/** Two spans of the same vessel-day from different processes that overlap in time. */
function overlaps(spans: Span[]): string[] {
  const byDay = new Map<string, Span[]>();
  for (const s of spans) byDay.set(s.vd, [...(byDay.get(s.vd) ?? []), s]);
  const found: string[] = [];
  for (const [vd, list] of byDay) {
    const sorted = [...list].sort((a, b) => a.granted - b.granted);
    for (let i = 1; i < sorted.length; i++) if (sorted[i]!.granted < sorted[i - 1]!.end) found.push(vd);
  }
  return found;
}

/** A process asked for a vessel's lock while the other process held it: the two runs did contend. */
function contended(spans: Span[]): boolean {
  const vessel = (s: Span) => s.vd.split('/')[0];
  // b asked before a was done with the vessel, and got it after a: it waited while a held it.
  return spans.some((a) => spans.some((b) => b.pid !== a.pid && vessel(b) === vessel(a) && b.asked < a.end && b.granted > a.granted));
}

describe('daily job from two processes at once', () => {
  const s = uniqueSuffix();
  let db: TestDatabase;
  let vesselDays: VesselDay[];
  let single: unknown[];

  /** Every daily row of every table, without the computed_at stamps. */
  const snapshot = async () => {
    const out: unknown[] = [];
    for (const table of ['daily_vessel', 'daily_thruster', 'daily_bus', 'daily_ref']) {
      const { rows } = await db.pool.query(`SELECT * FROM ${table} ORDER BY 1, 2, 3`);
      out.push(table, rows.map(({ computed_at: _, ...r }) => r));
    }
    return out;
  };

  beforeAll(async () => {
    db = await createMigratedDatabase();
    const keys = Array.from({ length: VESSELS }, (_, i) => `conc-${s}-${i}`);
    const vessels = keys.map((k) => smallFleet(k).vessels[0]!);
    await registerFleet(db.url, readFleetFile(JSON.stringify({ v: 1, vessels })));
    const { rows } = await db.pool.query<{ id: number }>('SELECT id FROM vessel ORDER BY id');
    // Six hours of 1-minute station records a day, with varied positions, weather and modes.
    await db.pool.query(
      `INSERT INTO ts_station (vessel_id, t, dt, mode, dp_s, n, err_r_mean, err_r_rms, err_r_max, err_hist, wind_ms, current_ms)
       SELECT v, t, 60, CASE WHEN random() < 0.9 THEN 'auto_position' ELSE 'joystick' END, 60, 60,
              r, r * 1.1, r * 2, ARRAY[(random() * 20)::int, (random() * 30)::int, (random() * 10)::int], 4 + random() * 10, random()
         FROM unnest($1::int[]) v,
              generate_series($2::date, $2::date + ($3 - 1), interval '1 day') d,
              generate_series(d + interval '6 hours', d + interval '12 hours' - interval '1 minute', interval '1 minute') t,
              LATERAL (SELECT random() * 3 + 0.2 AS r) x`,
      [rows.map((r) => r.id), FIRST_DAY, DAYS],
    );
    const { rows: days } = await db.pool.query<{ day: string }>(
      `SELECT d::date::text AS day FROM generate_series($1::date, $1::date + ($2 - 1), interval '1 day') d`,
      [FIRST_DAY, DAYS],
    );
    vesselDays = rows.flatMap((r) => days.map((d) => ({ vesselId: r.id, day: d.day })));
    // The reference: one process, alone.
    await recomputeDays(db.pool, vesselDays, 'UTC');
    single = await snapshot();
    expect((single[1] as unknown[]).length).toBe(VESSELS * DAYS);
  }, 120_000);
  afterAll(async () => db?.drop());

  const runTwo = async (env: Record<string, string>) => {
    const probes = [await startProbe({ PROBE_URL: db.url, ...env }), await startProbe({ PROBE_URL: db.url, ...env })];
    for (const p of probes) p.go();
    return Promise.all(probes.map((p) => p.result));
  };

  it(
    'two processes draining the same dirty vessel-days claim each once, never compute one at once, and give the single-process rows',
    async () => {
      await db.pool.query(`DELETE FROM daily_vessel; DELETE FROM daily_thruster; DELETE FROM daily_bus; DELETE FROM daily_ref`);
      await db.pool.query(`INSERT INTO dirty_day (vessel_id, day) SELECT (x->>'vesselId')::int, (x->>'day')::date FROM jsonb_array_elements($1::jsonb) x`, [
        JSON.stringify(vesselDays),
      ]);
      const [a, b] = await runTwo({ PROBE_MODE: 'dirty' });
      const claimed = [...a!.claimed, ...b!.claimed];
      expect(new Set(claimed).size, 'no vessel-day claimed twice').toBe(claimed.length);
      expect(claimed.length).toBe(VESSELS * DAYS);
      expect(a!.claimed.length, 'both processes took work').toBeGreaterThan(0);
      expect(b!.claimed.length, 'both processes took work').toBeGreaterThan(0);
      expect(overlaps([...a!.spans, ...b!.spans])).toEqual([]);
      expect((await db.pool.query('SELECT count(*)::int AS n FROM dirty_day')).rows[0].n).toBe(0);
      expect(await snapshot()).toEqual(single);
    },
    90_000,
  );

  it(
    'two processes recomputing the same vessel-days at once (two `jobs run`s) wait for each other per vessel and give the single-process rows',
    async () => {
      const [a, b] = await runTwo({ PROBE_MODE: 'days', PROBE_DAYS: JSON.stringify(vesselDays) });
      const spans = [...a!.spans, ...b!.spans];
      // Each process computed every vessel-day once.
      expect(spans.length).toBe(2 * VESSELS * DAYS);
      expect(contended(spans), 'one process waited for a lock the other held').toBe(true);
      expect(overlaps(spans)).toEqual([]);
      expect(await snapshot()).toEqual(single);
    },
    90_000,
  );
});
