import type { Queryable } from '../api/context';

/**
 * The register's view of one vessel for its page: identity, limits, units,
 * campaigns, and the start of its latest station record (as the API's
 * last_seen). null when no vessel has the key.
 */
export interface VesselProfile {
  key: string;
  name: string;
  type: string;
  dpClass: number;
  watchCirclesM: number[];
  headingLimitsDeg: number[];
  lastSeen: Date | null;
  thrusters: { id: string; kind: string; ratedKw: number; serviceIntervalH: number }[];
  buses: { id: string; ratedKw: number }[];
  refs: { id: string; kind: string }[];
  campaigns: { key: string; charterer: string; from: string; to: string }[];
}

const SQL = `
  SELECT v.key, v.name, v.type, v.dp_class, v.watch_circles_m, v.heading_limits_deg,
         (SELECT max(s.t) FROM ts_station s WHERE s.vessel_id = v.id) AS last_seen,
         coalesce((SELECT json_agg(json_build_object('id', t.unit_id, 'kind', t.kind, 'ratedKw', t.rated_kw,
                                                     'serviceIntervalH', t.service_interval_h) ORDER BY t.unit_id)
                     FROM thruster t WHERE t.vessel_id = v.id), '[]') AS thrusters,
         coalesce((SELECT json_agg(json_build_object('id', b.unit_id, 'ratedKw', b.rated_kw) ORDER BY b.unit_id)
                     FROM bus b WHERE b.vessel_id = v.id), '[]') AS buses,
         coalesce((SELECT json_agg(json_build_object('id', r.unit_id, 'kind', r.kind) ORDER BY r.unit_id)
                     FROM ref_system r WHERE r.vessel_id = v.id), '[]') AS refs,
         coalesce((SELECT json_agg(json_build_object('key', c.key, 'charterer', c.charterer,
                                                     'from', to_char(c.from_day, 'YYYY-MM-DD'),
                                                     'to', to_char(c.to_day, 'YYYY-MM-DD')) ORDER BY c.from_day, c.key)
                     FROM campaign_vessel cv JOIN campaign c ON c.id = cv.campaign_id
                    WHERE cv.vessel_id = v.id), '[]') AS campaigns
    FROM vessel v
   WHERE v.key = $1`;

export async function getVesselProfile(db: Queryable, key: string): Promise<VesselProfile | null> {
  const { rows } = await db.query(SQL, [key]);
  const r = rows[0];
  if (!r) return null;
  return {
    key: r.key,
    name: r.name,
    type: r.type,
    dpClass: Number(r.dp_class),
    watchCirclesM: r.watch_circles_m,
    headingLimitsDeg: r.heading_limits_deg,
    lastSeen: r.last_seen,
    thrusters: r.thrusters,
    buses: r.buses,
    refs: r.refs,
    campaigns: r.campaigns,
  };
}
