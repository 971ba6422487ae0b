import type { Queryable } from '../api/context';

/**
 * North/east offsets of raw track positions for the footprint scatter.
 *
 * Which positions: the 24 hours before the latest track record that falls
 * on or before `lastDay` (the end of the page's range, a fleet day in
 * `timeZone`), because track is optional and kept only 90 days — the latest
 * stretch there is says most. How many: the first position of every
 * SAMPLE_STEP_S seconds (at most 1,921), each found by one index probe on
 * (vessel_id, t) instead of reading all 86,400 rows of a day. Positions
 * without a set point (no offsets) are skipped.
 */
export const TRACK_WINDOW_H = 24;
export const SAMPLE_STEP_S = 45;

const LATEST_SQL = `
  SELECT v.id, max(x.t) AS latest
    FROM vessel v
    LEFT JOIN ts_track x ON x.vessel_id = v.id AND x.north_m IS NOT NULL
                        AND x.t < (($2::date + 1)::timestamp AT TIME ZONE $3)
   WHERE v.key = $1
   GROUP BY v.id`;

const SAMPLE_SQL = `
  SELECT p.north_m, p.east_m
    FROM generate_series($2::timestamptz - make_interval(hours => $3), $2::timestamptz, make_interval(secs => $4)) AS g(t0)
    CROSS JOIN LATERAL (
      SELECT x.north_m, x.east_m FROM ts_track x
       WHERE x.vessel_id = $1 AND x.t >= g.t0 AND x.t < g.t0 + make_interval(secs => $4)
         AND x.north_m IS NOT NULL
       ORDER BY x.t LIMIT 1) p`;

export interface TrackSample {
  from: Date;
  to: Date;
  points: { east: number; north: number }[];
}

/** null when the vessel has no track position with offsets up to the end of `lastDay`. */
export async function getTrackSample(db: Queryable, key: string, lastDay: string, timeZone: string): Promise<TrackSample | null> {
  const { rows } = await db.query<{ id: number; latest: Date | null }>(LATEST_SQL, [key, lastDay, timeZone]);
  const found = rows[0];
  if (!found?.latest) return null;
  const { rows: points } = await db.query<{ north_m: number; east_m: number }>(SAMPLE_SQL, [
    found.id,
    found.latest,
    TRACK_WINDOW_H,
    SAMPLE_STEP_S,
  ]);
  return {
    from: new Date(found.latest.getTime() - TRACK_WINDOW_H * 3_600_000),
    to: found.latest,
    points: points.map((p) => ({ east: p.east_m, north: p.north_m })),
  };
}
