import type { RefsRecord } from '../telemetry/schemas';

/**
 * Reference system figures, per system and day.
 * Source: docs spec metrics-v1 "Reference systems": online_hours =
 * Σ online_s / 3600; weight_mean = mean of weight weighted by online_s;
 * sd_m_median = median of sd_m over intervals with online_s > 0;
 * rejections = Σ rejected.
 *
 * Choices the spec leaves open: fields are optional in the contract. A sum
 * is null when no interval of the system sent the field; weight_mean is null
 * when Σ online_s (over intervals that sent a weight) is 0; the median of an
 * even count is the mean of the two middle values; an interval that sent no
 * online_s is not "online_s > 0" and is left out of the median.
 */
export interface RefFigures {
  online_hours: number | null;
  weight_mean: number | null;
  sd_m_median: number | null;
  rejections: number | null;
}

export function median(values: readonly number[]): number | null {
  if (values.length === 0) return null;
  const s = Float64Array.from(values).sort();
  const mid = s.length >> 1;
  return s.length % 2 === 1 ? s[mid]! : (s[mid - 1]! + s[mid]!) / 2;
}

export function refFigures(records: Iterable<Pick<RefsRecord, 'systems'>>, systemId: string): RefFigures {
  let online: number | null = null;
  let sw = 0;
  let swx = 0;
  const sds: number[] = [];
  let rejections: number | null = null;
  for (const r of records) {
    for (const s of r.systems) {
      if (s.id !== systemId) continue;
      if (s.online_s !== undefined) online = (online ?? 0) + s.online_s;
      if (s.online_s !== undefined && s.weight !== undefined) {
        sw += s.online_s;
        swx += s.online_s * s.weight;
      }
      if (s.online_s !== undefined && s.online_s > 0 && s.sd_m !== undefined) sds.push(s.sd_m);
      if (s.rejected !== undefined) rejections = (rejections ?? 0) + s.rejected;
    }
  }
  return {
    online_hours: online === null ? null : online / 3600,
    weight_mean: sw > 0 ? swx / sw : null,
    sd_m_median: median(sds),
    rejections,
  };
}
