import { notFound } from '../../../../lib/api/errors';
import { flattenRecords } from '../../../../lib/api/flatten';
import { parseChoice, parseFormat } from '../../../../lib/api/params';
import { FLAG_STATUSES, listFlags } from '../../../../lib/api/queries/listFlags';
import { renderList } from '../../../../lib/api/render';
import { apiRoute, type NoParams } from '../../../../lib/api/route';
import { columnsOf } from '../../../../lib/api/schemas';
import { requireVessel, visibleFlags } from '../../../../lib/api/scoped';

// Fleet data is read on every request, never prerendered at build time.
export const dynamic = 'force-dynamic';

export const GET = apiRoute<NoParams>(async ({ search, ctx, scope }) => {
  const status = parseChoice(search, 'status', [...FLAG_STATUSES, 'all'], 'open');
  const vesselKey = search.get('vessel') ?? undefined;
  const format = parseFormat(search);
  if (vesselKey !== undefined) requireVessel(scope, vesselKey);
  const all = await listFlags(ctx.db, { status, vesselKey });
  if (!all) throw notFound('vessel', vesselKey ?? '');
  // A charterer sees a flag only when every day of its window is visible (canSeeSpan).
  const flags = visibleFlags(scope, all);
  return renderList(
    format,
    () => ({ flags }),
    () => ({ table: flattenRecords(flags, columnsOf('Flag')), fileName: `flags-${status}` }),
  );
});
