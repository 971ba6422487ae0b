import { listFlags } from '../../../lib/api/queries/listFlags';
import { visibleFlags } from '../../../lib/api/scoped';
import { canSeeSpan } from '../../../lib/auth/scope';
import { fleetDay } from '../../../lib/time/fleetDay';
import { getRefDaily } from '../../../lib/api/queries/refDaily';
import { getThrusterDaily } from '../../../lib/api/queries/thrusterDaily';
import { getThrusterService } from '../../../lib/api/queries/thrusterService';
import { getVesselDaily } from '../../../lib/api/queries/vesselDaily';
import { fleetTime, longDay } from '../../../lib/charts/days';
import { radialDistribution, trackScatter } from '../../../lib/charts/footprint';
import type { DailyChartData } from '../../../lib/charts/types';
import {
  accuracyChart,
  efficiencyChart,
  headingChart,
  normalisedChart,
  powerLimitChart,
  powerLossChart,
  refNoiseChart,
  weatherChart,
} from '../../../lib/charts/vesselCharts';
import { getTrackSample, SAMPLE_STEP_S } from '../../../lib/queries/trackSample';
import type { VesselProfile } from '../../../lib/queries/vesselProfile';
import { getRangeHistogram } from '../../../lib/queries/vesselFootprint';
import type { PageContext } from '../../../lib/web/context';
import type { PageRange } from '../../../lib/web/dayRangeParams';
import { count, fixed, hours, metres, percent } from '../../../lib/web/format';
import { rangeSummary, refRows, thrusterRows } from '../../../lib/web/vesselSummary';
import ChartFrame from '../../components/charts/ChartFrame';
import DailyChart from '../../components/charts/DailyChart';
import { RadialDistributionChart, TrackScatterChart } from '../../components/charts/FootprintCharts';
import Tile from '../../components/Tile';
import DailyTable from '../../components/vessel/DailyTable';
import RefTable from '../../components/vessel/RefTable';
import ThrusterTable from '../../components/vessel/ThrusterTable';
import VesselFlags from '../../components/vessel/VesselFlags';

/**
 * Everything on the vessel page below its heading: read in one round of
 * parallel queries (the API's query functions and lib/queries), prepared by
 * lib/charts and lib/web, drawn here. Streams in under the heading.
 */

function Chart({ chart }: { chart: DailyChartData }) {
  return (
    <ChartFrame
      id={chart.id}
      title={chart.title}
      note={chart.note}
      empty={chart.daysWithData === 0 ? `No figures from ${chart.rows[0]?.day} to ${chart.rows.at(-1)?.day}.` : undefined}
    >
      <DailyChart chart={chart} />
    </ChartFrame>
  );
}

export default async function VesselFigures({ ctx, profile, range, today }: { ctx: PageContext; profile: VesselProfile; range: PageRange; today: string }) {
  const key = profile.key;
  const [daily, thrusterDays, refDays, fullService, hist, fullTrack, allFlags] = await Promise.all([
    getVesselDaily(ctx.db, key, range),
    getThrusterDaily(ctx.db, key, range),
    getRefDaily(ctx.db, key, range),
    getThrusterService(ctx.db, key, today),
    getRangeHistogram(ctx.db, key, range),
    getTrackSample(ctx.db, key, range.to, ctx.timeZone),
    listFlags(ctx.db, { status: 'all', vesselKey: key }),
  ]);
  // The vessel was found a moment ago; null here means it left the register meanwhile.
  if (!daily || !thrusterDays || !refDays || !fullService || !allFlags) {
    return <p className="notice">This vessel has just left the fleet register.</p>;
  }
  // The range is inside the reader's scope already (visiblePageRange); what reaches outside it is cut here:
  // lifetime thruster wear (every day since installation), a track sample that began before the range,
  // flags whose window is not wholly visible.
  const fleetWide = ctx.scope.kind === 'fleet';
  const service = fleetWide ? fullService : { ...fullService, thrusters: [] };
  const track =
    fullTrack && (fleetWide || canSeeSpan(ctx.scope, key, fleetDay(fullTrack.from, ctx.timeZone), fleetDay(fullTrack.to, ctx.timeZone))) ? fullTrack : null;
  const flags = visibleFlags(ctx.scope, allFlags);

  const c = { timeZone: ctx.timeZone, from: range.from, to: range.to };
  const summary = rangeSummary(daily.days, hist, profile.watchCirclesM);
  const radial = radialDistribution(hist, profile.watchCirclesM);
  const scatter = track ? trackScatter(track.points, profile.watchCirclesM) : null;
  const thrusters = thrusterRows(profile.thrusters, service.thrusters, thrusterDays.days);
  const refs = refRows(profile.refs, refDays.days);
  const live = flags.filter((f) => f.status !== 'closed');

  return (
    <>
      <nav className="on-page" aria-label="On this page">
        <a href="#station">Station keeping</a>
        <a href="#footprint">Footprint</a>
        <a href="#thrusters">Thrusters</a>
        <a href="#power">Power</a>
        <a href="#refs">Reference systems</a>
        <a href="#flags">Flags{live.length > 0 ? ` (${live.length} open or acknowledged)` : ''}</a>
      </nav>

      {daily.days.length === 0 ? (
        <section className="empty" data-testid="empty-range">
          <p>
            <strong>
              No daily figures from {longDay(range.from)} to {longDay(range.to)}.
            </strong>{' '}
            A day without telemetry has no row, and the daily job fills in today&apos;s figures as records arrive. Try a longer range.
          </p>
        </section>
      ) : null}

      <dl className="tiles" data-testid="summary-tiles">
        <Tile label="DP hours" value={hours(summary.dpHours)} about={`${summary.daysWithFigures} days with figures in the range`} testId="tile-dp-hours" />
        <Tile label="p95 over the range" value={metres(summary.p95?.m ?? null, summary.p95?.overflow)} about="From every DP sample of the range" testId="tile-p95" />
        {summary.within.map((w) => (
          <Tile key={w.limit} label={`Inside ${w.limit} m`} value={percent(w.pct, 2)} about="Share of DP samples within the watch circle" testId={`tile-within-${w.limit}`} />
        ))}
        <Tile label="p95 against the weather" value={fixed(summary.p95NormMedian, 2)} about="Median daily ratio; 1 is as expected" testId="tile-norm" />
        <Tile
          label="Power-limit events"
          value={count(summary.limitEvents)}
          about={summary.limitEventsPerDpDay === null ? 'no DP time' : `${fixed(summary.limitEventsPerDpDay, 1)} per DP day`}
          testId="tile-limit-events"
        />
        <Tile label="Blackouts" value={count(summary.blackouts)} about="Switchboard sections losing all power" testId="tile-blackouts" />
      </dl>

      <section id="station" className="section" aria-labelledby="station-title">
        <h2 id="station-title">Station keeping</h2>
        <div className="chart-grid">
          <Chart chart={accuracyChart(c, daily.days, profile.watchCirclesM)} />
          <Chart chart={weatherChart(c, daily.days)} />
          <Chart chart={normalisedChart(c, daily.days)} />
          <Chart chart={headingChart(c, daily.days, profile.headingLimitsDeg)} />
        </div>
      </section>

      <section id="footprint" className="section" aria-labelledby="footprint-title">
        <h2 id="footprint-title">Footprint</h2>
        <div className="chart-grid">
          <ChartFrame
            id="radial"
            title="Distance from the set point"
            note={`Share of all DP samples from ${range.from} to ${range.to} in each 0.1 m band${radial.overflowPct > 0 ? `; ${fixed(radial.overflowPct, 2)} % at 10 m or more (not drawn)` : ''}. Median ${metres(radial.p50?.m ?? null, radial.p50?.overflow)}, p95 ${metres(radial.p95?.m ?? null, radial.p95?.overflow)}.`}
            empty={radial.samples === 0 ? 'No DP samples in the range.' : undefined}
          >
            <RadialDistributionChart data={radial} />
          </ChartFrame>
          <ChartFrame
            id="scatter"
            title="Positions around the set point"
            note={
              track
                ? `${track.points.length} raw positions, the first of every ${SAMPLE_STEP_S} s, over the 24 hours to ${fleetTime(track.to, ctx.timeZone)} (${ctx.timeZone}): the latest track data up to the end of the range.`
                : 'Raw positions come from the optional track stream, kept for 90 days.'
            }
            empty={scatter ? undefined : 'This vessel sent no track positions up to the end of the range.'}
          >
            {scatter ? <TrackScatterChart data={scatter} /> : null}
          </ChartFrame>
        </div>
      </section>

      <section id="thrusters" className="section" aria-labelledby="thrusters-title">
        <h2 id="thrusters-title">Thrusters</h2>
        <ThrusterTable rows={thrusters} asOf={today} />
        <Chart chart={efficiencyChart(c, thrusterDays.days)} />
      </section>

      <section id="power" className="section" aria-labelledby="power-title">
        <h2 id="power-title">Power</h2>
        <p className="section__lede">
          Peak load over the range: {summary.peakLoadRatio === null ? '—' : `${fixed(summary.peakLoadRatio * 100, 0)} % of available power`}.
        </p>
        <div className="chart-grid">
          <Chart chart={powerLimitChart(c, daily.days)} />
          <Chart chart={powerLossChart(c, daily.days)} />
        </div>
      </section>

      <section id="refs" className="section" aria-labelledby="refs-title">
        <h2 id="refs-title">Reference systems</h2>
        <RefTable rows={refs} />
        <Chart chart={refNoiseChart(c, refDays.days)} />
      </section>

      <section id="flags" className="section" aria-labelledby="flags-title">
        <h2 id="flags-title">Trend flags</h2>
        <VesselFlags flags={flags} vessel={profile.key} />
      </section>

      <DailyTable days={daily.days} limitKeys={daily.limitKeys} />
    </>
  );
}
