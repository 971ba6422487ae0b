import type { Pool } from '../lib/db/pool';
import { vesselDays, type VesselDays, type VesselProfile } from '../test/e2e/fixtures/dailyFigures';
import { writeDaily } from '../test/e2e/fixtures/writeDaily';

/**
 * The large fleet bench:web measures on: `vessels` vessels (bench-0000 …)
 * with 6 thrusters, 2 switchboards and 3 reference systems each, daily rows
 * for every day from `from` to `to` (about 3 % of days missing, as gaps),
 * one live station record per vessel and 150 open trend flags.
 * Returns the number of daily rows written.
 */

const THRUSTERS = ['T1', 'T2', 'T3', 'T4', 'T5', 'T6'];
const BUSES = ['A', 'B'];
const REFS = [
  { id: 'GNSS1', kind: 'gnss' },
  { id: 'GNSS2', kind: 'gnss' },
  { id: 'HPR1', kind: 'hydroacoustic' },
];
const TYPES = ['construction', 'drilling', 'supply', 'shuttle tanker'];

export async function loadWebBenchFleet(
  pool: Pool,
  options: { vessels: number; from: string; to: string; onProgress?: (vessels: number, rows: number) => void },
): Promise<number> {
  const ids: number[] = [];
  for (let v = 0; v < options.vessels; v++) {
    const { rows } = await pool.query<{ id: number }>(
      `INSERT INTO vessel (key, name, type, dp_class, watch_circles_m, heading_limits_deg)
       VALUES ($1, $2, $3, $4, '{3,5}', '{3,5}') RETURNING id`,
      [`bench-${String(v).padStart(4, '0')}`, `Bench ${v}`, TYPES[v % TYPES.length], 1 + (v % 3)],
    );
    const id = rows[0]!.id;
    ids.push(id);
    await pool.query(
      `INSERT INTO thruster (vessel_id, unit_id, kind, rated_kw, service_interval_h, wear_h_at_install)
       SELECT $1, u, 'azimuth', 2000, 25000, 1000 * (($1::int + ordinality::int) % 20) FROM unnest($2::text[]) WITH ORDINALITY AS x(u, ordinality)`,
      [id, THRUSTERS],
    );
    await pool.query(`INSERT INTO bus (vessel_id, unit_id, rated_kw) SELECT $1, u, 6000 FROM unnest($2::text[]) u`, [id, BUSES]);
    await pool.query(`INSERT INTO ref_system (vessel_id, unit_id, kind) SELECT $1, r.id, r.kind FROM json_to_recordset($2) AS r(id text, kind text)`, [
      id,
      JSON.stringify(REFS),
    ]);
    await pool.query(`INSERT INTO ts_station (vessel_id, t, dt, mode, dp_s, n) VALUES ($1, now() - interval '1 minute', 60, 'auto_position', 60, 60)`, [id]);
  }
  let rows = 0;
  // Several vessels per write: fewer, larger statements.
  let pending: VesselDays = { vessel: [], thruster: [], ref: [], bus: [] };
  const flush = async () => {
    await writeDaily(pool, pending);
    pending = { vessel: [], thruster: [], ref: [], bus: [] };
  };
  for (const [v, id] of ids.entries()) {
    const profile: VesselProfile = {
      key: `bench-${v}`,
      watchCirclesM: [3, 5],
      thrusters: THRUSTERS.map((t) => ({ id: t, kind: 'azimuth' })),
      buses: BUSES,
      refs: REFS,
      sigmaM: 0.4 + 0.002 * (v % 300),
      limitEventsPerDay: v % 17 === 0 ? 6 : 0.5,
      gapShare: 0.03,
    };
    const days = vesselDays(id, profile, options.from, options.to);
    for (const k of ['vessel', 'thruster', 'ref', 'bus'] as const) (pending[k] as object[]).push(...days[k]);
    rows += days.vessel.length + days.thruster.length + days.ref.length + days.bus.length;
    if ((v + 1) % 5 === 0) await flush();
    if ((v + 1) % 25 === 0) options.onProgress?.(v + 1, rows);
  }
  await flush();
  for (let i = 0; i < 150; i++) {
    await pool.query(
      `INSERT INTO flag (vessel_id, subject, metric, method, severity, opened_day, window_from, window_to, statistic, statistic_name,
                         explanation, last_evaluated_day)
       VALUES ($1, 'vessel', 'p95_norm', 'ewma', $2, $3::date, $3::date - 29, $3::date, 1.5, 'ewma', 'bench flag', $3::date)`,
      [ids[(i * 7) % ids.length], ['advisory', 'warning', 'alarm'][i % 3], options.to],
    );
  }
  return rows;
}
