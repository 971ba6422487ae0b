import type { Pool } from 'pg';
import { WATCHED_SERIES, type SeriesKey } from '../series';
import type { DayValue } from '../window';

/**
 * The watched daily series of some vessels over a range of days, from the
 * daily tables (prisma/migrations/0006_daily_metrics.sql). A day without a
 * row, or with a NULL figure, is absent from the series (a gap). Subjects are
 * named as flags name them: 'vessel', 'thruster:ID', 'ref:ID'.
 */

type Queryable = Pick<Pool, 'query'>;

export interface SubjectSeries {
  vesselId: number;
  subject: string;
  key: SeriesKey;
  values: DayValue[];
}

/** Unit ids that fit the flag table's subject check; others cannot be flagged (and are reported by the caller). */
export const UNIT_ID = /^[A-Za-z0-9_-]{1,16}$/;

// Identifiers come from this fixed list only; every value is bound.
const VESSEL_SQL = `
  SELECT vessel_id, day::text AS day, p95_norm, hdg_rms_deg, limit_events_per_dp_day, wind_mean_ms, wind_beam_share
    FROM daily_vessel
   WHERE vessel_id = ANY($1::int[]) AND day BETWEEN $2::date AND $3::date
   ORDER BY vessel_id, day`;
const THRUSTER_SQL = `
  SELECT vessel_id, unit_id, day::text AS day, efficiency_index
    FROM daily_thruster
   WHERE vessel_id = ANY($1::int[]) AND day BETWEEN $2::date AND $3::date
   ORDER BY vessel_id, unit_id, day`;
const REF_SQL = `
  SELECT vessel_id, unit_id, day::text AS day, sd_m_median, rejections
    FROM daily_ref
   WHERE vessel_id = ANY($1::int[]) AND day BETWEEN $2::date AND $3::date
   ORDER BY vessel_id, unit_id, day`;

type Row = Record<string, unknown> & { vessel_id: number; day: string; unit_id?: string };

class SeriesBuilder {
  private readonly series = new Map<string, SubjectSeries>();

  add(vesselId: number, subject: string, key: SeriesKey, day: string, value: unknown): void {
    const id = `${vesselId}|${subject}|${key}`;
    let s = this.series.get(id);
    if (!s) this.series.set(id, (s = { vesselId, subject, key, values: [] }));
    if (value !== null && value !== undefined && Number.isFinite(Number(value))) s.values.push({ day, value: Number(value) });
  }

  result(): SubjectSeries[] {
    return [...this.series.values()];
  }
}

export interface SeriesRead {
  series: SubjectSeries[];
  /** Each vessel's daily mean wind (m/s) by day, for the weather adjustment. */
  wind: Map<number, Map<string, number>>;
  /** Each vessel's daily beam share of the wind (0–1) by day, for the weather adjustment of heading RMS. */
  beam: Map<number, Map<string, number>>;
  /** Units whose id cannot be a flag subject ('thruster:ID' or 'ref:ID' with ID not matching UNIT_ID). */
  skippedUnits: string[];
}

export async function readSeries(db: Queryable, vesselIds: readonly number[], from: string, to: string): Promise<SeriesRead> {
  const params = [vesselIds, from, to];
  const [vessel, thruster, ref] = await Promise.all([
    db.query<Row>(VESSEL_SQL, params),
    db.query<Row>(THRUSTER_SQL, params),
    db.query<Row>(REF_SQL, params),
  ]);
  const b = new SeriesBuilder();
  const skipped = new Set<string>();
  const wind = new Map<number, Map<string, number>>();
  const beam = new Map<number, Map<string, number>>();
  const put = (to: Map<number, Map<string, number>>, r: Row, value: unknown) => {
    if (value === null || value === undefined) return;
    if (!to.has(r.vessel_id)) to.set(r.vessel_id, new Map());
    to.get(r.vessel_id)!.set(r.day, Number(value));
  };
  for (const r of vessel.rows) {
    put(wind, r, r.wind_mean_ms);
    put(beam, r, r.wind_beam_share);
    b.add(r.vessel_id, 'vessel', 'p95_norm', r.day, r.p95_norm);
    b.add(r.vessel_id, 'vessel', 'hdg_rms', r.day, r.hdg_rms_deg);
    b.add(r.vessel_id, 'vessel', 'limit_events_per_dp_day', r.day, r.limit_events_per_dp_day);
  }
  for (const r of thruster.rows) {
    if (!UNIT_ID.test(r.unit_id!)) skipped.add(`thruster:${r.unit_id}`);
    else b.add(r.vessel_id, `thruster:${r.unit_id}`, 'efficiency_index', r.day, r.efficiency_index);
  }
  for (const r of ref.rows) {
    if (!UNIT_ID.test(r.unit_id!)) skipped.add(`ref:${r.unit_id}`);
    else {
      b.add(r.vessel_id, `ref:${r.unit_id}`, 'sd_m_median', r.day, r.sd_m_median);
      b.add(r.vessel_id, `ref:${r.unit_id}`, 'rejections', r.day, r.rejections);
    }
  }
  // Only the series the settings could watch; WATCHED_SERIES names them all.
  return { series: b.result().filter((s) => s.key in WATCHED_SERIES), wind, beam, skippedUnits: [...skipped] };
}
