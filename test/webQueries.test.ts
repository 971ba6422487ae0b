import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listCampaigns } from '../lib/queries/campaigns';
import { getFlagSeries, hasSeries } from '../lib/queries/flagSeries';
import { getFleetRankingInputs } from '../lib/queries/fleetRanking';
import { getRegisterSnapshot } from '../lib/queries/registerSnapshot';
import { getThrusterWear } from '../lib/queries/thrusterWear';
import { getTrackSample } from '../lib/queries/trackSample';
import { getVesselProfile } from '../lib/queries/vesselProfile';
import { getRangeHistogram } from '../lib/queries/vesselFootprint';
import { getWatchlist, getWatchlistChoices, type WatchlistFilter } from '../lib/queries/watchlist';
import type { Scope } from '../lib/auth/scope';
import { listFleetWebhooks } from '../lib/queries/webhooks';
import { diffCounts, registerDiff } from '../lib/web/registerDiff';
import { histogram, insertVesselDay } from './apiHelpers';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { registerFleet } from './helpers/fleet';
import { apiFleet } from './apiHelpers';

// The whole fleet: these tests read as a shore user (scoping is tested in test/probe.test.ts).
const FLEET: Scope = { kind: 'fleet' };

/**
 * The web app's own queries (lib/queries) against a real PostgreSQL, with
 * rows written by hand so every expected figure can be worked out here.
 */

describe('web queries', () => {
  let db: TestDatabase;
  let skua = 0;
  let shag = 0;
  const fleet = apiFleet({ from: '2026-11-01', to: '2026-11-30' });

  const flag = async (vesselId: number, values: { subject: string; metric: string; severity: string; opened: string; status?: string }) =>
    Number(
      (
        await db.pool.query<{ id: string }>(
          `INSERT INTO flag (vessel_id, subject, metric, method, severity, opened_day, window_from, window_to, statistic, statistic_name,
                             explanation, status, close_reason, last_evaluated_day)
           VALUES ($1, $2, $3, 'mann_kendall', $4, $5, $5::date - 29, $5, 0.01, 'p', 'x', $6, $7, $5) RETURNING id`,
          [vesselId, values.subject, values.metric, values.severity, values.opened, values.status ?? 'open', values.status === 'closed' ? 'dismissed' : null],
        )
      ).rows[0]!.id,
    );

  beforeAll(async () => {
    db = await createMigratedDatabase();
    await registerFleet(db.url, fleet);
    const { rows } = await db.pool.query<{ key: string; id: number }>('SELECT key, id FROM vessel');
    skua = rows.find((r) => r.key === 'kelvick-skua')!.id;
    shag = rows.find((r) => r.key === 'ardle-shag')!.id;
  });
  afterAll(() => db?.drop());

  it('fleet ranking inputs: the window summed per vessel, campaigns, last station record, live flags by severity', async () => {
    await insertVesselDay(db, skua, '2026-11-10', { p95_m: 1.5, p95_norm: 1.1, limit_events: 3, dp_hours: 20 });
    await insertVesselDay(db, skua, '2026-11-12', { p95_m: 10, p95_overflow: true, p95_norm: 1.4, limit_events: null, dp_hours: 4 });
    await insertVesselDay(db, skua, '2026-11-13', { p95_m: null, p95_norm: 1.2, limit_events: 1, dp_hours: 0 });
    await insertVesselDay(db, skua, '2026-11-14', { p95_m: 1.2, p95_norm: 2.0, limit_events: 0, dp_hours: 24 });
    await insertVesselDay(db, skua, '2026-10-01', { p95_m: 9 });
    await db.pool.query(`INSERT INTO ts_station (vessel_id, t, dt, mode, dp_s, n) VALUES ($1, '2026-11-30T10:00:00Z', 60, 'auto_position', 60, 60)`, [skua]);
    const a = await flag(skua, { subject: 'vessel', metric: 'p95_norm', severity: 'alarm', opened: '2026-11-20' });
    await flag(skua, { subject: 'thruster:T1', metric: 'efficiency_index', severity: 'warning', opened: '2026-11-21' });
    await flag(skua, { subject: 'ref:GNSS1', metric: 'sd_m_median', severity: 'warning', opened: '2026-11-22', status: 'closed' });
    expect(a).toBeGreaterThan(0);

    const inputs = await getFleetRankingInputs(db.pool, { from: '2026-11-01', to: '2026-11-30' });
    expect(inputs.vessels.map((v) => [v.key, v.campaigns, v.lastSeen?.toISOString() ?? null])).toEqual([
      ['ardle-shag', ['north-spool'], null],
      ['kelvick-skua', ['north-spool'], '2026-11-30T10:00:00.000Z'],
    ]);
    // Sums of the figures present; median of 1.1, 1.2, 1.4, 2.0 is (1.2 + 1.4) / 2; p95 days by offset from 1 November.
    expect(inputs.windows).toEqual([
      {
        vessel: 'kelvick-skua',
        dpHours: 48,
        limitEvents: 4,
        p95NormMedian: expect.closeTo(1.3, 12),
        p95Days: '9:1.5:0,11:10:1,13:1.2:0',
      },
    ]);
    expect(inputs.openFlags.get('kelvick-skua')).toEqual({ alarm: 1, warning: 1 });
    expect(inputs.openFlags.has('ardle-shag')).toBe(false);
  });

  it('thruster wear: install + every day up to as-of; trailing rate over the window’s days with a figure', async () => {
    // T1: 100 h at install, service interval 1000 h (apiFleet).
    const day = (d: string, wear: number | null) =>
      db.pool.query(
        `INSERT INTO daily_thruster (vessel_id, unit_id, day, run_hours, starts, wear_hours, unbanded_run_s) VALUES ($1, 'T1', $2, 10, 0, $3, 0)`,
        [skua, d, wear],
      );
    await day('2026-06-01', 50); // before the window: counts in the total, not in the rate
    await day('2026-11-20', 4);
    await day('2026-11-21', null); // ran without load bands: adds nothing, not in the rate
    await day('2026-11-22', 8);
    await day('2026-12-05', 99); // after as-of
    const wear = await getThrusterWear(db.pool, '2026-11-30');
    const t1 = wear.find((w) => w.vessel === 'kelvick-skua' && w.unit === 'T1')!;
    expect(t1).toEqual({ vessel: 'kelvick-skua', unit: 'T1', serviceIntervalH: 1000, toServiceH: 1000 - (100 + 50 + 4 + 8), ratePerDay: 6 });
    const t2 = wear.find((w) => w.unit === 'T2')!;
    expect(t2).toMatchObject({ toServiceH: 2000, ratePerDay: null });
    expect(wear.filter((w) => w.vessel === 'ardle-shag')).toEqual([]);
  });

  it('range histogram: the element-wise sum of the range’s stored days', async () => {
    await insertVesselDay(db, shag, '2026-11-01', { err_hist: histogram({ 3: 10, 100: 1 }), samples: 11 });
    await insertVesselDay(db, shag, '2026-11-02', { err_hist: histogram({ 3: 5 }), samples: 5 });
    await insertVesselDay(db, shag, '2026-11-03', { err_hist: null, samples: 0 });
    await insertVesselDay(db, shag, '2026-11-04', { err_hist: histogram({ 7: 100 }), samples: 100 });
    const h = await getRangeHistogram(db.pool, 'ardle-shag', { from: '2026-11-01', to: '2026-11-03' });
    expect(h[3]).toBe(15);
    expect(h[100]).toBe(1);
    expect(h[7]).toBe(0);
  });

  it('track sample: the 24 h before the latest position up to the end of the fleet day, one per step', async () => {
    // Positions every second from 22:00 to 23:59:59 UTC on 28 March 2026; 23:00 UTC is already 29 March in Oslo (UTC+1).
    await db.pool.query(`SELECT holdfast_ensure_partitions('ts_track', '2026-03-01', '2026-04-01')`);
    await db.pool.query(
      `INSERT INTO ts_track (vessel_id, t, lat, lon, north_m, east_m)
       SELECT $1, t, 60, 5, 1.5, -0.5 FROM generate_series('2026-03-28T22:00:00Z'::timestamptz, '2026-03-28T23:59:59Z', interval '1 second') t`,
      [skua],
    );
    const oslo28 = await getTrackSample(db.pool, 'kelvick-skua', '2026-03-28', 'Europe/Oslo');
    expect(oslo28!.to.toISOString()).toBe('2026-03-28T22:59:59.000Z');
    // Slots of 45 s counted back from the latest position: the 3,599 s after the first one touch 80 slots,
    // plus the slot holding the first position itself.
    expect(oslo28!.points).toHaveLength(81);
    expect(oslo28!.points[0]).toEqual({ east: -0.5, north: 1.5 });
    const oslo29 = await getTrackSample(db.pool, 'kelvick-skua', '2026-03-29', 'Europe/Oslo');
    expect(oslo29!.to.toISOString()).toBe('2026-03-28T23:59:59.000Z');
    expect(oslo29!.points).toHaveLength(161); // 7,199 s: 160 slots + 1
    expect(await getTrackSample(db.pool, 'kelvick-skua', '2026-03-27', 'UTC')).toBeNull();
    expect(await getTrackSample(db.pool, 'ardle-shag', '2026-03-29', 'UTC')).toBeNull();
  });

  it('watchlist: live flags most severe then newest, filters, and the choices offered', async () => {
    const list = await getWatchlist(db.pool, { statuses: ['open', 'acknowledged'], order: 'severity' }, FLEET);
    expect(list.flags.map((f) => [f.severity, f.subject])).toEqual([
      ['alarm', 'vessel'],
      ['warning', 'thruster:T1'],
    ]);
    expect(list.total).toBe(2);
    const newest = await getWatchlist(db.pool, { statuses: ['open', 'acknowledged'], order: 'newest' }, FLEET);
    expect(newest.flags.map((f) => f.subject)).toEqual(['thruster:T1', 'vessel']);
    expect((await getWatchlist(db.pool, { statuses: ['open'], subjectKind: 'thruster', order: 'severity' }, FLEET)).total).toBe(1);
    expect((await getWatchlist(db.pool, { statuses: ['closed'], metric: 'sd_m_median', order: 'severity' }, FLEET)).total).toBe(1);
    expect((await getWatchlist(db.pool, { statuses: ['open'], vessel: 'ardle-shag', order: 'severity' }, FLEET)).total).toBe(0);
    expect(await getWatchlistChoices(db.pool, FLEET)).toEqual({
      vessels: [{ key: 'kelvick-skua', name: 'Kelvick Skua' }],
      metrics: ['efficiency_index', 'p95_norm', 'sd_m_median'],
    });
  });

  it('watchlist: a charterer reads that the shore team handled a flag, not who, nor their notes', async () => {
    await db.pool.query(
      `UPDATE flag SET closed_by = 'engineer@shore.example', closed_at = '2026-11-25T08:00:00Z', close_note = 'spoke to the chief engineer'
        WHERE metric = 'sd_m_median' AND status = 'closed'`,
    );
    const closed = { statuses: ['closed'] as WatchlistFilter['statuses'], order: 'severity' as const };
    const staff = (await getWatchlist(db.pool, closed, FLEET)).flags[0]!;
    expect([staff.closedBy, staff.closeNote]).toEqual(['engineer@shore.example', 'spoke to the chief engineer']);
    const charterer: Scope = { kind: 'campaigns', campaignKeys: new Set(['any']), windows: new Map([['kelvick-skua', [{ from: '2026-01-01', to: '2026-12-31' }]]]) };
    const seen = (await getWatchlist(db.pool, closed, charterer)).flags[0]!;
    expect([seen.id, seen.closedBy, seen.closeNote, seen.closeReason]).toEqual([staff.id, 'the shore team', null, 'dismissed']);
  });

  it('flag series: the daily figure of the flag’s subject, by a fixed map of metrics', async () => {
    await db.pool.query(`UPDATE daily_thruster SET efficiency_index = 0.9 WHERE vessel_id = $1 AND unit_id = 'T1' AND day = '2026-11-20'`, [skua]);
    const series = await getFlagSeries(db.pool, { vessel: 'kelvick-skua', subject: 'thruster:T1', metric: 'efficiency_index' }, { from: '2026-11-01', to: '2026-11-30' });
    expect(series).toEqual([
      { day: '2026-11-20', value: 0.9 },
      { day: '2026-11-21', value: null },
      { day: '2026-11-22', value: null },
    ]);
    const norm = await getFlagSeries(db.pool, { vessel: 'kelvick-skua', subject: 'vessel', metric: 'p95_norm' }, { from: '2026-11-01', to: '2026-11-30' });
    expect(norm).toEqual([
      { day: '2026-11-10', value: 1.1 },
      { day: '2026-11-12', value: 1.4 },
      { day: '2026-11-13', value: 1.2 },
      { day: '2026-11-14', value: 2 },
    ]);
    expect(hasSeries('made_up_metric', 'vessel')).toBe(false);
    expect(hasSeries('efficiency_index', 'vessel')).toBe(false);
    expect(await getFlagSeries(db.pool, { vessel: 'kelvick-skua', subject: 'vessel', metric: 'made_up_metric' }, { from: '2026-11-01', to: '2026-11-30' })).toBeNull();
  });

  it('register snapshot: what importFleet stored reads back as the same file (nothing to change)', async () => {
    const diff = registerDiff(await getRegisterSnapshot(db.pool), fleet);
    expect(diffCounts(diff)).toEqual({ vessels: { created: 0, updated: 0, unchanged: 2 }, campaigns: { created: 0, updated: 0, unchanged: 1 } });
  });

  it('vessel profile and campaigns list', async () => {
    const profile = await getVesselProfile(db.pool, 'kelvick-skua');
    expect(profile).toMatchObject({
      name: 'Kelvick Skua',
      dpClass: 2,
      watchCirclesM: [3, 5],
      thrusters: [
        { id: 'T1', kind: 'tunnel', ratedKw: 900, serviceIntervalH: 1000 },
        { id: 'T2', kind: 'azimuth', ratedKw: 1500, serviceIntervalH: 2000 },
        { id: 'T3', kind: 'azimuth', ratedKw: 1500, serviceIntervalH: 500 },
      ],
      refs: [
        { id: 'GNSS1', kind: 'gnss' },
        { id: 'HPR1', kind: 'hydroacoustic' },
      ],
      campaigns: [{ key: 'north-spool', charterer: 'Example Charterer', from: '2026-11-01', to: '2026-11-30' }],
    });
    expect(await getVesselProfile(db.pool, 'nope')).toBeNull();
    const campaigns = await listCampaigns(db.pool);
    expect(campaigns).toEqual([
      {
        key: 'north-spool',
        charterer: 'Example Charterer',
        from: '2026-11-01',
        to: '2026-11-30',
        siteName: 'Example Field',
        siteLat: 60.5,
        siteLon: 2.25,
        watchCirclesM: [2, 3.05],
        vessels: [
          { key: 'ardle-shag', name: 'Ardle Shag, "the Shag"' },
          { key: 'kelvick-skua', name: 'Kelvick Skua' },
        ],
      },
    ]);
  });

  it('webhooks: the flag job’s listing, or null without its table', async () => {
    expect(await listFleetWebhooks(db.pool)).toEqual([]);
    await db.pool.query(`INSERT INTO flag_webhook (url, secret) VALUES ('https://hooks.example/holdfast?token=abc', 's3cret')`);
    expect(await listFleetWebhooks(db.pool)).toEqual([
      { id: expect.any(Number), url: 'https://hooks.example/holdfast?token=abc', hasSecret: true, enabled: true, pending: 0, delivered: 0, lastError: null },
    ]);
    await db.pool.query('DROP TABLE flag_outbox, flag_webhook');
    expect(await listFleetWebhooks(db.pool)).toBeNull();
  });
});
