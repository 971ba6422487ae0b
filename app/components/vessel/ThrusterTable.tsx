import { count, fixed, hours } from '../../../lib/web/format';
import { longDay } from '../../../lib/charts/days';
import type { ThrusterRow } from '../../../lib/web/vesselSummary';

/** Per thruster: hours in the range, wear against the service interval, projected service day. */
export default function ThrusterTable({ rows, asOf }: { rows: ThrusterRow[]; asOf: string }) {
  if (rows.length === 0) return <p className="empty-line">No thrusters registered and none in the telemetry.</p>;
  return (
    <div className="table-scroll" role="region" aria-label="Thrusters" tabIndex={0}>
      <table className="data-table" data-testid="thruster-table">
        <thead>
          <tr>
            <th scope="col">Thruster</th>
            <th scope="col" className="num">
              Run hours <span className="unit">range</span>
            </th>
            <th scope="col" className="num">
              Wear hours <span className="unit">range</span>
            </th>
            <th scope="col" className="num">
              Starts
            </th>
            <th scope="col">Wear since overhaul against service interval</th>
            <th scope="col">Projected service</th>
            <th scope="col" className="num">
              Efficiency index <span className="unit">kN/kW^⅔, latest</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((t) => (
            <tr key={t.id} data-testid="thruster-row" data-unit={t.id}>
              <th scope="row">
                {t.id} <span className="muted">{t.kind ?? 'not in the register'}</span>
              </th>
              <td className="num">{hours(t.runHours)}</td>
              <td className="num">{hours(t.wearHours)}</td>
              <td className="num">{count(t.starts)}</td>
              <td>
                {t.used !== null && t.wearTotalH !== null && t.serviceIntervalH !== null ? (
                  <div className="meter">
                    <span className={`meter__bar${t.used >= 0.9 ? ' meter__bar--due' : ''}`} aria-hidden="true">
                      <span style={{ width: `${Math.min(100, t.used * 100)}%` }} />
                    </span>
                    <span data-testid="wear-total">
                      {fixed(t.wearTotalH, 0)} of {fixed(t.serviceIntervalH, 0)} h ({fixed(t.used * 100, 0)} %)
                    </span>
                  </div>
                ) : (
                  <span className="muted">no service interval registered</span>
                )}
              </td>
              <td data-testid="projected">
                {t.projectedServiceDay ? (
                  t.toServiceH !== null && t.toServiceH <= 0 ? (
                    <strong className="overdue">Overdue by {fixed(-t.toServiceH, 0)} h</strong>
                  ) : (
                    longDay(t.projectedServiceDay)
                  )
                ) : (
                  <span className="muted">{t.registered ? 'no recent wear to project from' : '—'}</span>
                )}
              </td>
              <td className="num">
                {t.latestEfficiency ? (
                  <>
                    {fixed(t.latestEfficiency.value, 3)} <span className="muted">{t.latestEfficiency.day.slice(5)}</span>
                  </>
                ) : (
                  '—'
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="table-note">
        Wear hours are load-weighted equivalent hours at rated load (ISO 281 life exponent). Projection from the mean daily
        wear of the 30 days ending {asOf}.
      </p>
    </div>
  );
}
