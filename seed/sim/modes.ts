import { Random } from '../random';

/**
 * DP modes over time for the demo simulator (demo data only): an invented
 * operating pattern per vessel type, deterministic for a seed, as a pure
 * function of time (the same second gets the same mode in a backfill and in
 * a live run started later).
 *
 * Patterns (hours; all invented, plausible for the type):
 * - drilling: on location for days in auto_position; now and then a short
 *   joystick spell (trials, handovers).
 * - construction: auto_position work spells of 4–12 h; 40 % of them are
 *   followed by an auto_track run out and back (ROV or survey following at
 *   0.1–0.3 m/s); 12 % by a port call (joystick out, standby 6–14 h in
 *   transit, joystick approach).
 * - supply: auto_position alongside an installation 3–8 h, then joystick,
 *   standby 5–14 h (transit, port), joystick approach.
 * - shuttle tanker: auto_position at the loading buoy 14–28 h, joystick,
 *   standby 24–60 h (transit, discharge), joystick approach.
 *
 * In standby the DP is off: the vessel is away (transit on its main
 * propellers), so no position error is reported.
 */

export const MODE_NAMES = ['auto_position', 'auto_track', 'joystick', 'manual', 'standby'] as const;
export type DpMode = (typeof MODE_NAMES)[number];
export const AUTO_POSITION = 0;
export const AUTO_TRACK = 1;
export const JOYSTICK = 2;
export const MANUAL = 3;
export const STANDBY = 4;

export interface ModeSegment {
  /** Seconds since the epoch, [start, end). */
  start: number;
  end: number;
  mode: number;
  /** auto_track: set-point speed along the heading, m/s (signed); standby: transit load, fraction of rated. */
  param: number;
}

/** Schedules start here (before it, auto_position); far enough back for any demo history. */
const ANCHOR_S = Date.UTC(2024, 0, 1) / 1000;
const H = 3600;

type Push = (mode: number, minH: number, maxH: number, param?: number) => number;

/** One cycle of the pattern of a vessel type: pushes its segments in order. */
type Pattern = (rng: Random, push: Push) => void;

const PATTERNS: Record<string, Pattern> = {
  drilling: (rng, push) => {
    push(AUTO_POSITION, 24, 72);
    if (rng.next() < 0.25) push(JOYSTICK, 0.3, 1);
  },
  construction: (rng, push) => {
    push(AUTO_POSITION, 4, 12);
    const r = rng.next();
    if (r < 0.4) {
      const speed = 0.1 + 0.2 * rng.next();
      const hours = push(AUTO_TRACK, 0.5, 1.5, speed);
      push(AUTO_POSITION, 0.3, 1);
      push(AUTO_TRACK, hours, hours, -speed);
    } else if (r < 0.52) {
      push(JOYSTICK, 0.2, 0.5);
      push(STANDBY, 6, 14, 0.55 + 0.25 * rng.next());
      push(JOYSTICK, 0.3, 0.6);
    }
  },
  supply: (rng, push) => {
    push(AUTO_POSITION, 3, 8);
    push(JOYSTICK, 0.2, 0.4);
    push(STANDBY, 5, 14, 0.6 + 0.25 * rng.next());
    push(JOYSTICK, 0.2, 0.5);
  },
  'shuttle tanker': (rng, push) => {
    push(AUTO_POSITION, 14, 28);
    push(JOYSTICK, 0.2, 0.4);
    push(STANDBY, 24, 60, 0.65 + 0.2 * rng.next());
    push(JOYSTICK, 0.4, 0.8);
  },
};

export function patternFor(type: string): Pattern {
  return PATTERNS[type.trim().toLowerCase()] ?? PATTERNS.construction!;
}

/**
 * The mode at any second, from segments generated forward from ANCHOR_S.
 * Queries are expected in increasing time (amortised O(1)); an earlier time
 * regenerates from the anchor.
 */
export class ModeSchedule {
  private rng!: Random;
  private queue: ModeSegment[] = [];
  private at = 0;
  private nextStart = ANCHOR_S;
  private readonly push: Push = (mode, minH, maxH, param = 0) => {
    const hours = minH + (maxH - minH) * this.rng.next();
    const seconds = Math.max(60, Math.round(hours * H));
    this.queue.push({ start: this.nextStart, end: this.nextStart + seconds, mode, param });
    this.nextStart += seconds;
    return hours;
  };
  /** The segment of the last query. */
  current: ModeSegment = { start: -Infinity, end: ANCHOR_S, mode: AUTO_POSITION, param: 0 };

  constructor(
    private readonly pattern: Pattern,
    private readonly seed: number,
  ) {
    this.restart();
  }

  /** Mode code (AUTO_POSITION … STANDBY) at second tS. */
  modeAt(tS: number): number {
    if (tS < this.current.start) this.restart();
    while (tS >= this.current.end) this.advance();
    return this.current.mode;
  }

  private restart(): void {
    this.rng = new Random(this.seed);
    this.queue = [];
    this.at = 0;
    this.nextStart = ANCHOR_S;
    this.current = { start: -Infinity, end: ANCHOR_S, mode: AUTO_POSITION, param: 0 };
  }

  private advance(): void {
    if (this.at >= this.queue.length) {
      this.queue.length = 0;
      this.at = 0;
      this.pattern(this.rng, this.push);
    }
    this.current = this.queue[this.at++]!;
  }
}
