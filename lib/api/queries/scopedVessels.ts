import { canSeeVessel, type Scope } from '../../auth/scope';
import type { ApiContext } from '../context';
import { visibleFlags, visibleInstant } from '../scoped';
import { listFlags } from './listFlags';
import type { VesselItem } from './listVessels';

/**
 * The vessel list as the caller may see it. The whole fleet as read; for a
 * charterer only its vessels, `last_seen` only when that day is visible
 * (else null: it would tell what the vessel did outside the campaign), and
 * `open_flags` counting only the flags it may see.
 */
export async function scopedVessels(ctx: ApiContext, scope: Scope, vessels: VesselItem[]): Promise<VesselItem[]> {
  if (scope.kind === 'fleet') return vessels;
  const mine = vessels.filter((v) => canSeeVessel(scope, v.key));
  if (mine.length === 0) return [];
  const live = [...((await listFlags(ctx.db, { status: 'open' })) ?? []), ...((await listFlags(ctx.db, { status: 'acknowledged' })) ?? [])];
  const seen = visibleFlags(scope, live);
  return mine.map((v) => {
    const lastSeen = visibleInstant(scope, v.key, v.last_seen ? new Date(v.last_seen) : null, ctx.timeZone);
    return { ...v, last_seen: lastSeen ? lastSeen.toISOString() : null, open_flags: seen.filter((f) => f.vessel === v.key).length };
  });
}
