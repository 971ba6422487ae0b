import type { Metadata } from 'next';
import Link from 'next/link';
import { flagChart, flagChartRange } from '../../lib/charts/flagChart';
import { getFlagSeries } from '../../lib/queries/flagSeries';
import { getWatchlist, getWatchlistChoices, WATCHLIST_LIMIT } from '../../lib/queries/watchlist';
import { can } from '../../lib/auth/permissions';
import { pageContext } from '../../lib/web/context';
import { visibleChartRange } from '../../lib/web/scopedRange';
import { FLAG_METRICS, metricInfo, subjectLabel } from '../../lib/web/flagMetrics';
import type { RawSearchParams } from '../../lib/web/searchParams';
import { parseWatchlistView, STATUS_VIEWS } from '../../lib/web/watchlistView';
import AutoRefresh from '../components/AutoRefresh';
import FilterActions from '../components/FilterActions';
import SelectFilter from '../components/SelectFilter';
import FlagCard from '../components/watchlist/FlagCard';

export const dynamic = 'force-dynamic';
export const metadata: Metadata = { title: 'Watchlist' };

const REFRESH_SECONDS = 60;
const STATUS_LABEL: Record<(typeof STATUS_VIEWS)[number], string> = {
  live: 'Open and acknowledged',
  open: 'Open',
  acknowledged: 'Acknowledged',
  closed: 'Closed',
};

export default async function WatchlistPage({ searchParams }: { searchParams: Promise<RawSearchParams> }) {
  const view = parseWatchlistView(await searchParams);
  const ctx = await pageContext();
  const today = ctx.today();
  const now = new Date();
  const [{ flags, total }, choices] = await Promise.all([getWatchlist(ctx.db, view.filter, ctx.scope), getWatchlistChoices(ctx.db, ctx.scope)]);
  const charts = await Promise.all(
    flags.map(async (f) => {
      const info = metricInfo(f.metric);
      if (!info) return null;
      const range = visibleChartRange(ctx.scope, f.vessel, flagChartRange(f.windowFrom, f.windowTo, today), f.windowFrom);
      if (!range) return null;
      const rows = await getFlagSeries(ctx.db, f, range);
      if (!rows) return null;
      return flagChart({
        id: `flag-${f.id}-chart`,
        metric: info,
        subjectLabel: subjectLabel(f.subject),
        windowFrom: f.windowFrom,
        windowTo: f.windowTo,
        range,
        timeZone: ctx.timeZone,
        rows,
      });
    }),
  );
  const canAct = can(ctx.principal, 'flag.acknowledge');
  const filtered = view.filter.vessel || view.filter.subjectKind || view.filter.metric || view.status !== 'live';

  return (
    <>
      <div className="page-head">
        <div>
          <h1>Watchlist</h1>
          <p className="page-head__lede">
            Trend flags raised by the daily checks: what is drifting, since when, and why the test thinks so. Acknowledge what you
            are looking at; close it as resolved or dismissed, with a note. <strong>Days are fleet days in {ctx.timeZone}.</strong>
          </p>
        </div>
        <AutoRefresh renderedAt={now.toISOString()} everySeconds={REFRESH_SECONDS} />
      </div>

      <form className="filters" method="get" action="/watchlist" aria-label="Filter flags" data-testid="watchlist-filters">
        <SelectFilter id="filter-status" name="status" label="Status" value={view.status} options={STATUS_VIEWS.map((s) => ({ value: s, label: STATUS_LABEL[s] }))} />
        <SelectFilter
          id="filter-vessel"
          name="vessel"
          label="Vessel"
          value={view.filter.vessel ?? ''}
          options={[{ value: '', label: 'All vessels' }, ...choices.vessels.map((v) => ({ value: v.key, label: v.name }))]}
        />
        <SelectFilter
          id="filter-subject"
          name="subject"
          label="Subject"
          value={view.filter.subjectKind ?? ''}
          options={[
            { value: '', label: 'Any' },
            { value: 'vessel', label: 'Vessel' },
            { value: 'thruster', label: 'Thrusters' },
            { value: 'ref', label: 'Reference systems' },
          ]}
        />
        <SelectFilter
          id="filter-metric"
          name="metric"
          label="Metric"
          value={view.filter.metric ?? ''}
          options={[{ value: '', label: 'Any' }, ...choices.metrics.map((m) => ({ value: m, label: FLAG_METRICS[m]?.label ?? m }))]}
        />
        <SelectFilter
          id="filter-order"
          name="order"
          label="Order"
          value={view.filter.order}
          options={[
            { value: 'severity', label: 'Most severe first' },
            { value: 'newest', label: 'Newest first' },
          ]}
        />
        <FilterActions clearHref="/watchlist" />
      </form>

      <p className="summary" data-testid="watchlist-summary">
        <span>
          {total} {total === 1 ? 'flag' : 'flags'} {STATUS_LABEL[view.status].toLowerCase()}
          {filtered ? ' matching the filters' : ''}
        </span>
        {total > flags.length ? <span>showing the first {WATCHLIST_LIMIT}</span> : null}
      </p>

      {flags.length === 0 ? (
        <section className="empty" data-testid="empty-state">
          <p>
            <strong>{filtered ? 'No flag matches these filters.' : 'Nothing on the watchlist.'}</strong>{' '}
            {filtered ? <Link href="/watchlist">Show every open flag</Link> : 'No trend flag is open or acknowledged.'}
          </p>
        </section>
      ) : (
        <div className="flag-cards">
          {flags.map((f, i) => (
            <FlagCard key={f.id} flag={f} chart={charts[i] ?? null} timeZone={ctx.timeZone} csrfToken={canAct ? ctx.csrfToken : null} />
          ))}
        </div>
      )}
    </>
  );
}
