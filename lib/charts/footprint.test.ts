import { describe, expect, it } from 'vitest';
import { circlePoints, radialDistribution, trackScatter } from './footprint';

const hist = (counts: Record<number, number>) => {
  const h = new Array<number>(101).fill(0);
  for (const [k, n] of Object.entries(counts)) h[Number(k)] = n;
  return h;
};

describe('radialDistribution', () => {
  it('gives each bin its share of the samples and reads percentiles from the merged histogram', () => {
    // 100 samples in [1.0, 1.1) m, 100 in [3.0, 3.1) m: p95 = 3.0 + 0.1·90/100 = 3.09 m (metrics-v1 interpolation).
    const d = radialDistribution(hist({ 10: 100, 30: 100 }), [3, 5]);
    expect(d.samples).toBe(200);
    expect(d.bars[10]).toEqual({ r: 1, label: '1.0–1.1 m', pct: 50 });
    expect(d.bars[30]!.pct).toBe(50);
    expect(d.p95!.m).toBeCloseTo(3.09, 9);
    expect(d.within).toEqual([
      { limit: 3, pct: 50 },
      { limit: 5, pct: 100 },
    ]);
    // Bars run past the largest watch circle so both circles show.
    expect(d.bars).toHaveLength(55);
    expect(d.x).toEqual({ label: 'Radial error (m)', domain: [0, 5.5] });
    expect(d.y.label).toBe('Share of samples (%)');
  });

  it('keeps the overflow bin apart', () => {
    const d = radialDistribution(hist({ 5: 90, 100: 10 }), [3]);
    expect(d.overflowPct).toBe(10);
    expect(d.p95).toEqual({ m: 10, overflow: true });
  });

  it('has no bars and null figures without samples (a gap, not zeros)', () => {
    const d = radialDistribution(hist({}), [3, 5]);
    expect(d.bars).toEqual([]);
    expect(d.p50).toBeNull();
    expect(d.within).toEqual([
      { limit: 3, pct: null },
      { limit: 5, pct: null },
    ]);
  });
});

describe('trackScatter', () => {
  it('uses one symmetric range for both axes, covering the circles', () => {
    const s = trackScatter([{ east: 1.2, north: -0.4 }], [3, 5]);
    expect(s.x.domain).toEqual([-6, 6]);
    expect(s.y.domain).toEqual([-6, 6]);
    expect(s.x.label).toBe('East of set point (m)');
    expect(s.y.label).toBe('North of set point (m)');
    expect(s.circles.map((c) => c.label)).toEqual(['Watch circle 3 m', 'Watch circle 5 m']);
  });

  it('draws circles as closed polylines of the right radius', () => {
    const pts = circlePoints(3, 36);
    expect(pts).toHaveLength(37);
    for (const p of pts) expect(Math.hypot(p.east, p.north)).toBeCloseTo(3, 12);
    expect(pts[0]!.north).toBeCloseTo(3, 12);
    expect(pts[36]!.north).toBeCloseTo(3, 12);
  });
});
