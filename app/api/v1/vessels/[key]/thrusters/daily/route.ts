import { vesselDailyRoute } from '../../../../../../../lib/api/dailyRoute';
import { getThrusterDaily } from '../../../../../../../lib/api/queries/thrusterDaily';

// Fleet data is read on every request, never prerendered at build time.
export const dynamic = 'force-dynamic';

export const GET = vesselDailyRoute({ query: getThrusterDaily, item: 'ThrusterDay', name: 'thrusters-daily' });
