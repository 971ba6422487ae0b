import type { Queryable } from '../api/context';

/** Every campaign with its vessels, by start day (newest first) then key. */
export interface CampaignListItem {
  key: string;
  charterer: string;
  from: string;
  to: string;
  siteName: string;
  siteLat: number;
  siteLon: number;
  watchCirclesM: number[];
  vessels: { key: string; name: string }[];
}

const SQL = `
  SELECT c.key, c.charterer, to_char(c.from_day, 'YYYY-MM-DD') AS "from", to_char(c.to_day, 'YYYY-MM-DD') AS "to",
         c.site_name AS "siteName", c.site_lat AS "siteLat", c.site_lon AS "siteLon", c.watch_circles_m AS "watchCirclesM",
         coalesce((SELECT json_agg(json_build_object('key', v.key, 'name', v.name) ORDER BY v.name, v.key)
                     FROM campaign_vessel cv JOIN vessel v ON v.id = cv.vessel_id
                    WHERE cv.campaign_id = c.id), '[]') AS vessels
    FROM campaign c
   ORDER BY c.from_day DESC, c.key`;

export async function listCampaigns(db: Queryable): Promise<CampaignListItem[]> {
  const { rows } = await db.query<CampaignListItem>(SQL);
  return rows;
}
