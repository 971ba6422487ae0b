import type { Queryable } from '../api/context';
import type { FleetFile } from '../register/fleetFile';

/**
 * The stored fleet register in the shape of a fleet-v1 file, so the admin
 * page can compare it field by field with an uploaded file
 * (lib/web/registerDiff.ts) before and after importing it.
 */
const VESSELS_SQL = `
  SELECT v.key, v.name, v.type, v.dp_class, v.watch_circles_m, v.heading_limits_deg,
         coalesce((SELECT json_agg(json_build_object('id', t.unit_id, 'kind', t.kind, 'rated_kw', t.rated_kw,
                                                     'diameter_m', t.diameter_m, 'life_exponent', t.life_exponent,
                                                     'service_interval_h', t.service_interval_h,
                                                     'wear_h_at_install', t.wear_h_at_install))
                     FROM thruster t WHERE t.vessel_id = v.id), '[]') AS thrusters,
         coalesce((SELECT json_agg(json_build_object('id', b.unit_id, 'rated_kw', b.rated_kw)) FROM bus b WHERE b.vessel_id = v.id), '[]') AS buses,
         coalesce((SELECT json_agg(json_build_object('id', r.unit_id, 'kind', r.kind)) FROM ref_system r WHERE r.vessel_id = v.id), '[]') AS refs
    FROM vessel v ORDER BY v.key`;

const CAMPAIGNS_SQL = `
  SELECT c.key, c.charterer, to_char(c.from_day, 'YYYY-MM-DD') AS "from", to_char(c.to_day, 'YYYY-MM-DD') AS "to",
         json_build_object('name', c.site_name, 'lat', c.site_lat, 'lon', c.site_lon) AS site, c.watch_circles_m,
         coalesce((SELECT array_agg(v.key ORDER BY v.key) FROM campaign_vessel cv JOIN vessel v ON v.id = cv.vessel_id
                    WHERE cv.campaign_id = c.id), '{}') AS vessels
    FROM campaign c ORDER BY c.key`;

export async function getRegisterSnapshot(db: Queryable): Promise<FleetFile> {
  const [vessels, campaigns] = await Promise.all([db.query(VESSELS_SQL), db.query(CAMPAIGNS_SQL)]);
  return {
    v: 1,
    vessels: vessels.rows.map((v) => ({ ...v, dp_class: Number(v.dp_class) })) as FleetFile['vessels'],
    campaigns: campaigns.rows as FleetFile['campaigns'],
  };
}
