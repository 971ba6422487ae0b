import type { Queryable } from '../api/context';
import { mergeHistograms, type RadialHistogram } from '../metrics/radialHistogram';

/**
 * H over a range of days: the element-wise sum of the stored daily err_hist
 * (each already the merge of that day's DP intervals, metrics-v1), so a
 * range's percentiles and "inside" shares are read from all its samples
 * rather than averaged from daily figures. At most 366 rows of 101 counts;
 * merged in JavaScript with lib/metrics (exact in float64 up to 2^53).
 */
const SQL = `
  SELECT d.err_hist::float8[] AS err_hist
    FROM daily_vessel d JOIN vessel v ON v.id = d.vessel_id
   WHERE v.key = $1 AND d.day BETWEEN $2::date AND $3::date AND d.err_hist IS NOT NULL`;

export async function getRangeHistogram(db: Queryable, key: string, range: { from: string; to: string }): Promise<RadialHistogram> {
  const { rows } = await db.query<{ err_hist: number[] }>(SQL, [key, range.from, range.to]);
  return mergeHistograms(rows.map((r) => r.err_hist));
}
