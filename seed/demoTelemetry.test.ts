import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readFleetFile } from '../lib/register/fleetFile';
import { recordSchemas } from '../lib/telemetry/schemas';
import { DemoVessel } from './demoTelemetry';
import { demoSite } from './sites';

const fleet = readFleetFile(readFileSync('seed/fleet.json', 'utf8'));

describe('demo telemetry', () => {
  it('is valid telemetry-v1 for every demo vessel and stream', () => {
    fleet.vessels.forEach((vessel, i) => {
      const demo = new DemoVessel(vessel, demoSite(i));
      for (let k = 0; k < 30; k++) {
        const records = demo.interval(Date.UTC(2026, 10, 30, k), 60);
        for (const [stream, record] of Object.entries(records)) {
          const parsed = recordSchemas[stream as keyof typeof records].safeParse(record);
          expect(parsed.success, `${vessel.key} ${stream}: ${parsed.error?.message}`).toBe(true);
        }
      }
    });
  });

  it('is repeatable for a vessel', () => {
    const a = new DemoVessel(fleet.vessels[0]!, demoSite(0)).interval(Date.UTC(2026, 0, 1), 60);
    const b = new DemoVessel(fleet.vessels[0]!, demoSite(0)).interval(Date.UTC(2026, 0, 1), 60);
    expect(a).toEqual(b);
  });
});
