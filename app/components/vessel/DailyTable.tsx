import type { VesselDayItem } from '../../../lib/api/queries/vesselDaily';
import { count, fixed, metres } from '../../../lib/web/format';

/** Every stored day of the range as numbers: the charts' figures, readable without them. */
export default function DailyTable({ days, limitKeys }: { days: VesselDayItem[]; limitKeys: string[] }) {
  return (
    <details className="daily-table" data-testid="daily-table">
      <summary>Daily figures as a table ({days.length} days with a row, newest first)</summary>
      <div className="table-scroll" role="region" aria-label="Daily figures" tabIndex={0}>
        <table className="data-table data-table--compact">
          <thead>
            <tr>
              <th scope="col">Day</th>
              <th scope="col" className="num">DP h</th>
              <th scope="col" className="num">p50 m</th>
              <th scope="col" className="num">p95 m</th>
              {limitKeys.map((k) => (
                <th key={k} scope="col" className="num">
                  Inside {k} m %
                </th>
              ))}
              <th scope="col" className="num">p95 ratio</th>
              <th scope="col" className="num">Hdg RMS °</th>
              <th scope="col" className="num">Wind m/s</th>
              <th scope="col" className="num">Limit events</th>
              <th scope="col" className="num">Blackouts</th>
              <th scope="col" className="num">Peak load %</th>
            </tr>
          </thead>
          <tbody>
            {[...days].reverse().map((d) => (
              <tr key={d.day} data-testid="daily-row" data-day={d.day}>
                <th scope="row" className="nowrap">
                  {d.day}
                </th>
                <td className="num">{fixed(d.dp_hours, 1)}</td>
                <td className="num">{metres(d.p50_m).replace(' m', '')}</td>
                <td className="num" data-testid="daily-p95">
                  {metres(d.p95_m, d.p95_overflow).replace(' m', '')}
                </td>
                {limitKeys.map((k) => (
                  <td key={k} className="num">
                    {fixed(d.within_pct[k] ?? null, 1)}
                  </td>
                ))}
                <td className="num">{fixed(d.p95_norm, 2)}</td>
                <td className="num">{fixed(d.hdg_rms_deg, 2)}</td>
                <td className="num">{fixed(d.wind_mean_ms, 1)}</td>
                <td className="num">{count(d.limit_events)}</td>
                <td className="num">{count(d.blackouts)}</td>
                <td className="num">{fixed(d.peak_load_ratio === null ? null : d.peak_load_ratio * 100, 0)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </details>
  );
}
