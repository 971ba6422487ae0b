import type { SampledVessel } from './sampledVessel';

/**
 * A day's figures computed straight from a sampled vessel's 1 Hz samples
 * (sampledVessel.ts), written from the text of spec metrics-v1 without
 * lib/metrics, so the integration test has an independent answer. Figures the
 * spec defines on interval statistics (efficiency, reference systems, gusts)
 * are computed from the samples grouped by interval.
 */

export interface ExpectedDay {
  dp_hours: number;
  p50_m: number | null;
  p95_m: number | null;
  p99_m: number | null;
  r_rms_m: number | null;
  r_max_m: number | null;
  within_pct: Record<string, number | null>;
  hdg_rms_deg: number | null;
  hdg_max_abs_deg: number | null;
  wind_mean_ms: number | null;
  gust_max_ms: number | null;
  current_mean_ms: number | null;
  limit_events: number;
  limit_seconds: number;
  limit_events_per_dp_day: number | null;
  blackouts: number;
  peak_load_ratio: number;
  thrusters: Record<string, { run_hours: number; wear_hours: number; starts: number; efficiency_index: number | null }>;
  refs: Record<string, { online_hours: number; weight_mean: number | null; sd_m_median: number | null; rejections: number }>;
}

/** metrics-v1: the q-quantile lies in the first bin k whose cumulative count reaches q·N, interpolated inside it. */
function quantile(bins: number[], q: number): number | null {
  const n = bins.reduce((a, b) => a + b, 0);
  if (n === 0) return null;
  let before = 0;
  for (let k = 0; k < bins.length; k++) {
    if (bins[k]! > 0 && before + bins[k]! >= q * n) return k === 100 ? 10 : 0.1 * k + (0.1 * (q * n - before)) / bins[k]!;
    before += bins[k]!;
  }
  return 10;
}

export function expectedDay(
  v: SampledVessel,
  dt: number,
  dayStartMs: number,
  limits: readonly number[],
  lifeExponents: Record<string, number>,
  /** Which intervals (by index) the store holds; all by default. */
  stored: (interval: number) => boolean = () => true,
): ExpectedDay {
  const s = v.samples;
  const dayEnd = dayStartMs + 86_400_000;
  const inDay: number[] = [];
  for (let j = 0; j < s.t.length; j++) if (s.t[j]! >= dayStartMs && s.t[j]! < dayEnd && stored(Math.floor(j / dt))) inDay.push(j);
  const storedOnDay = <T extends { t: string }>(records: T[]) =>
    records.filter((r, i) => Date.parse(r.t) >= dayStartMs && Date.parse(r.t) < dayEnd && stored(i));
  const dp = inDay.filter((j) => s.dp[j] === 1);

  const bins = new Array<number>(101).fill(0);
  for (const j of dp) bins[Math.min(100, Math.floor(s.r[j]! * 10))]!++;
  const mean = (idx: number[], a: Float64Array) => (idx.length ? idx.reduce((x, j) => x + a[j]!, 0) / idx.length : null);
  const rms = (idx: number[], a: Float64Array) => (idx.length ? Math.sqrt(idx.reduce((x, j) => x + a[j]! ** 2, 0) / idx.length) : null);
  const max = (idx: number[], f: (j: number) => number) => (idx.length ? Math.max(...idx.map(f)) : null);

  // Gust: the largest 3 s mean inside a DP interval (the gateway's definition in sampledVessel.ts).
  let gust: number | null = null;
  for (const j of dp) {
    if ((j % dt) >= 2) {
      const g = (s.wind[j]! + s.wind[j - 1]! + s.wind[j - 2]!) / 3;
      gust = gust === null ? g : Math.max(gust, g);
    }
  }

  let events = 0, limitS = 0, blackouts = 0, peak = 0;
  s.limited.forEach((limited, b) => {
    for (const j of inDay) {
      if (limited[j] && !(j > 0 && limited[j - 1])) events++;
      limitS += limited[j]!;
      if (j % dt === 0 && s.blackout[b]![j]) blackouts++;
      peak = Math.max(peak, s.kw[b]![j]! / s.kwAvailable[b]![j]!);
    }
  });
  // Per bus the gateway reports kw_max over the interval against the interval's capacity: the same maximum.
  const dpHours = dp.length / 3600;

  const thrusters: ExpectedDay['thrusters'] = {};
  v.thrusters[0]!.units.forEach(({ id }, u) => {
    const p = lifeExponents[id] ?? 3;
    let runS = 0, wear = 0, num = 0, den = 0;
    for (const j of inDay) {
      if (!s.running[u]![j]) continue;
      runS++;
      const band = Math.min(10, Math.floor(s.load[u]![j]! / 10));
      wear += ((band * 10 + 5) / 100) ** p / 3600;
    }
    // Efficiency (metrics-v1): Σ(mean thrust · run_s) / Σ(mean power^(2/3) · run_s) over running intervals.
    for (let i0 = 0; i0 < s.t.length; i0 += dt) {
      if (s.t[i0]! < dayStartMs || s.t[i0]! >= dayEnd || !stored(i0 / dt) || !s.running[u]![i0]) continue;
      let thrust = 0, power = 0;
      for (let k = 0; k < dt; k++) (thrust += s.thrust[u]![i0 + k]!), (power += s.power[u]![i0 + k]!);
      num += (thrust / dt) * dt;
      den += (power / dt) ** (2 / 3) * dt;
    }
    const starts = storedOnDay(v.thrusters).reduce((a, r) => a + r.units[u]!.starts, 0);
    thrusters[id] = { run_hours: runS / 3600, wear_hours: wear, starts, efficiency_index: den > 0 ? num / den : null };
  });

  const refs: ExpectedDay['refs'] = {};
  const dayRefs = storedOnDay(v.refs);
  for (const { id } of v.refs[0]!.systems) {
    const units = dayRefs.map((r) => r.systems.find((x) => x.id === id)!);
    const online = units.reduce((a, x) => a + x.online_s!, 0);
    const sds = units.filter((x) => x.online_s! > 0).map((x) => x.sd_m!).sort((a, b) => a - b);
    const mid = sds.length >> 1;
    refs[id] = {
      online_hours: online / 3600,
      weight_mean: online > 0 ? units.reduce((a, x) => a + x.online_s! * x.weight!, 0) / online : null,
      sd_m_median: sds.length === 0 ? null : sds.length % 2 ? sds[mid]! : (sds[mid - 1]! + sds[mid]!) / 2,
      rejections: units.reduce((a, x) => a + x.rejected!, 0),
    };
  }

  const below = (l: number) => dp.filter((j) => s.r[j]! < l).length;
  return {
    dp_hours: dpHours,
    p50_m: quantile(bins, 0.5),
    p95_m: quantile(bins, 0.95),
    p99_m: quantile(bins, 0.99),
    r_rms_m: rms(dp, s.r),
    r_max_m: max(dp, (j) => s.r[j]!),
    // Limits on bin edges (multiples of 0.1 m): the share of samples strictly below the limit.
    within_pct: Object.fromEntries(limits.map((l) => [String(l), dp.length ? (100 * below(l)) / dp.length : null])),
    hdg_rms_deg: rms(dp, s.hdgErr),
    hdg_max_abs_deg: max(dp, (j) => Math.abs(s.hdgErr[j]!)),
    wind_mean_ms: mean(dp, s.wind),
    gust_max_ms: gust,
    current_mean_ms: mean(dp, s.current),
    limit_events: events,
    limit_seconds: limitS,
    limit_events_per_dp_day: dpHours > 0 ? (events * 24) / dpHours : null,
    blackouts,
    peak_load_ratio: peak,
    thrusters,
    refs,
  };
}
