import type { PowerRecord, RefsRecord, StationRecord, ThrustersRecord, TrackRecord } from '../../lib/telemetry/schemas';

/** What a VesselSimulator takes and gives (vesselSimulator.ts). */

export interface SimRecords {
  station: StationRecord;
  thrusters: ThrustersRecord;
  power: PowerRecord;
  refs: RefsRecord;
  /** One record per second with a set point when the simulator was created with `track: true`. */
  track?: TrackRecord[];
}

/** An interval's statistics records as JSON text, and the track records when asked for. */
export interface SimTexts {
  station: string;
  thrusters: string;
  power: string;
  refs: string;
  track?: TrackRecord[];
}

/** What scenarios may change, as views into the simulator's state. */
export interface SimKnobs {
  /** Per thruster: power drawn for the same thrust (1 = clean). */
  readonly thrusterPower: Float64Array;
  /** Per reference system: noise multiplier (1 = its kind's figures). */
  readonly refNoise: Float64Array;
  /** Per generator (bus b, unit g at b·2 + g): fraction of its rating it can deliver. */
  readonly genCapacity: Float64Array;
  /** Multiplies the DP controller's gains (1 = as tuned). */
  controllerGain: number;
  /** Multiplies the mean wind. */
  windScale: number;
}

/** Sets the knobs for the interval starting at tMs. */
export type Faults = (tMs: number, knobs: SimKnobs) => void;

export interface SimOptions {
  /** Extra seed mixed with the vessel key (default 0). */
  seed?: number;
  /** Produce the 1 Hz track stream. */
  track?: boolean;
  /** Steady mean wind, m/s (gusts still on), for tests; default: weather varying over days. */
  fixedWindMs?: number;
  /** A steady current instead of the varying one (tests): speed m/s and the direction it sets towards, deg. */
  steadyCurrent?: { ms: number; toDeg: number };
  /** No current, reference dropouts/glitches or generator trips (tests). */
  calm?: boolean;
  /** Follow the vessel type's DP mode pattern (default true); false: always auto_position (tests). */
  modes?: boolean;
  /** Scenario faults (default none). */
  faults?: Faults;
  /** Seconds simulated before the first interval so the loop has settled (default 600). */
  warmUpS?: number;
}
