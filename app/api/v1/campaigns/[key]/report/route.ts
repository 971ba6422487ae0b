import { notFound } from '../../../../../../lib/api/errors';
import { flattenRecords } from '../../../../../../lib/api/flatten';
import { parseFormat } from '../../../../../../lib/api/params';
import { getCampaignReport } from '../../../../../../lib/api/queries/campaignReport';
import { limitKey } from '../../../../../../lib/metrics/withinLimit';
import { renderList } from '../../../../../../lib/api/render';
import { apiRoute } from '../../../../../../lib/api/route';
import { columnsOf } from '../../../../../../lib/api/schemas';

// Fleet data is read on every request, never prerendered at build time.
export const dynamic = 'force-dynamic';

export const GET = apiRoute<{ key: string }>(async ({ search, params, ctx }) => {
  const format = parseFormat(search);
  const report = await getCampaignReport(ctx.db, params.key, ctx.today());
  if (!report) throw notFound('campaign', params.key);
  return renderList(
    format,
    () => report,
    () => ({
      table: flattenRecords(report.vessels, columnsOf('CampaignVesselFigures'), {
        within_pct: report.campaign.watch_circles_m.map(limitKey),
      }),
      fileName: `campaign-${report.campaign.key}-${report.as_of}`,
    }),
  );
});
