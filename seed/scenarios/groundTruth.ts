import { writeFileSync } from 'node:fs';
import { DAY_MS, type FaultKind, type PlannedFault, type ScenarioPlan } from './plan';

/**
 * The ground-truth file written beside the demo data: what was seeded where,
 * from when, and which daily metric (metrics-v1 names) should move which way.
 * Trend-flag evaluation reads it; seed/README.md documents the format.
 */

export type MetricName = 'p95_norm' | 'hdg_rms' | 'efficiency_index' | 'limit_events_per_dp_day' | 'sd_m_median' | 'rejections';
export type Direction = 'rising' | 'falling' | 'none';

export interface GroundTruthEntry {
  scenario: FaultKind;
  vessel: string;
  /** `vessel`, `thruster:ID` or `ref:ID`. */
  subject: string;
  /** The metrics-v1 daily metric that shows the fault; null for a link outage (no metric moves). */
  metric: MetricName | null;
  /** Day of the history (0 = `history.from`) the fault starts on, and its date (UTC). */
  onset_day: number;
  onset_date: string;
  direction: Direction;
  /** Whether a trend flag should open for (vessel, subject, metric). */
  expect_flag: boolean;
  /**
   * The fault also moves this metric, through its effect on the vessel (a derated generator's power
   * limit cuts thrust, so station keeping suffers): a flag on it after onset is right, but not required.
   * Such entries have expect_flag false and count neither in recall nor in the detection delay.
   */
  consequence?: boolean;
  /** What grows and how fast, in words. */
  rate: string;
  /** Link outage: the window without link and when the backlog was sent (ISO 8601 UTC). */
  outage?: { from: string; to: string; replayed_at: string };
  /** Generator derating: which section and generator. */
  bus?: string;
  generator?: number;
}

export interface GroundTruthFile {
  v: 1;
  about: string;
  seed: number;
  history: { from: string; to: string; days: number };
  entries: GroundTruthEntry[];
}

const date = (ms: number) => new Date(ms).toISOString().slice(0, 10);

export function groundTruth(plan: ScenarioPlan): GroundTruthFile {
  const entries: GroundTruthEntry[] = [];
  for (const f of plan.faults) entries.push(...entriesOf(plan, f));
  return {
    v: 1,
    about: 'Faults seeded into the Holdfast demo fleet by its simulator (seed/README.md). Invented vessels and data.',
    seed: plan.seed,
    history: { from: new Date(plan.fromMs).toISOString(), to: new Date(plan.fromMs + plan.days * DAY_MS).toISOString(), days: plan.days },
    entries,
  };
}

function entriesOf(plan: ScenarioPlan, f: PlannedFault): GroundTruthEntry[] {
  if (f.kind === 'link_outage') {
    const day = Math.floor((f.fromMs - plan.fromMs) / DAY_MS);
    return [
      {
        scenario: f.kind,
        vessel: f.vessel,
        subject: 'vessel',
        metric: null,
        onset_day: day,
        onset_date: date(f.fromMs),
        direction: 'none',
        expect_flag: false,
        rate: `no link for ${((f.toMs - f.fromMs) / 3_600_000).toFixed(1)} h; the backlog is sent as records batches ${((f.replayMs - f.toMs) / 3_600_000).toFixed(1)} h after the link returns`,
        outage: { from: new Date(f.fromMs).toISOString(), to: new Date(f.toMs).toISOString(), replayed_at: new Date(f.replayMs).toISOString() },
      },
    ];
  }
  const base = { scenario: f.kind, vessel: f.vessel, onset_day: f.onsetDay, onset_date: date(plan.fromMs + f.onsetDay * DAY_MS) };
  switch (f.kind) {
    case 'thruster_fouling':
      return [{ ...base, subject: `thruster:${f.thruster}`, metric: 'efficiency_index', direction: 'falling', expect_flag: true, rate: `thrust per power^(2/3) −${f.pctPerDay} % of the clean figure a day, to −${f.maxPct} %` }];
    case 'reference_noise':
      return [{ ...base, subject: `ref:${f.ref}`, metric: 'sd_m_median', direction: 'rising', expect_flag: true, rate: `noise +${f.pctPerDay} % of nominal a day, to ×${f.maxFactor}` }];
    case 'generator_derate': {
      const rate = `generator ${f.generator} of section ${f.bus}: down to ${f.stepPct} % of its rating at onset, then −${f.pctPerDay} % a day, to ${f.minPct} %`;
      const section = { bus: f.bus, generator: f.generator };
      // The power limit cuts thrust, so position and heading are held less well (scenarios.test.ts measures it).
      const consequence = { ...base, subject: 'vessel', direction: 'rising', expect_flag: false, consequence: true, rate: `${rate}; the power limit cuts thrust`, ...section } as const;
      return [
        { ...base, subject: 'vessel', metric: 'limit_events_per_dp_day', direction: 'rising', expect_flag: true, rate, ...section },
        { ...consequence, metric: 'p95_norm' },
        { ...consequence, metric: 'hdg_rms' },
      ];
    }
    case 'controller_detune': {
      const rate = `DP controller gains −${f.pctPerDay} % a day, to ${f.minPct} %`;
      return [
        { ...base, subject: 'vessel', metric: 'p95_norm', direction: 'rising', expect_flag: true, rate },
        { ...base, subject: 'vessel', metric: 'hdg_rms', direction: 'rising', expect_flag: true, rate },
      ];
    }
    case 'weather_only':
      return [{ ...base, subject: 'vessel', metric: 'p95_norm', direction: 'none', expect_flag: false, rate: `negative control: mean wind +${f.pctPerDay} % a day, to +${f.maxPct} %, on a healthy vessel` }];
  }
}

export function writeGroundTruth(file: string, plan: ScenarioPlan): GroundTruthFile {
  const truth = groundTruth(plan);
  writeFileSync(file, JSON.stringify(truth, null, 2) + '\n');
  return truth;
}
