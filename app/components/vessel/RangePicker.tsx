import Link from 'next/link';
import { RANGE_PRESETS, type PageRange } from '../../../lib/web/dayRangeParams';

/** Preset ranges as links, and any range through a GET form of two date fields. */
export default function RangePicker({ basePath, range, today, timeZone }: { basePath: string; range: PageRange; today: string; timeZone: string }) {
  return (
    <div className="range" data-testid="range-picker">
      <nav aria-label="Date range presets" className="range__presets">
        {RANGE_PRESETS.map((d) => (
          <Link key={d} href={`${basePath}?days=${d}`} aria-current={range.preset === d ? 'true' : undefined} className="chip">
            {d === 365 ? '1 year' : `${d} days`}
          </Link>
        ))}
      </nav>
      <form method="get" action={basePath} className="range__form" aria-label="Choose a date range">
        <div className="filter">
          <label htmlFor="range-from">From</label>
          <input id="range-from" type="date" name="from" defaultValue={range.from} max={today} required />
        </div>
        <div className="filter">
          <label htmlFor="range-to">To</label>
          <input id="range-to" type="date" name="to" defaultValue={range.to} max={today} required />
        </div>
        <button type="submit" className="button">
          Show
        </button>
      </form>
      <p className="range__note">
        Fleet days in <strong>{timeZone}</strong>, both ends included; today is {today}.
      </p>
      {range.problem ? (
        <p className="notice" role="status" data-testid="range-problem">
          {range.problem}
        </p>
      ) : null}
    </div>
  );
}
