import { getCampaignReport, type CampaignReport } from '../../../lib/api/queries/campaignReport';
import { canSeeCampaign } from '../../../lib/auth/scope';
import { pageContext, type PageContext } from '../../../lib/web/context';

/**
 * The campaign report's downloads (CSV, PDF): read the report as the page
 * does, or answer 404 in plain text for an unknown campaign or one outside
 * the reader's scope. Without a session the reader is sent to /signin.
 */
export async function reportDownload(
  params: Promise<{ key: string }>,
  render: (report: CampaignReport, ctx: PageContext) => Response,
): Promise<Response> {
  const { key } = await params;
  const ctx = await pageContext();
  // Out of the reader's scope answers as an unknown key does (no existence leak).
  const report = canSeeCampaign(ctx.scope, key) ? await getCampaignReport(ctx.db, key, ctx.today()) : null;
  if (!report) {
    return new Response(`No campaign has the key "${key.slice(0, 64)}".\n`, { status: 404, headers: { 'content-type': 'text/plain; charset=utf-8' } });
  }
  return render(report, ctx);
}
