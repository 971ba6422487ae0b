import type { Metadata } from 'next';
import { fleetPageContext } from '../../lib/web/context';
import { getFleetOverview, type FleetOverviewRow, type StreamCounts } from '../../lib/queries/fleetOverview';
import { formatAge, utcParts } from '../../lib/format/time';
import { isStale } from '../../lib/web/staleness';
import AutoRefresh from '../components/AutoRefresh';

// Read the store on every request: this page is a live view.
export const dynamic = 'force-dynamic';

export const metadata: Metadata = { title: 'Reception' };

const REFRESH_SECONDS = 10;

const STREAMS: { key: keyof StreamCounts; label: string; title: string }[] = [
  { key: 'station', label: 'Station', title: 'Station-keeping records' },
  { key: 'thrusters', label: 'Thrusters', title: 'Thruster records (all units of an interval count once)' },
  { key: 'power', label: 'Power', title: 'Power records (all buses of an interval count once)' },
  { key: 'refs', label: 'Refs', title: 'Position reference records (all units of an interval count once)' },
  { key: 'track', label: 'Track', title: 'Track positions' },
];

function formatCount(n: number): string {
  return n.toLocaleString('en-GB');
}

const vesselStale = (v: FleetOverviewRow, now: Date) => isStale(v.lastRecordAt, now);

function LastRecord({ at, now, stale }: { at: Date | null; now: Date; stale: boolean }) {
  return (
    <div className="last">
      {at ? (
        <time className="last__time" dateTime={at.toISOString()}>
          <span className="last__date">{utcParts(at)[0]}</span> {utcParts(at)[1]}
        </time>
      ) : (
        <span className="last__time last__time--never">No records yet</span>
      )}
      <span className="last__when">
        {at ? (
          <span className="last__age" data-testid="age">
            {formatAge(now.getTime() - at.getTime())}
          </span>
        ) : null}
        {stale ? (
          <span className="badge badge--stale" data-testid="stale-marker">
            Stale
          </span>
        ) : null}
      </span>
    </div>
  );
}

function FleetTable({ vessels, now }: { vessels: FleetOverviewRow[]; now: Date }) {
  return (
    <div className="table-scroll" role="region" aria-labelledby="fleet-caption" tabIndex={0}>
      <table className="fleet-table">
        <caption id="fleet-caption" className="visually-hidden">
          Registered vessels by name: last record and records received in the last 24 hours per stream
        </caption>
        <colgroup span={4} />
        <colgroup span={5} className="fleet-table__counts" />
        <thead>
          <tr>
            <th scope="col" rowSpan={2}>
              Vessel
            </th>
            <th scope="col" rowSpan={2}>
              Type
            </th>
            <th scope="col" rowSpan={2}>
              DP class
            </th>
            <th scope="col" rowSpan={2}>
              Last record <span className="unit">UTC</span>
            </th>
            <th scope="colgroup" colSpan={5} className="group-head">
              Records in the last 24 h
            </th>
          </tr>
          <tr>
            {STREAMS.map((s, i) => (
              <th key={s.key} scope="col" className={i === 0 ? 'num group-start' : 'num'} title={s.title}>
                {s.label}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {vessels.map((v) => {
            const stale = vesselStale(v, now);
            return (
              <tr key={v.key} data-testid="vessel-row" data-vessel-key={v.key} data-stale={stale}>
                <th scope="row" className="vessel">
                  <span className="vessel__name">{v.name}</span>
                  <span className="vessel__key">{v.key}</span>
                </th>
                <td className="type">{v.type}</td>
                <td className="nowrap">DP {v.dpClass}</td>
                <td>
                  <LastRecord at={v.lastRecordAt} now={now} stale={stale} />
                </td>
                {STREAMS.map((s, i) => {
                  const n = v.records24h[s.key];
                  const className = ['num', n === 0 && 'num--zero', i === 0 && 'group-start'].filter(Boolean).join(' ');
                  return (
                    <td key={s.key} className={className} data-testid={`count-${s.key}`}>
                      {formatCount(n)}
                    </td>
                  );
                })}
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

export default async function ReceptionPage() {
  const now = new Date();
  const ctx = await fleetPageContext();
  const vessels = await getFleetOverview(ctx.db, now);
  const stale = vessels.filter((v) => vesselStale(v, now)).length;

  return (
    <>
      <div className="page-head">
        <div>
          <h1>Reception</h1>
          <p className="page-head__lede">
            Is telemetry arriving? Latest record and records received in the last 24 hours, per vessel and stream.{' '}
            <strong>All times are UTC.</strong>
          </p>
        </div>
        <AutoRefresh renderedAt={now.toISOString()} everySeconds={REFRESH_SECONDS} />
      </div>

      {vessels.length === 0 ? (
        <section className="empty" data-testid="empty-state">
          <p>
            <strong>No vessels registered yet</strong> — import a fleet register with{' '}
            <code>holdfast fleet import FILE</code>
          </p>
        </section>
      ) : (
        <>
          <p className="summary" data-testid="summary">
            <span>
              {vessels.length} {vessels.length === 1 ? 'vessel' : 'vessels'}
            </span>
            <span>{vessels.length - stale} reporting</span>
            <span>
              {stale} stale <span className="summary__note">(no record in the last 15 min)</span>
            </span>
          </p>
          <FleetTable vessels={vessels} now={now} />
          <p className="table-note">
            A record is one interval of a stream; for thrusters, power and refs all units of the same interval count
            once. Stale: no record in the last 15 minutes.
          </p>
        </>
      )}
    </>
  );
}
