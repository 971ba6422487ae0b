import Link from 'next/link';
import { getFleetRankingInputs } from '../../../lib/queries/fleetRanking';
import type { PageContext } from '../../../lib/web/context';
import { fleetThrusterWear, WEAR_TTL_MS } from '../../../lib/web/fleetThrusterWear';
import { rankFleet, scoreWindow } from '../../../lib/web/fleetRanking';
import { fleetPage, type FleetView } from '../../../lib/web/fleetView';
import { queryString } from '../../../lib/web/searchParams';
import FleetFilters from './FleetFilters';
import FleetTable from './FleetTable';
import ScoreFormula from './ScoreFormula';

/** The ranking itself: read, score, filter, sort, page, draw. Streams in under the page heading. */
export default async function FleetRanking({ ctx, view, today, now }: { ctx: PageContext; view: FleetView; today: string; now: Date }) {
  const window = scoreWindow(today);
  const [inputs, thrusters] = await Promise.all([getFleetRankingInputs(ctx.db, window), fleetThrusterWear(ctx.db, today)]);
  const rows = rankFleet({ today, now, ...inputs, thrusters });
  if (rows.length === 0) {
    return (
      <section className="empty" data-testid="empty-state">
        <p>
          <strong>No vessels registered yet</strong> — import a fleet register on the <Link href="/admin/register">Admin</Link> page
          or with <code>holdfast fleet import FILE</code>
        </p>
      </section>
    );
  }
  const page = fleetPage(rows, view);
  const types = [...new Set(rows.map((r) => r.type))].sort();
  const campaigns = [...new Set(rows.flatMap((r) => r.campaigns))].sort();
  const stale = rows.filter((r) => r.stale).length;
  const filtered = view.type !== undefined || view.dpClass !== undefined || view.campaign !== undefined;
  const pageLink = (n: number) =>
    `/${queryString({ type: view.type, class: view.dpClass, campaign: view.campaign, sort: view.sort, dir: view.dir, page: n === 1 ? undefined : n })}`;

  return (
    <>
      <FleetFilters view={view} types={types} campaigns={campaigns} />
      <p className="summary" data-testid="summary">
        <span>
          {rows.length} {rows.length === 1 ? 'vessel' : 'vessels'}
        </span>
        {filtered ? <span>{page.matching} match the filters</span> : null}
        <span>
          {stale} stale <span className="summary__note">(no station record in the last 15 min)</span>
        </span>
      </p>
      {page.rows.length === 0 ? (
        <section className="empty" data-testid="no-match">
          <p>
            <strong>No vessel matches these filters.</strong> <Link href="/">Show the whole fleet</Link>
          </p>
        </section>
      ) : (
        <FleetTable rows={page.rows} view={view} now={now} />
      )}
      {page.pages > 1 ? (
        <nav className="pager" aria-label="Pages">
          {page.page > 1 ? <Link href={pageLink(page.page - 1)}>← Previous</Link> : null}
          <span>
            Page {page.page} of {page.pages}
          </span>
          {page.page < page.pages ? <Link href={pageLink(page.page + 1)}>Next →</Link> : null}
        </nav>
      ) : null}
      <p className="table-note">
        Thruster service figures on this page are at most {WEAR_TTL_MS / 60_000} minutes old; each vessel&apos;s page reads them
        live. A dash is a figure that cannot be worked out (no data), never zero.
      </p>
      <ScoreFormula />
    </>
  );
}
