import { csvResponse } from '../../../../lib/api/render';
import { campaignCsv } from '../../../../lib/web/campaignCsv';
import { reportDownload } from '../reportDownload';

// Fleet data is read on every request, never prerendered at build time.
export const dynamic = 'force-dynamic';

/** The campaign report's CSV download for the web page (the API's CSV, for the signed-in reader). */
export function GET(_request: Request, { params }: { params: Promise<{ key: string }> }): Promise<Response> {
  return reportDownload(params, (report) => {
    const { table, fileName } = campaignCsv(report);
    return csvResponse(table, fileName);
  });
}
