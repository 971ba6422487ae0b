import { getCampaignReport, type CampaignReport } from '../../../lib/api/queries/campaignReport';
import { pageContext, type PageContext } from '../../../lib/web/context';

/**
 * The campaign report's downloads (CSV, PDF): read the report as the page
 * does, or answer 404 in plain text for an unknown campaign.
 */
export async function reportDownload(
  params: Promise<{ key: string }>,
  render: (report: CampaignReport, ctx: PageContext) => Response,
): Promise<Response> {
  const { key } = await params;
  const ctx = pageContext();
  const report = await getCampaignReport(ctx.db, key, ctx.today());
  if (!report) {
    return new Response(`No campaign has the key "${key.slice(0, 64)}".\n`, { status: 404, headers: { 'content-type': 'text/plain; charset=utf-8' } });
  }
  return render(report, ctx);
}
