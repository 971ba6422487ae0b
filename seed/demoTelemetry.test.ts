import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readFleetFile } from '../lib/register/fleetFile';
import { recordSchemas } from '../lib/telemetry/schemas';
import { offsetFromSetPoint } from '../lib/geo/wgs84';
import { DemoVessel } from './demoTelemetry';
import { demoSite } from './sites';

const fleet = readFleetFile(readFileSync('seed/fleet.json', 'utf8'));

describe('demo telemetry', () => {
  it('is valid telemetry-v1 for every demo vessel and stream', () => {
    fleet.vessels.forEach((vessel, i) => {
      const demo = new DemoVessel(vessel, demoSite(i));
      for (let k = 0; k < 30; k++) {
        const records = demo.interval(Date.UTC(2026, 10, 30, k), 60);
        const { track, ...statistics } = records;
        for (const [stream, record] of Object.entries(statistics)) {
          const parsed = recordSchemas[stream as keyof typeof statistics].safeParse(record);
          expect(parsed.success, `${vessel.key} ${stream}: ${parsed.error?.message}`).toBe(true);
        }
        expect(track).toHaveLength(60);
        for (const position of track) expect(recordSchemas.track.safeParse(position).success).toBe(true);
      }
    });
  });

  it('is repeatable for a vessel', () => {
    const a = new DemoVessel(fleet.vessels[0]!, demoSite(0)).interval(Date.UTC(2026, 0, 1), 60);
    const b = new DemoVessel(fleet.vessels[0]!, demoSite(0)).interval(Date.UTC(2026, 0, 1), 60);
    expect(a).toEqual(b);
  });
});

describe('demo track', () => {
  it('holds the same positions as the station statistics (offsets from the set point on WGS84)', () => {
    const demo = new DemoVessel(fleet.vessels[3]!, demoSite(3));
    const { track, station } = demo.interval(Date.UTC(2026, 10, 30, 12), 60);
    const radii = track.map((p) => {
      const o = offsetFromSetPoint(p.lat, p.lon, p.sp_lat!, p.sp_lon!);
      return Math.hypot(o.north, o.east);
    });
    // Positions are rounded to 1e-7 degrees (about 1 cm).
    expect(Math.abs(Math.max(...radii) - station.err!.r_max!)).toBeLessThan(0.02);
    expect(track.map((p) => p.t)).toEqual(Array.from({ length: 60 }, (_, i) => new Date(Date.UTC(2026, 10, 30, 12) + i * 1000).toISOString()));
  });
});
