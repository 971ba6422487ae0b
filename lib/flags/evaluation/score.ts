import { median } from '../../metrics/refs';
import { dayNumber } from '../window';

/**
 * Scores flags against a ground truth of seeded faults (the simulator's
 * ground-truth file, seed/scenarios/groundTruth.ts, or a synthetic one).
 * Pure. The rules (project's, stated in docs/flags.md):
 * - a flag is correct when an entry that expects a flag, or that names a
 *   consequence of a fault (the derated generator's power limit cuts thrust,
 *   so station keeping suffers), names its vessel, subject and metric, and it
 *   opened on or after that entry's onset day; every other flag is a false
 *   flag (a flag on a healthy series, a flag on a faulty series before the
 *   fault began, a flag on any other metric of a faulty vessel: all count
 *   against precision);
 * - consequences are not required: they count neither in recall nor in the
 *   detection delay;
 * - recall = expected entries that got a correct flag / expected entries;
 * - detection delay = first correct flag's opened day − onset day;
 * - weather false flags = flags of any metric on a vessel whose only
 *   seeded change is the weather (the negative control).
 */

export interface TruthEntry {
  scenario: string;
  vessel: string;
  subject: string;
  metric: string | null;
  onset_date: string;
  expect_flag: boolean;
  /** The fault moves this metric too; a flag on it is right but not required (seed/scenarios/groundTruth.ts). */
  consequence?: boolean;
}

export interface RaisedFlag {
  vessel: string;
  subject: string;
  metric: string;
  opened_day: string;
}

export interface Score {
  flags: number;
  correct: number;
  expected: number;
  detected: number;
  precision: number;
  recall: number;
  /** Median detection delay in days over detected entries; null when none was detected. */
  medianDetectDays: number | null;
  weatherFalseFlags: number;
  perEntry: { entry: TruthEntry; flag: RaisedFlag | null; delayDays: number | null }[];
  falseFlags: RaisedFlag[];
  /** Correct flags on a fault's consequences (not required). */
  consequential: RaisedFlag[];
}

const key = (vessel: string, subject: string, metric: string | null) => `${vessel}|${subject}|${metric}`;

/** The median, null for none (lib/metrics/refs.ts). */
export const medianOf = median;

export function scoreFlags(truth: readonly TruthEntry[], flags: readonly RaisedFlag[]): Score {
  const expected = truth.filter((e) => e.expect_flag && e.metric !== null);
  const byKey = new Map(expected.map((e) => [key(e.vessel, e.subject, e.metric), e]));
  const consequences = new Map(truth.filter((e) => e.consequence && e.metric !== null).map((e) => [key(e.vessel, e.subject, e.metric), e]));
  const healthyVessels = new Set(truth.map((e) => e.vessel));
  for (const e of truth) if (e.scenario !== 'weather_only') healthyVessels.delete(e.vessel);
  const weatherVessels = new Set(truth.filter((e) => e.scenario === 'weather_only').map((e) => e.vessel).filter((v) => healthyVessels.has(v)));

  const firstCorrect = new Map<TruthEntry, RaisedFlag>();
  const falseFlags: RaisedFlag[] = [];
  const consequential: RaisedFlag[] = [];
  for (const f of [...flags].sort((a, b) => (a.opened_day < b.opened_day ? -1 : a.opened_day > b.opened_day ? 1 : 0))) {
    const e = byKey.get(key(f.vessel, f.subject, f.metric));
    const c = consequences.get(key(f.vessel, f.subject, f.metric));
    if (e && f.opened_day >= e.onset_date) {
      if (!firstCorrect.has(e)) firstCorrect.set(e, f);
    } else if (c && f.opened_day >= c.onset_date) consequential.push(f);
    else falseFlags.push(f);
  }
  const perEntry = expected.map((entry) => {
    const flag = firstCorrect.get(entry) ?? null;
    return { entry, flag, delayDays: flag ? dayNumber(flag.opened_day) - dayNumber(entry.onset_date) : null };
  });
  const delays = perEntry.flatMap((p) => (p.delayDays === null ? [] : [p.delayDays]));
  const correct = flags.length - falseFlags.length;
  return {
    flags: flags.length,
    correct,
    expected: expected.length,
    detected: delays.length,
    // No flag raised: nothing was wrongly raised, precision 1 by convention (recall shows the miss).
    precision: flags.length === 0 ? 1 : correct / flags.length,
    recall: expected.length === 0 ? 1 : delays.length / expected.length,
    medianDetectDays: medianOf(delays),
    weatherFalseFlags: flags.filter((f) => weatherVessels.has(f.vessel)).length,
    perEntry,
    falseFlags,
    consequential,
  };
}

/** The last line `npm run eval:flags` prints (issue 6). */
export function scoreLine(s: Score): string {
  const d = s.medianDetectDays === null ? 'none' : String(s.medianDetectDays);
  return `precision=${s.precision.toFixed(3)} recall=${s.recall.toFixed(3)} median_detect_days=${d} weather_false_flags=${s.weatherFalseFlags}`;
}
