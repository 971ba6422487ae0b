import { describe, expect, it } from 'vitest';
import { readFleetFile, type FleetFile } from '../register/fleetFile';
import { diffCounts, registerDiff } from './registerDiff';

const file = (patch: (f: Record<string, any>) => void = () => {}): FleetFile => {
  const body: Record<string, any> = {
    v: 1,
    vessels: [
      {
        key: 'vardel-tern',
        name: 'Vardel Tern',
        type: 'construction',
        dp_class: 2,
        watch_circles_m: [3, 5],
        heading_limits_deg: [3, 5],
        thrusters: [
          { id: 'BT1', kind: 'tunnel', rated_kw: 1800, service_interval_h: 20000 },
          { id: 'MP1', kind: 'main', rated_kw: 3500, service_interval_h: 30000, diameter_m: 3.6 },
        ],
        buses: [{ id: 'A', rated_kw: 7200 }],
        refs: [{ id: 'DGNSS1', kind: 'gnss' }],
      },
    ],
    campaigns: [
      {
        key: 'tarnholm',
        charterer: 'Aldmoor Energy',
        vessels: ['vardel-tern'],
        from: '2026-10-01',
        to: '2027-01-31',
        site: { name: 'Tarnholm Field', lat: 59.412, lon: 2.871 },
        watch_circles_m: [3, 5],
      },
    ],
  };
  patch(body);
  return readFleetFile(JSON.stringify(body));
};

const empty: FleetFile = { v: 1, vessels: [], campaigns: [] };

describe('registerDiff', () => {
  it('lists every field of a new vessel and campaign as created', () => {
    const diff = registerDiff(empty, file());
    expect(diffCounts(diff)).toEqual({ vessels: { created: 1, updated: 0, unchanged: 0 }, campaigns: { created: 1, updated: 0, unchanged: 0 } });
    expect(diff.vessels[0]!.changes.map((c) => c.path)).toContain('thrusters.MP1');
  });

  it('finds nothing when the file matches the register (defaults applied alike)', () => {
    const diff = registerDiff(file(), file());
    expect(diff.vessels[0]).toEqual({ key: 'vardel-tern', status: 'unchanged', changes: [] });
    expect(diff.campaigns[0]!.status).toBe('unchanged');
  });

  it('names each changed field, added and removed units, and vessels left out of the file', () => {
    const stored = file((f) => {
      f.vessels.push({ ...f.vessels[0], key: 'osk-meridian', name: 'Osk Meridian' });
    });
    const changed = file((f) => {
      f.vessels[0].name = 'Vardel Tern II';
      f.vessels[0].watch_circles_m = [3, 6];
      f.vessels[0].thrusters[0].service_interval_h = 25000;
      f.vessels[0].thrusters.pop();
      f.vessels[0].refs.push({ id: 'HPR1', kind: 'hydroacoustic' });
      f.campaigns[0].to = '2027-02-28';
    });
    const diff = registerDiff(stored, changed);
    expect(diff.vessels[0]).toEqual({
      key: 'vardel-tern',
      status: 'updated',
      changes: [
        { path: 'name', before: 'Vardel Tern', after: 'Vardel Tern II' },
        { path: 'watch_circles_m', before: '[3, 5]', after: '[3, 6]' },
        { path: 'thrusters.BT1.service_interval_h', before: '20000', after: '25000' },
        { path: 'thrusters.MP1', before: 'registered', after: 'removed from the register (its telemetry is kept)' },
        { path: 'refs.HPR1', before: null, after: 'added' },
      ],
    });
    expect(diff.campaigns[0]!.changes).toEqual([{ path: 'to', before: '2027-01-31', after: '2027-02-28' }]);
    expect(diff.notInFile).toEqual({ vessels: ['osk-meridian'], campaigns: [] });
  });
});
