import type { Queryable } from '../api/context';
import type { FlagSeriesRow } from '../charts/flagChart';
import { parseSubject } from '../web/flagMetrics';

/**
 * The daily series a flag watched, for its chart: one statement per flag,
 * reading the daily table of the flag's subject. Table and column come from
 * the fixed map below (never from the flag's text); a metric not in the map
 * has no series (null) and its card shows the explanation alone.
 */
const SOURCES: Record<string, { vessel?: string; thruster?: string; ref?: string }> = {
  p95_norm: { vessel: 'SELECT day, p95_norm AS value FROM daily_vessel WHERE vessel_id = $1' },
  hdg_rms: { vessel: 'SELECT day, hdg_rms_deg AS value FROM daily_vessel WHERE vessel_id = $1' },
  limit_events_per_dp_day: { vessel: 'SELECT day, limit_events_per_dp_day AS value FROM daily_vessel WHERE vessel_id = $1' },
  efficiency_index: { thruster: 'SELECT day, efficiency_index AS value FROM daily_thruster WHERE vessel_id = $1 AND unit_id = $4' },
  sd_m_median: { ref: 'SELECT day, sd_m_median AS value FROM daily_ref WHERE vessel_id = $1 AND unit_id = $4' },
  rejections: { ref: 'SELECT day, rejections::float8 AS value FROM daily_ref WHERE vessel_id = $1 AND unit_id = $4' },
};

export function hasSeries(metric: string, subject: string): boolean {
  return Boolean(Object.hasOwn(SOURCES, metric) && SOURCES[metric]![parseSubject(subject).kind]);
}

export async function getFlagSeries(
  db: Queryable,
  flag: { vessel: string; subject: string; metric: string },
  range: { from: string; to: string },
): Promise<FlagSeriesRow[] | null> {
  if (!hasSeries(flag.metric, flag.subject)) return null;
  const subject = parseSubject(flag.subject);
  const base = SOURCES[flag.metric]![subject.kind]!;
  const sql = `SELECT to_char(s.day, 'YYYY-MM-DD') AS day, s.value FROM (${base}) s
                WHERE s.day BETWEEN $2::date AND $3::date ORDER BY s.day`;
  const { rows: ids } = await db.query<{ id: number }>('SELECT id FROM vessel WHERE key = $1', [flag.vessel]);
  if (!ids[0]) return null;
  const params: unknown[] = [ids[0].id, range.from, range.to];
  if (subject.unit !== null) params.push(subject.unit);
  const { rows } = await db.query<FlagSeriesRow>(sql, params);
  return rows;
}
