import type { CampaignReport } from '../api/queries/campaignReport';
import { limitKey } from '../metrics/withinLimit';
import { flattenRecords, type CsvTable } from '../api/flatten';
import { columnsOf } from '../api/schemas';

/**
 * The campaign report as CSV rows, built exactly as the API's
 * `GET /api/v1/campaigns/{key}/report?format=csv` builds them (same columns
 * from the published schema, same flattening of within_pct, same file
 * name), so the page's download and the API answer hold the same text.
 */
export function campaignCsv(report: CampaignReport): { table: CsvTable; fileName: string } {
  return {
    table: flattenRecords(report.vessels, columnsOf('CampaignVesselFigures'), {
      within_pct: report.campaign.watch_circles_m.map(limitKey),
    }),
    fileName: `campaign-${report.campaign.key}-${report.as_of}`,
  };
}
