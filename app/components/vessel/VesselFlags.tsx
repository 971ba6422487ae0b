import Link from 'next/link';
import type { FlagItem } from '../../../lib/api/queries/listFlags';
import { longDay } from '../../../lib/charts/days';
import { metricInfo, subjectLabel } from '../../../lib/web/flagMetrics';

/** The vessel's trend flags, every status, newest first; each links to its card on the watchlist. */
export default function VesselFlags({ flags, vessel }: { flags: FlagItem[]; vessel: string }) {
  if (flags.length === 0) return <p className="empty-line" data-testid="no-flags">No trend flags for this vessel.</p>;
  return (
    <ul className="flag-list" data-testid="vessel-flags">
      {flags.map((f) => (
        <li key={f.id} className="flag-list__item" data-testid="vessel-flag" data-flag-id={f.id}>
          <span className={`badge badge--${f.severity}`}>{f.severity}</span>
          <span className={`status status--${f.status}`}>{f.status}</span>
          <span className="flag-list__what">
            <strong>{metricInfo(f.metric)?.label ?? f.metric}</strong>, {subjectLabel(f.subject)}
          </span>
          <span className="muted">
            opened {longDay(f.opened_day)}, window {f.window_from} to {f.window_to}
          </span>
          <span className="flag-list__why">{f.explanation}</span>
          <Link href={`/watchlist?vessel=${vessel}&status=${f.status === 'closed' ? 'closed' : 'live'}#flag-${f.id}`}>Open on the watchlist</Link>
        </li>
      ))}
    </ul>
  );
}
