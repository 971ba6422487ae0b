import { campaignPdf } from '../../../../lib/web/pdf/campaignPdf';
import { reportDownload } from '../reportDownload';

export const dynamic = 'force-dynamic';

/**
 * The campaign report as a PDF, written in-process by lib/web/pdf (no
 * browser, no external service). Same figures as the page and the CSV:
 * all three read getCampaignReport.
 */
export function GET(_request: Request, { params }: { params: Promise<{ key: string }> }): Promise<Response> {
  return reportDownload(params, (report, ctx) => {
    const pdf = campaignPdf({ report, timeZone: ctx.timeZone, generatedAt: new Date() });
    return new Response(new Uint8Array(pdf), {
      status: 200,
      headers: {
        'content-type': 'application/pdf',
        'content-disposition': `attachment; filename="campaign-${report.campaign.key}-${report.as_of}.pdf"`,
        'content-length': String(pdf.length),
        'cache-control': 'no-store',
      },
    });
  });
}
