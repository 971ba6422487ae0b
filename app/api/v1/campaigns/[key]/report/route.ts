import { notFound } from '../../../../../../lib/api/errors';
import { flattenRecords } from '../../../../../../lib/api/flatten';
import { parseFormat } from '../../../../../../lib/api/params';
import { getCampaignReport } from '../../../../../../lib/api/queries/campaignReport';
import { limitKey } from '../../../../../../lib/metrics/withinLimit';
import { renderList } from '../../../../../../lib/api/render';
import { apiRoute } from '../../../../../../lib/api/route';
import { columnsOf } from '../../../../../../lib/api/schemas';
import { canSeeCampaign } from '../../../../../../lib/auth/scope';

// Fleet data is read on every request, never prerendered at build time.
export const dynamic = 'force-dynamic';

export const GET = apiRoute<{ key: string }>(async ({ search, params, ctx, scope }) => {
  const format = parseFormat(search);
  // Another organisation's campaign is unknown to a charterer (404, not 403).
  if (!canSeeCampaign(scope, params.key)) throw notFound('campaign', params.key);
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
