import type { Metadata } from 'next';
import { Suspense } from 'react';
import { longDay } from '../lib/charts/days';
import { fleetPageContext } from '../lib/web/context';
import { scoreWindow } from '../lib/web/fleetRanking';
import { parseFleetView } from '../lib/web/fleetView';
import type { RawSearchParams } from '../lib/web/searchParams';
import AutoRefresh from './components/AutoRefresh';
import FleetRanking from './components/fleet/FleetRanking';
import Loading from './components/Loading';

// Read the store on every request: the ranking moves as daily figures are recomputed.
export const dynamic = 'force-dynamic';

export const metadata: Metadata = { title: 'Fleet' };

const REFRESH_SECONDS = 60;

export default async function FleetPage({ searchParams }: { searchParams: Promise<RawSearchParams> }) {
  const view = parseFleetView(await searchParams);
  const ctx = await fleetPageContext();
  const now = new Date();
  const today = ctx.today();
  const window = scoreWindow(today);
  return (
    <>
      <div className="page-head">
        <div>
          <h1>Fleet</h1>
          <p className="page-head__lede">
            Vessels ranked by station-keeping health over the last 30 fleet days ({longDay(window.from)} to {longDay(window.to)}).{' '}
            <strong>Days are fleet days in {ctx.timeZone}.</strong> <a href="#score-formula">How the score is worked out</a>
          </p>
        </div>
        <AutoRefresh renderedAt={now.toISOString()} everySeconds={REFRESH_SECONDS} />
      </div>
      <Suspense fallback={<Loading />}>
        <FleetRanking ctx={ctx} view={view} today={today} now={now} />
      </Suspense>
    </>
  );
}
