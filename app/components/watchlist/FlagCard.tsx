import Link from 'next/link';
import { fleetTime, longDay } from '../../../lib/charts/days';
import type { DailyChartData } from '../../../lib/charts/types';
import type { WatchlistFlag } from '../../../lib/queries/watchlist';
import { metricInfo, subjectLabel } from '../../../lib/web/flagMetrics';
import ChartFrame from '../charts/ChartFrame';
import DailyChart from '../charts/DailyChart';
import FlagActions from './FlagActions';

/** The test's own figures, as stored with the flag, for whoever wants to check the arithmetic. */
function Evidence({ evidence }: { evidence: Record<string, unknown> }) {
  const entries = Object.entries(evidence ?? {});
  if (entries.length === 0) return null;
  const show = (v: unknown) =>
    typeof v === 'number' ? v.toLocaleString('en-GB', { maximumSignificantDigits: 5 }) : typeof v === 'string' ? v : JSON.stringify(v);
  return (
    <details className="evidence" data-testid="flag-evidence">
      <summary>The test&apos;s figures</summary>
      <dl className="facts">
        {entries.map(([k, v]) => (
          <div key={k}>
            <dt>{k.replaceAll('_', ' ')}</dt>
            <dd>{show(v)}</dd>
          </div>
        ))}
      </dl>
    </details>
  );
}

/** One flag: what, where, since when, why (explanation and statistic), its chart, its record, and what to do. */
/** `csrfToken` is null for a user whose role may not act on flags: no forms then. */
export default function FlagCard({
  flag,
  chart,
  timeZone,
  csrfToken,
}: {
  flag: WatchlistFlag;
  chart: DailyChartData | null;
  timeZone: string;
  csrfToken: string | null;
}) {
  const info = metricInfo(flag.metric);
  return (
    <article className={`flag-card flag-card--${flag.severity}`} id={`flag-${flag.id}`} aria-labelledby={`flag-${flag.id}-title`} data-testid="flag-card" data-flag-id={flag.id} data-status={flag.status}>
      <header className="flag-card__head">
        <span className={`badge badge--${flag.severity}`}>{flag.severity}</span>
        <span className={`status status--${flag.status}`} data-testid="flag-status">
          {flag.status}
        </span>
        <h3 id={`flag-${flag.id}-title`} className="flag-card__title">
          <Link href={`/vessels/${flag.vessel}`}>{flag.vesselName}</Link> · {subjectLabel(flag.subject)} · {info?.label ?? flag.metric}
        </h3>
      </header>
      <dl className="facts">
        <div>
          <dt>Opened</dt>
          <dd>{longDay(flag.openedDay)}</dd>
        </div>
        <div>
          <dt>Window</dt>
          <dd>
            {flag.windowFrom} to {flag.windowTo}
          </dd>
        </div>
        <div>
          <dt>Test</dt>
          <dd>{flag.method}</dd>
        </div>
        <div>
          <dt>Statistic</dt>
          <dd>
            {flag.statisticName} = {flag.statistic.toLocaleString('en-GB', { maximumSignificantDigits: 4 })}
          </dd>
        </div>
        <div>
          <dt>Worse when</dt>
          <dd>{info ? info.worse : 'see explanation'}</dd>
        </div>
        <div>
          <dt>Last checked</dt>
          <dd>{flag.lastEvaluatedDay}</dd>
        </div>
      </dl>
      <p className="flag-card__why" data-testid="flag-explanation">
        {flag.explanation}
      </p>
      {flag.status !== 'closed' && flag.closeProposedDay ? (
        <p className="notice" data-testid="clearing">
          The daily check proposes closing this flag: its condition has not held since {longDay(flag.closeProposedDay)} (
          {flag.clearDays} {flag.clearDays === 1 ? 'day' : 'days'} checked). Close it as resolved if that matches what you know.
        </p>
      ) : flag.status !== 'closed' && flag.clearDays > 0 ? (
        <p className="notice" data-testid="clearing">
          The condition has not held for the last {flag.clearDays} {flag.clearDays === 1 ? 'day' : 'days'} checked.
        </p>
      ) : null}
      <Evidence evidence={flag.evidence} />
      {chart ? (
        <ChartFrame id={chart.id} title={chart.title} note={chart.note} empty={chart.daysWithData === 0 ? 'No daily figures around this window.' : undefined}>
          <DailyChart chart={chart} height={220} />
        </ChartFrame>
      ) : (
        <p className="muted">No chart for the metric “{flag.metric}”: Holdfast does not know which daily figure it reads.</p>
      )}
      {flag.acknowledgedAt || flag.closedAt ? (
        <ul className="record" data-testid="flag-record">
          {flag.acknowledgedAt ? (
            <li>
              Acknowledged by <strong>{flag.acknowledgedBy}</strong> on {fleetTime(flag.acknowledgedAt, timeZone)} ({timeZone})
              {flag.acknowledgeNote === null ? '' : `: “${flag.acknowledgeNote}”`}
            </li>
          ) : null}
          {flag.closedAt ? (
            <li>
              Closed as <strong>{flag.closeReason}</strong> by <strong>{flag.closedBy}</strong> on {fleetTime(flag.closedAt, timeZone)} ({timeZone})
              {flag.closeNote === null ? '' : `: “${flag.closeNote}”`}
            </li>
          ) : null}
        </ul>
      ) : null}
      {csrfToken ? <FlagActions flagId={String(flag.id)} status={flag.status} csrfToken={csrfToken} /> : null}
    </article>
  );
}
