import { notFound } from '../../../../../../lib/api/errors';
import { flattenRecords } from '../../../../../../lib/api/flatten';
import { parseFormat } from '../../../../../../lib/api/params';
import { getThrusterService } from '../../../../../../lib/api/queries/thrusterService';
import { renderList } from '../../../../../../lib/api/render';
import { apiRoute } from '../../../../../../lib/api/route';
import { columnsOf } from '../../../../../../lib/api/schemas';
import { ApiError } from '../../../../../../lib/api/errors';
import { requireVessel } from '../../../../../../lib/api/scoped';

// Fleet data is read on every request, never prerendered at build time.
export const dynamic = 'force-dynamic';

export const GET = apiRoute<{ key: string }>(async ({ search, params, ctx, scope }) => {
  const format = parseFormat(search);
  requireVessel(scope, params.key);
  // Lifetime wear sums every day since installation, most of them outside any
  // campaign: a charterer may read the days of its campaigns (thrusters/daily), not this.
  if (scope.kind !== 'fleet') throw new ApiError('forbidden', 'thruster wear totals cover days outside your campaigns; read thrusters/daily instead');
  const service = await getThrusterService(ctx.db, params.key, ctx.today());
  if (!service) throw notFound('vessel', params.key);
  return renderList(
    format,
    () => service,
    () => ({
      table: flattenRecords(service.thrusters, columnsOf('ThrusterService')),
      fileName: `${service.vessel}-thrusters-${service.as_of}`,
    }),
  );
});
