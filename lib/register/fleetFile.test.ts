import { describe, expect, it } from 'vitest';
import { FleetFileError, readFleetFile } from './fleetFile';

const vessel = (key: string, extra: Record<string, unknown> = {}) => ({
  key,
  name: `Vessel ${key}`,
  type: 'supply',
  dp_class: 2,
  watch_circles_m: [3, 5],
  heading_limits_deg: [3, 5],
  thrusters: [{ id: 'T1', kind: 'tunnel', rated_kw: 1500, diameter_m: 2.2, service_interval_h: 20000 }],
  buses: [{ id: 'A', rated_kw: 6000 }],
  refs: [{ id: 'GNSS1', kind: 'gnss' }],
  ...extra,
});

function errorsOf(body: unknown, name = 'f.json'): string[] {
  try {
    readFleetFile(JSON.stringify(body), name);
  } catch (e) {
    if (e instanceof FleetFileError) return e.errors;
    throw e;
  }
  return [];
}

describe('readFleetFile', () => {
  it('reads a valid file and fills the documented defaults', () => {
    const file = readFleetFile(JSON.stringify({ v: 1, vessels: [vessel('aa-one')] }));
    expect(file.vessels[0]!.thrusters[0]).toMatchObject({ life_exponent: 3, wear_h_at_install: 0 });
    expect(file.campaigns).toEqual([]);
  });

  it('reads YAML of the same shape', () => {
    const yaml = `v: 1\nvessels:\n  - key: aa-one\n    name: One\n    type: supply\n    dp_class: 3\n    watch_circles_m: [2, 4]\n    heading_limits_deg: [2, 4]\n    thrusters: []\n    buses: []\n    refs: []\n`;
    expect(readFleetFile(yaml, 'fleet.yaml').vessels[0]!.dp_class).toBe(3);
  });

  it('lists every error by path and rejects the whole file', () => {
    const bad = {
      v: 1,
      vessels: [
        vessel('aa-one'),
        vessel('aa-two'),
        vessel('aa-three'),
        vessel('aa-four', {
          dp_class: 4,
          thrusters: [
            { id: 'T1', kind: 'tunnel', rated_kw: 100, service_interval_h: 1 },
            { id: 'T2', kind: 'tunnel', rated_kw: 0, service_interval_h: 1 },
          ],
        }),
        vessel('aa-one'),
      ],
      campaigns: [
        {
          key: 'camp', charterer: 'C', vessels: ['nope'], from: '2026-02-01', to: '2026-01-01',
          site: { name: 'S', lat: 0, lon: 0 }, watch_circles_m: [5, 3],
        },
      ],
    };
    expect(errorsOf(bad).sort()).toEqual(
      [
        'vessels[3].dp_class: must be 1, 2 or 3',
        'vessels[3].thrusters[1].rated_kw: must be > 0',
        'vessels[4]: vessel "aa-one" is listed twice',
        'campaigns[0].to: must not be before from',
        'campaigns[0].vessels[0]: vessel "nope" is not in this file',
        'campaigns[0].watch_circles_m: must be ascending',
      ].sort(),
    );
  });

  it('names a campaign vessel that is not in the file', () => {
    const body = {
      v: 1,
      vessels: [vessel('aa-one')],
      campaigns: [{ key: 'camp', charterer: 'C', vessels: ['aa-one', 'ghost'], from: '2026-01-01', to: '2026-01-31', site: { name: 'S', lat: 1, lon: 2 }, watch_circles_m: [3] }],
    };
    expect(errorsOf(body)).toEqual(['campaigns[0].vessels[1]: vessel "ghost" is not in this file']);
  });

  it('reports unreadable text as one error', () => {
    expect(() => readFleetFile('{ nope', 'fleet.json')).toThrow(/fleet.json: cannot be read/);
  });
});
