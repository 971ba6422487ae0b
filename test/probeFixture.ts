import type { Pool } from 'pg';
import { createApiToken } from '../lib/api/tokens';
import { assignCampaign, ensureOrganisation } from '../lib/auth/organisations';
import type { Role } from '../lib/auth/roles';
import { readFleetFile } from '../lib/register/fleetFile';
import { addDays } from '../lib/time/fleetDay';
import { registerFleet } from './helpers/fleet';

/**
 * The probe test's world (test/probe.test.ts), small enough to reason about
 * day by day, and its answer key written out by hand — not computed with
 * lib/auth/scope.ts, so the test checks the rule instead of repeating it.
 *
 * Three vessels, two campaigns of two organisations, overlapping on one
 * vessel and apart in time:
 *
 *   probe-own    probe-alpha, probe-bravo    2026-01-10 … 2026-01-20   organisation probe-org-own
 *   probe-other  probe-bravo, probe-charlie  2026-01-25 … 2026-02-05   organisation probe-org-other
 *
 * Every vessel has a daily row, a thruster row and a reference-system row on
 * every day from 2026-01-01 to 2026-02-10, so any day that leaks shows.
 */

export const FIRST_DAY = '2026-01-01';
export const LAST_DAY = '2026-02-10';
export const VESSELS = ['probe-alpha', 'probe-bravo', 'probe-charlie'] as const;
export type ProbeVessel = (typeof VESSELS)[number];
export const VESSEL_NAMES: Record<ProbeVessel, string> = { 'probe-alpha': 'Probe Alpha', 'probe-bravo': 'Probe Bravo', 'probe-charlie': 'Probe Charlie' };
export const CAMPAIGNS = { own: 'probe-own', other: 'probe-other' } as const;

/** Visible days per vessel, by hand: null = the whole fleet, every day. */
export type Windows = null | Partial<Record<ProbeVessel, { from: string; to: string }>>;
export const OWN_WINDOWS: Windows = { 'probe-alpha': { from: '2026-01-10', to: '2026-01-20' }, 'probe-bravo': { from: '2026-01-10', to: '2026-01-20' } };
export const OTHER_WINDOWS: Windows = { 'probe-bravo': { from: '2026-01-25', to: '2026-02-05' }, 'probe-charlie': { from: '2026-01-25', to: '2026-02-05' } };

/**
 * Five flags; which caller may see each is stated, not derived:
 * - inside: wholly inside probe-own's days → the own charterer sees it;
 * - straddling: opened inside probe-own but its window starts before → nobody of probe-own;
 * - otherBravo, otherCharlie: inside probe-other → the other charterer;
 * - closedInside: closed, inside probe-own → own charterer (status=all only; not on the live watchlist).
 */
export const FLAGS = {
  inside: { vessel: 'probe-alpha', from: '2026-01-11', to: '2026-01-19', status: 'open', seenBy: 'own' },
  // One live flag per vessel, subject and metric (flag_one_live_idx): this one is of a thruster.
  straddling: { vessel: 'probe-alpha', from: '2026-01-05', to: '2026-01-15', status: 'open', seenBy: null, subject: 'thruster:T1', metric: 'efficiency_index' },
  otherBravo: { vessel: 'probe-bravo', from: '2026-01-26', to: '2026-02-04', status: 'open', seenBy: 'other' },
  otherCharlie: { vessel: 'probe-charlie', from: '2026-01-26', to: '2026-02-04', status: 'acknowledged', seenBy: 'other' },
  closedInside: { vessel: 'probe-bravo', from: '2026-01-12', to: '2026-01-18', status: 'closed', seenBy: 'own' },
} as const;
export type FlagName = keyof typeof FLAGS;
/** Each flag's explanation is unique text, so a page that leaks a flag shows it. */
export const flagText = (name: FlagName) => `probe flag ${name} explained`;

/** The one station record in the world: inside probe-own's days, so only fleet users and the own charterer see it. */
export const ALPHA_LAST_SEEN = '2026-01-15T12:00:00.000Z';

export function daysBetween(from: string, to: string): string[] {
  const days: string[] = [];
  for (let d = from; d <= to; d = addDays(d, 1)) days.push(d);
  return days;
}

export async function buildProbeWorld(url: string, pool: Pool): Promise<{ flagIds: Record<FlagName, number> }> {
  const vessel = (key: ProbeVessel) => ({
    key,
    name: VESSEL_NAMES[key],
    type: 'supply',
    dp_class: 2,
    watch_circles_m: [3, 5],
    heading_limits_deg: [3, 5],
    thrusters: [{ id: 'T1', kind: 'tunnel', rated_kw: 900, service_interval_h: 1000 }],
    buses: [],
    refs: [{ id: 'GNSS1', kind: 'gnss' }],
  });
  const campaign = (key: string, vessels: ProbeVessel[], from: string, to: string) => ({
    key,
    charterer: `Charterer of ${key}`,
    vessels,
    from,
    to,
    site: { name: 'Probe Field', lat: 58.2, lon: 1.4 },
    watch_circles_m: [3],
  });
  await registerFleet(
    url,
    readFleetFile(
      JSON.stringify({
        v: 1,
        vessels: VESSELS.map(vessel),
        campaigns: [
          campaign(CAMPAIGNS.own, ['probe-alpha', 'probe-bravo'], '2026-01-10', '2026-01-20'),
          campaign(CAMPAIGNS.other, ['probe-bravo', 'probe-charlie'], '2026-01-25', '2026-02-05'),
        ],
      }),
    ),
  );
  const own = await ensureOrganisation(pool, 'probe-org-own', 'Own Charterer Ltd');
  const other = await ensureOrganisation(pool, 'probe-org-other', 'Other Charterer Ltd');
  await assignCampaign(pool, CAMPAIGNS.own, own.id);
  await assignCampaign(pool, CAMPAIGNS.other, other.id);

  await pool.query(
    `INSERT INTO daily_vessel (vessel_id, day, station_records, dp_intervals, dp_hours, samples)
     SELECT v.id, d::date, 1440, 1440, 24, 0 FROM vessel v, generate_series($1::date, $2::date, interval '1 day') d`,
    [FIRST_DAY, LAST_DAY],
  );
  await pool.query(
    `INSERT INTO daily_thruster (vessel_id, unit_id, day, run_hours, starts, unbanded_run_s, wear_hours)
     SELECT v.id, 'T1', d::date, 10, 2, 0, 8 FROM vessel v, generate_series($1::date, $2::date, interval '1 day') d`,
    [FIRST_DAY, LAST_DAY],
  );
  await pool.query(
    `INSERT INTO daily_ref (vessel_id, unit_id, day, kind, online_hours, weight_mean, sd_m_median, rejections)
     SELECT v.id, 'GNSS1', d::date, 'gnss', 24, 0.5, 0.2, 0 FROM vessel v, generate_series($1::date, $2::date, interval '1 day') d`,
    [FIRST_DAY, LAST_DAY],
  );
  // A month long past: its partition is made as the ingest writer makes one for late data.
  await pool.query(`SELECT holdfast_ensure_partitions('ts_station', $1, $1)`, [ALPHA_LAST_SEEN]);
  await pool.query(
    `INSERT INTO ts_station (vessel_id, t, dt, mode, dp_s, n) SELECT id, $1, 60, 'auto_position', 60, 60 FROM vessel WHERE key = 'probe-alpha'`,
    [ALPHA_LAST_SEEN],
  );

  const flagIds = {} as Record<FlagName, number>;
  for (const [name, f] of Object.entries(FLAGS) as [FlagName, (typeof FLAGS)[FlagName]][]) {
    const { rows } = await pool.query<{ id: string }>(
      `INSERT INTO flag (vessel_id, subject, metric, method, severity, opened_day, window_from, window_to,
                         statistic, statistic_name, explanation, status, close_reason, last_evaluated_day)
       SELECT id, $6, $7, 'mann_kendall', 'warning', $3::date, $2::date, $3::date, 2.5, 'kendall_z', $4, $5,
              CASE WHEN $5 = 'closed' THEN 'resolved' END, $3::date
         FROM vessel WHERE key = $1
       RETURNING id`,
      [f.vessel, f.from, f.to, flagText(name), f.status, 'subject' in f ? f.subject : 'vessel', 'metric' in f ? f.metric : 'p95_norm'],
    );
    flagIds[name] = Number(rows[0]!.id);
  }
  return { flagIds };
}

/** One caller of the probe: a signed-in user or an API token, with what it may see and do, by hand. */
export interface ProbeCaller {
  name: string;
  kind: 'user' | 'token';
  role: Role;
  /** For charterers: which organisation (user) or campaign (token). */
  tenant: 'own' | 'other' | null;
  windows: Windows;
}

export const ROLES_BY_TRUST: Role[] = ['admin', 'fleet_manager', 'shore_engineer'];

export function probeCallers(): ProbeCaller[] {
  const callers: ProbeCaller[] = [];
  for (const kind of ['user', 'token'] as const) {
    for (const role of ROLES_BY_TRUST) callers.push({ name: `${role} ${kind}`, kind, role, tenant: null, windows: null });
    callers.push({ name: `charterer ${kind} of probe-own`, kind, role: 'charterer', tenant: 'own', windows: OWN_WINDOWS });
    callers.push({ name: `charterer ${kind} of probe-other`, kind, role: 'charterer', tenant: 'other', windows: OTHER_WINDOWS });
  }
  return callers;
}

export async function probeToken(pool: Pool, caller: ProbeCaller): Promise<string> {
  const campaignKey = caller.tenant ? CAMPAIGNS[caller.tenant] : undefined;
  return (await createApiToken(pool, { name: caller.name, role: caller.role, campaignKey })).token;
}

// ---- the answer key, from the windows above --------------------------------

export function visibleVessels(caller: ProbeCaller): ProbeVessel[] {
  return caller.windows === null ? [...VESSELS] : VESSELS.filter((v) => caller.windows![v]);
}

export function visibleDays(caller: ProbeCaller, vessel: ProbeVessel, from = FIRST_DAY, to = LAST_DAY): string[] {
  const all = daysBetween(from, to);
  if (caller.windows === null) return all;
  const w = caller.windows[vessel];
  return w ? all.filter((d) => w.from <= d && d <= w.to) : [];
}

export function seesFlag(caller: ProbeCaller, name: FlagName): boolean {
  return caller.windows === null || FLAGS[name].seenBy === caller.tenant;
}

export function seesCampaign(caller: ProbeCaller, key: string): boolean {
  return caller.windows === null || CAMPAIGNS[caller.tenant!] === key;
}

/** Text that must never reach this caller, whatever it asks: vessels, campaigns and flags of others. */
export function forbiddenText(caller: ProbeCaller): string[] {
  if (caller.windows === null) return [];
  const seen = visibleVessels(caller);
  return [
    ...VESSELS.filter((v) => !seen.includes(v)).flatMap((v) => [v, VESSEL_NAMES[v]]),
    ...Object.values(CAMPAIGNS).filter((k) => !seesCampaign(caller, k)),
    ...(Object.keys(FLAGS) as FlagName[]).filter((f) => !seesFlag(caller, f)).map(flagText),
  ];
}
