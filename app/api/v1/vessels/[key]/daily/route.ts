import { vesselDailyRoute } from '../../../../../../lib/api/dailyRoute';
import { getVesselDaily } from '../../../../../../lib/api/queries/vesselDaily';

// Fleet data is read on every request, never prerendered at build time.
export const dynamic = 'force-dynamic';

export const GET = vesselDailyRoute({ query: getVesselDaily, item: 'VesselDay', name: 'daily' });
