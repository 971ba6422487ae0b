import { vesselDailyRoute } from '../../../../../../../lib/api/dailyRoute';
import { getRefDaily } from '../../../../../../../lib/api/queries/refDaily';

// Fleet data is read on every request, never prerendered at build time.
export const dynamic = 'force-dynamic';

export const GET = vesselDailyRoute({ query: getRefDaily, item: 'RefDay', name: 'refs-daily' });
