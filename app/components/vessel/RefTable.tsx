import { count, fixed, hours } from '../../../lib/web/format';
import type { RefRow } from '../../../lib/web/vesselSummary';

/** Per position reference system over the range. */
export default function RefTable({ rows }: { rows: RefRow[] }) {
  if (rows.length === 0) return <p className="empty-line">No reference systems registered and none in the telemetry.</p>;
  return (
    <div className="table-scroll" role="region" aria-label="Reference systems" tabIndex={0}>
      <table className="data-table" data-testid="ref-table">
        <thead>
          <tr>
            <th scope="col">System</th>
            <th scope="col" className="num">
              Online <span className="unit">h</span>
            </th>
            <th scope="col" className="num">
              Mean weight <span className="unit">0–1</span>
            </th>
            <th scope="col" className="num">
              Residual SD <span className="unit">m, median of days</span>
            </th>
            <th scope="col" className="num">
              Rejections
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.id} data-testid="ref-row" data-unit={r.id}>
              <th scope="row">
                {r.id} <span className="muted">{r.kind ?? 'not in the register'}</span>
              </th>
              <td className="num">{hours(r.onlineHours)}</td>
              <td className="num">{fixed(r.weightMean, 2)}</td>
              <td className="num">{fixed(r.sdMedian, 2)}</td>
              <td className="num">{count(r.rejections)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
