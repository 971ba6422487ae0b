import { describe, expect, it } from 'vitest';
import { addDays } from '../time/fleetDay';
import { HORIZON_DAYS, projectService, trailingWearRate } from './serviceProjection';

// Source: docs spec metrics-v1 "Thruster wear" (cumulative wear vs service
// interval; trailing 30-day rate); the projection rule is the project's, in serviceProjection.ts.
const asOf = '2026-03-31';
const days = (n: number, wear: number) => Array.from({ length: n }, (_, i) => ({ day: addDays(asOf, -i), wear_hours: wear }));

describe('service projection', () => {
  it('900 of 1000 wear hours used at 2 h/day → 100 h to service, due 50 days on', () => {
    const p = projectService({ cumulativeWearHours: 900, serviceIntervalWearHours: 1000, daily: days(30, 2), asOf });
    expect(p).toEqual({ wear_hours_to_service: 100, rate_per_day: 2, days_with_data: 30, projected_service_day: '2026-05-20' });
  });
  it('rounds a part day up: 101 h at 2 h/day → 51 days', () => {
    const p = projectService({ cumulativeWearHours: 899, serviceIntervalWearHours: 1000, daily: days(30, 2), asOf });
    expect(p.projected_service_day).toBe(addDays(asOf, 51));
  });
  it('uses only the 30 days ending on asOf, and days with data only', () => {
    const daily = [
      { day: asOf, wear_hours: 3 },
      { day: addDays(asOf, -29), wear_hours: 1 }, // first day of the window
      { day: addDays(asOf, -30), wear_hours: 500 }, // outside
      { day: addDays(asOf, 1), wear_hours: 500 }, // after asOf
      { day: addDays(asOf, -5), wear_hours: null }, // gap
    ];
    expect(trailingWearRate(daily, asOf)).toEqual({ rate: 2, days: 2 });
  });
  it('no projection when the rate is 0 or there is no data', () => {
    expect(projectService({ cumulativeWearHours: 10, serviceIntervalWearHours: 1000, daily: days(30, 0), asOf }).projected_service_day).toBeNull();
    const none = projectService({ cumulativeWearHours: 10, serviceIntervalWearHours: 1000, daily: [], asOf });
    expect(none.rate_per_day).toBeNull();
    expect(none.projected_service_day).toBeNull();
  });
  it('overdue: negative hours to service, due today', () => {
    const p = projectService({ cumulativeWearHours: 1010, serviceIntervalWearHours: 1000, daily: days(30, 0), asOf });
    expect(p.wear_hours_to_service).toBe(-10);
    expect(p.projected_service_day).toBe(asOf);
  });

  it('no date more than 100 years ahead (it would say nothing, and could not be written past year 9999)', () => {
    const near = projectService({ cumulativeWearHours: 0, serviceIntervalWearHours: HORIZON_DAYS, daily: days(30, 1), asOf });
    expect(near.projected_service_day).toBe(addDays(asOf, HORIZON_DAYS));
    const far = projectService({ cumulativeWearHours: 0, serviceIntervalWearHours: 1000, daily: days(30, 1e-6), asOf });
    expect(far.projected_service_day).toBeNull();
    expect(far.rate_per_day).toBeCloseTo(1e-6, 12);
  });
});
