import Link from 'next/link';
import { formatAge } from '../../../lib/format/time';
import { fixed, metres } from '../../../lib/web/format';
import { p95Trend, type FleetRankRow } from '../../../lib/web/fleetRanking';
import { DEFAULT_DIR, type FleetView, type SortKey } from '../../../lib/web/fleetView';
import { BAND_LABEL, SCORE_COMPONENTS, scoreBand } from '../../../lib/web/healthScore';
import { queryString } from '../../../lib/web/searchParams';
import { shortDay } from '../../../lib/charts/days';
import Sparkline from '../Sparkline';

/**
 * The ranking table. Column headers are links that sort on the server
 * (aria-sort says the current order); each vessel links to its page.
 */

function SortLink({ label, sortKey, view }: { label: string; sortKey: SortKey; view: FleetView }) {
  const active = view.sort === sortKey;
  const nextDir = active ? (view.dir === 'asc' ? 'desc' : 'asc') : DEFAULT_DIR[sortKey];
  const href = `/${queryString({ type: view.type, class: view.dpClass, campaign: view.campaign, sort: sortKey, dir: nextDir })}`;
  return (
    <Link href={href} className="sort-link" data-testid={`sort-${sortKey}`}>
      {label}
      <span className="sort-link__mark" aria-hidden="true">
        {active ? (view.dir === 'asc' ? '▲' : '▼') : '↕'}
      </span>
    </Link>
  );
}

const ariaSort = (view: FleetView, keys: SortKey[]) =>
  keys.includes(view.sort) ? (view.dir === 'asc' ? 'ascending' : 'descending') : undefined;

function SortHeader({ label, sortKey, view, className, title }: { label: string; sortKey: SortKey; view: FleetView; className?: string; title?: string }) {
  return (
    <th scope="col" className={className} aria-sort={ariaSort(view, [sortKey])} title={title}>
      <SortLink label={label} sortKey={sortKey} view={view} />
    </th>
  );
}

/** Type and DP class share a column (the table must fit 1280 px) and sort separately. */
function TypeClassHeader({ view }: { view: FleetView }) {
  return (
    <th scope="col" aria-sort={ariaSort(view, ['type', 'class'])} className="sort-pair">
      <SortLink label="Type" sortKey="type" view={view} />
      <SortLink label="DP class" sortKey="class" view={view} />
    </th>
  );
}

function ScoreCell({ row }: { row: FleetRankRow }) {
  const band = scoreBand(row.health.score);
  const missing = row.health.components
    .filter((c) => c.lost === null)
    .map((c) => SCORE_COMPONENTS.find((s) => s.key === c.key)!.label.toLowerCase());
  return (
    <div className={`score score--${band}`}>
      <span className="score__value" data-testid="score">
        {row.health.score ?? '—'}
      </span>
      <span className="score__band">{BAND_LABEL[band]}</span>
      {row.health.score !== null ? (
        <span className="score__bar" aria-hidden="true">
          <span style={{ width: `${row.health.score}%` }} />
        </span>
      ) : null}
      {row.health.score !== null && row.health.partial ? (
        <span className="score__partial" title={`Left out (no figure): ${missing.join(', ')}`}>
          partial: no {missing.join(', no ')}
        </span>
      ) : null}
    </div>
  );
}

export default function FleetTable({ rows, view, now }: { rows: FleetRankRow[]; view: FleetView; now: Date }) {
  return (
    <div className="table-scroll" role="region" aria-labelledby="ranking-caption" tabIndex={0}>
      <table className="data-table ranking">
        <caption id="ranking-caption" className="visually-hidden">
          Vessels ranked by station-keeping health score; column headers sort the table
        </caption>
        <thead>
          <tr>
            <SortHeader label="#" sortKey="rank" view={view} className="num" title="Rank by health score (1 = highest)" />
            <SortHeader label="Vessel" sortKey="name" view={view} />
            <TypeClassHeader view={view} />
            <th scope="col">Health score</th>
            <SortHeader label="Daily p95, 30 days" sortKey="p95" view={view} title="Latest daily p95 radial error; the line shows each day, gaps are days without figures" />
            <SortHeader label="p95 vs weather" sortKey="norm" view={view} className="num" title="Median daily p95_norm, last 30 days (1 = as expected)" />
            <SortHeader label="Limit events per DP day" sortKey="limits" view={view} className="num" title="Power-limit events per 24 DP hours, last 30 days" />
            <SortHeader label="Open flags" sortKey="flags" view={view} className="num" />
            <SortHeader label="Thrusters due" sortKey="service" view={view} className="num" />
            <SortHeader label="Last seen" sortKey="seen" view={view} />
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.key} data-testid="ranking-row" data-vessel-key={r.key} data-stale={r.stale}>
              <td className="num rank" data-testid="rank">
                {r.rank ?? '—'}
              </td>
              <th scope="row" className="vessel">
                <Link href={`/vessels/${r.key}`} className="vessel__name">
                  {r.name}
                </Link>
                <span className="vessel__key">{r.key}</span>
              </th>
              <td className="type">
                {r.type}
                <span className="type__class">DP {r.dpClass}</span>
              </td>
              <td>
                <ScoreCell row={r} />
              </td>
              <td>
                <div className="trend">
                  <Sparkline
                    values={p95Trend(r)}
                    reference={r.warningCircleM}
                    label={`Daily p95 over 30 days for ${r.name}${r.warningCircleM ? `, dashed line at the ${r.warningCircleM} m watch circle` : ''}`}
                  />
                  <span className="trend__latest" data-testid="latest-p95">
                    {r.latestP95 ? (
                      <>
                        {metres(r.latestP95.m, r.latestP95.overflow)}
                        <span className="trend__day">{shortDay(r.latestP95.day)}</span>
                      </>
                    ) : (
                      <span className="muted">no figures</span>
                    )}
                  </span>
                </div>
              </td>
              <td className="num" data-testid="norm">
                {fixed(r.p95NormMedian, 2)}
              </td>
              <td className="num" data-testid="limit-rate">
                {r.limitRate === null ? <span className="muted" title="No DP time in the window">no DP time</span> : fixed(r.limitRate, 1)}
              </td>
              <td className="num">
                {r.openFlags.total > 0 ? (
                  <Link href={`/watchlist?vessel=${r.key}`} className="flag-count" data-testid="open-flags">
                    {r.openFlags.total}
                    <span className="flag-count__detail">
                      {r.openFlags.alarm ? ` ${r.openFlags.alarm} alarm` : ''}
                      {r.openFlags.warning ? ` ${r.openFlags.warning} warning` : ''}
                      {r.openFlags.advisory ? ` ${r.openFlags.advisory} advisory` : ''}
                    </span>
                  </Link>
                ) : (
                  <span data-testid="open-flags">0</span>
                )}
              </td>
              <td className="num" data-testid="thrusters-due">
                {r.thrusters === 0 ? <span className="muted">none registered</span> : `${r.thrustersDue} of ${r.thrusters}`}
              </td>
              <td>
                <div className="last">
                  {r.lastSeen ? (
                    <time dateTime={r.lastSeen.toISOString()} className="last__age" data-testid="age">
                      {formatAge(now.getTime() - r.lastSeen.getTime())}
                    </time>
                  ) : (
                    <span className="last__time--never">never</span>
                  )}
                  {r.stale ? (
                    <span className="badge badge--stale" data-testid="stale-marker">
                      Stale
                    </span>
                  ) : null}
                </div>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
