import { isFastPath, type Detection, type DetectionPath } from './detect';
import type { Direction } from './series';

/**
 * What a detection that opens a flag amounts to (project's rule,
 * docs/flags.md): both slow methods found degradation, so the flag names both
 * ('mann_kendall+ewma') and stores Kendall's Z; or the fast path did
 * ('cusum+rank_sum', or 'cusum+mann_kendall' against a known healthy level),
 * and it stores the CUSUM in baseline standard deviations (every figure is
 * in the evidence). Severity grows with the size
 * of the change, the largest of Sen's change over the window, the EWMA's
 * distance from its target and the CUSUM run's line today, against
 * the series' minimum change:
 *   advisory  below 2 × the minimum change
 *   warning   from 2 ×
 *   alarm     from 4 ×
 */

export const SEVERITIES = ['advisory', 'warning', 'alarm'] as const;
export type Severity = (typeof SEVERITIES)[number];
export const WARNING_FACTOR = 2;
export const ALARM_FACTOR = 4;
export const METHOD = 'mann_kendall+ewma';

export interface Verdict {
  /** The detection's path: METHOD, or the fast path's 'cusum+…' (detect.ts). */
  method: DetectionPath;
  /** Kendall's Z for both slow methods; the CUSUM in baseline standard deviations (C/s) for the fast path. */
  statistic: number;
  statisticName: 'kendall_z' | 'cusum_sd';
  severity: Severity;
  /** The larger change in the degrading direction the two methods measured (positive = worse), on the detection's scale. */
  change: number;
}

/** The severity of a change of `change` against a minimum change of `minChange` (both positive = worse). */
export function severityOf(change: number, minChange: number): Severity {
  if (minChange > 0 && change >= ALARM_FACTOR * minChange) return 'alarm';
  if (minChange > 0 && change >= WARNING_FACTOR * minChange) return 'warning';
  return 'advisory';
}

export function verdictOf(d: Detection, direction: Direction): Verdict | null {
  if (!d.holds || !d.trend || !d.ewma) return null;
  const sign = direction === 'rising' ? 1 : -1;
  const changes = [sign * d.trend.change, sign * (d.ewma.ewma - d.ewma.target)];
  if (d.cusum?.now != null) changes.push(sign * (d.cusum.now - d.cusum.target));
  const severity = severityOf(Math.max(...changes), d.minChange);
  if (isFastPath(d.path) && d.cusum) {
    return { method: d.path, statistic: d.cusum.c / d.cusum.sigma, statisticName: 'cusum_sd', severity, change: Math.max(...changes) };
  }
  return { method: METHOD, statistic: d.trend.mk.z, statisticName: 'kendall_z', severity, change: Math.max(...changes) };
}

/** The more severe of two severities (an open flag escalates, never calms down: a person closes it). */
export function worse(a: Severity, b: Severity): Severity {
  return SEVERITIES.indexOf(a) >= SEVERITIES.indexOf(b) ? a : b;
}
