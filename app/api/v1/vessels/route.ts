import { flattenRecords } from '../../../../lib/api/flatten';
import { parseFormat } from '../../../../lib/api/params';
import { listVessels } from '../../../../lib/api/queries/listVessels';
import { renderList } from '../../../../lib/api/render';
import { apiRoute, type NoParams } from '../../../../lib/api/route';
import { columnsOf } from '../../../../lib/api/schemas';
import { scopedVessels } from '../../../../lib/api/queries/scopedVessels';

// Fleet data is read on every request, never prerendered at build time.
export const dynamic = 'force-dynamic';

export const GET = apiRoute<NoParams>(async ({ search, ctx, scope }) => {
  const format = parseFormat(search);
  const vessels = await scopedVessels(ctx, scope, await listVessels(ctx.db));
  return renderList(
    format,
    () => ({ vessels }),
    () => ({ table: flattenRecords(vessels, columnsOf('Vessel')), fileName: 'vessels' }),
  );
});
