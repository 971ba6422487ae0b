import { describe, expect, it } from 'vitest';
import type { VesselDayItem } from '../api/queries/vesselDaily';
import { rangeSummary, refRows, thrusterRows } from './vesselSummary';

const hist = (counts: Record<number, number>) => {
  const h = new Array<number>(101).fill(0);
  for (const [k, n] of Object.entries(counts)) h[Number(k)] = n;
  return h;
};
const day = (values: Partial<VesselDayItem>): VesselDayItem =>
  ({ day: '2026-12-01', dp_hours: 10, limit_events: null, blackouts: null, peak_load_ratio: null, p95_norm: null, ...values }) as VesselDayItem;

describe('rangeSummary', () => {
  it('reads percentiles from the merged histogram and sums only figures that exist', () => {
    const s = rangeSummary(
      [day({ dp_hours: 10, limit_events: 2, p95_norm: 1.2, peak_load_ratio: 0.7 }), day({ dp_hours: 14, limit_events: null, blackouts: 1, p95_norm: 1, peak_load_ratio: 0.9 })],
      hist({ 10: 100, 30: 100 }),
      [3, 5],
    );
    expect(s.dpHours).toBe(24);
    expect(s.limitEvents).toBe(2);
    expect(s.limitEventsPerDpDay).toBe(2);
    expect(s.blackouts).toBe(1);
    expect(s.peakLoadRatio).toBe(0.9);
    expect(s.p95NormMedian).toBeCloseTo(1.1, 12);
    expect(s.p95!.m).toBeCloseTo(3.09, 9);
    expect(s.within).toEqual([
      { limit: 3, pct: 50 },
      { limit: 5, pct: 100 },
    ]);
  });

  it('is null, not zero, without figures', () => {
    const s = rangeSummary([], hist({}), [3]);
    expect([s.dpHours, s.p95, s.limitEvents, s.limitEventsPerDpDay, s.within[0]!.pct]).toEqual([null, null, null, null, null]);
  });
});

describe('unit tables', () => {
  it('lists registered thrusters and units seen only in telemetry, with wear against the interval', () => {
    const rows = thrusterRows(
      [{ id: 'T1', kind: 'tunnel', serviceIntervalH: 1000 }],
      [{ id: 'T1', kind: 'tunnel', wear_hours_total: 250, wear_hours_to_service: 750, projected_service_day: '2027-01-15' }],
      [
        { day: '2026-12-01', thruster: 'T1', run_hours: 20, wear_hours: 3, starts: 2, azimuth_travel_deg: null, efficiency_index: 0.91 },
        { day: '2026-12-02', thruster: 'T1', run_hours: 10, wear_hours: null, starts: 1, azimuth_travel_deg: null, efficiency_index: null },
        { day: '2026-12-02', thruster: 'T9', run_hours: 1, wear_hours: 0.1, starts: 0, azimuth_travel_deg: null, efficiency_index: null },
      ],
    );
    expect(rows[0]).toEqual({
      id: 'T1',
      kind: 'tunnel',
      registered: true,
      runHours: 30,
      wearHours: 3,
      starts: 3,
      latestEfficiency: { day: '2026-12-01', value: 0.91 },
      serviceIntervalH: 1000,
      wearTotalH: 250,
      toServiceH: 750,
      projectedServiceDay: '2027-01-15',
      used: 0.25,
    });
    expect(rows[1]).toMatchObject({ id: 'T9', registered: false, used: null });
  });

  it('weights reference system weight by online hours', () => {
    const [r] = refRows(
      [{ id: 'G1', kind: 'gnss' }],
      [
        { day: '2026-12-01', ref: 'G1', online_hours: 18, weight_mean: 0.5, sd_m_median: 0.2, rejections: 1 },
        { day: '2026-12-02', ref: 'G1', online_hours: 6, weight_mean: 0.9, sd_m_median: 0.4, rejections: 0 },
      ],
    );
    expect(r!.weightMean).toBeCloseTo(0.6, 12);
    expect(r!.sdMedian).toBeCloseTo(0.3, 12);
    expect(r!.onlineHours).toBe(24);
  });
});
