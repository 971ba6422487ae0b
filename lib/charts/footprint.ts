import { BIN_WIDTH_M, OVERFLOW_BIN, histogramTotal, radialQuantile } from '../metrics/radialHistogram';
import { withinPct } from '../metrics/withinLimit';
import { symmetricDomain, zeroBasedDomain } from './scale';
import type { AxisSpec, ReferenceLineSpec } from './types';
import { UNIT, axisLabel } from './units';
import { limitLines } from './vesselCharts';

/**
 * The footprint: how far from the set point the vessel was over a range of
 * days, from two sources.
 * - Radial distribution: the merged err_hist of the range's days (each the
 *   sum of that day's DP intervals), as the share of samples per 0.1 m bin.
 *   Percentiles and "inside" shares come from lib/metrics on the same merged
 *   histogram, never from averaging daily figures.
 * - Scatter: north/east offsets of raw track positions (optional stream),
 *   sampled down by the query; watch circles drawn as circles.
 */

export interface RadialBar {
  /** Lower edge of the bin, m. */
  r: number;
  /** "1.2–1.3 m". */
  label: string;
  pct: number;
}

export interface RadialDistribution {
  samples: number;
  bars: RadialBar[];
  /** Share of samples at 10 m or more (the contract's overflow bin). */
  overflowPct: number;
  p50: { m: number; overflow: boolean } | null;
  p95: { m: number; overflow: boolean } | null;
  within: { limit: number; pct: number | null }[];
  x: AxisSpec;
  y: AxisSpec;
  refLines: ReferenceLineSpec[];
}

const round1 = (x: number) => Math.round(x * 10) / 10;

export function radialDistribution(hist: ArrayLike<number>, watchCirclesM: readonly number[]): RadialDistribution {
  const n = histogramTotal(hist);
  let last = -1;
  for (let k = 0; k < Math.min(hist.length, OVERFLOW_BIN); k++) if (hist[k]! > 0) last = k;
  // Show the bins up to the last one with samples and at least past the largest watch circle.
  const upTo = Math.min(OVERFLOW_BIN, Math.max(last + 1, Math.ceil((Math.max(0, ...watchCirclesM) + 0.5) / BIN_WIDTH_M)));
  const bars: RadialBar[] = [];
  for (let k = 0; k < upTo; k++) {
    const r = round1(k * BIN_WIDTH_M);
    bars.push({ r, label: `${r.toFixed(1)}–${round1(r + BIN_WIDTH_M).toFixed(1)} m`, pct: n > 0 ? (100 * (hist[k] ?? 0)) / n : 0 });
  }
  const overflowPct = n > 0 ? (100 * (hist[OVERFLOW_BIN] ?? 0)) / n : 0;
  return {
    samples: n,
    bars: n > 0 ? bars : [],
    overflowPct,
    p50: n > 0 ? radialQuantile(hist, 0.5) : null,
    p95: n > 0 ? radialQuantile(hist, 0.95) : null,
    within: watchCirclesM.map((limit) => ({ limit, pct: withinPct(hist, limit) })),
    x: { label: axisLabel('Radial error', UNIT.metre), domain: [0, round1(upTo * BIN_WIDTH_M)] },
    y: { label: axisLabel('Share of samples', UNIT.percent), domain: zeroBasedDomain(bars.map((b) => b.pct)) },
    refLines: limitLines(watchCirclesM, 'Watch circle', 'm'),
  };
}

export interface TrackPoint {
  east: number;
  north: number;
}

export interface TrackScatter {
  points: TrackPoint[];
  circles: { limit: number; label: string; tone: ReferenceLineSpec['tone']; points: TrackPoint[] }[];
  x: AxisSpec;
  y: AxisSpec;
}

/** A circle of radius r as a closed polyline of `segments` segments. */
export function circlePoints(r: number, segments = 72): TrackPoint[] {
  return Array.from({ length: segments + 1 }, (_, i) => {
    const a = (2 * Math.PI * i) / segments;
    return { east: r * Math.sin(a), north: r * Math.cos(a) };
  });
}

export function trackScatter(points: readonly TrackPoint[], watchCirclesM: readonly number[]): TrackScatter {
  // Same range on both axes, so a circle looks round and a metre east is as long as a metre north.
  const domain = symmetricDomain(
    points.flatMap((p) => [p.east, p.north]),
    watchCirclesM,
  );
  return {
    points: [...points],
    circles: limitLines(watchCirclesM, 'Watch circle', 'm').map((l) => ({ limit: l.y, label: l.label, tone: l.tone, points: circlePoints(l.y) })),
    x: { label: axisLabel('East of set point', UNIT.metre), domain },
    y: { label: axisLabel('North of set point', UNIT.metre), domain },
  };
}
