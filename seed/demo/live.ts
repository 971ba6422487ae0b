import type { FleetFile } from '../../lib/register/fleetFile';
import type { ScenarioPlan } from '../scenarios/plan';
import { SimulatedVessel } from './simulatedVessel';
import type { Sink } from './sinks';

export interface LiveOptions {
  fleet: FleetFile;
  plan: ScenarioPlan;
  sink: Sink;
  topicRoot: string;
  /** Interval length, seconds. */
  intervalS: number;
  /** Simulated time at the start (default: now), ms. */
  fromMs?: number;
  /**
   * Simulated seconds per real second (default 1: the intervals between `fromMs` and now go out at
   * once, then each as it ends). Simulated time never passes the real clock.
   */
  speed?: number;
  /** Publish each interval's 1 Hz track as a batch (default true). */
  track?: boolean;
  onError?: (e: Error) => void;
  /** The real clock (tests). */
  now?: () => number;
}

/**
 * Live demo telemetry: every vessel's interval published as it ends, as
 * single records (plus the track as one batch), in real time or accelerated
 * ×speed from `fromMs` until it catches up with the real clock, then in real
 * time. Records are never stamped in the future.
 */
export class LivePublisher {
  private readonly vessels: SimulatedVessel[];
  private readonly stepMs: number;
  private readonly speed: number;
  private readonly now: () => number;
  private readonly wallStart: number;
  private readonly simStart: number;
  private nextT: number;
  private timer?: NodeJS.Timeout;
  private stopped = false;
  private running?: Promise<void>;
  /** Interval steps published so far (each covers every vessel). */
  intervals = 0;

  constructor(private readonly o: LiveOptions) {
    this.now = o.now ?? Date.now;
    this.stepMs = o.intervalS * 1000;
    this.speed = o.speed ?? 1;
    this.wallStart = this.now();
    this.simStart = Math.floor((o.fromMs ?? this.wallStart) / this.stepMs) * this.stepMs;
    this.nextT = this.simStart;
    this.vessels = o.fleet.vessels.map((v, i) => new SimulatedVessel(v, i, o.plan, o.topicRoot, { track: o.track ?? true }));
  }

  /** Simulated time now: ×speed since the start, capped at the real clock (at speed 1: the real clock). */
  simNow(): number {
    const wall = this.now();
    return this.speed <= 1 ? wall : Math.min(wall, this.simStart + (wall - this.wallStart) * this.speed);
  }

  start(): void {
    const tick = async () => {
      this.running = this.publishDue();
      try {
        await this.running;
      } catch (e) {
        this.o.onError?.(e as Error);
      }
      if (this.stopped) return;
      const lag = this.nextT + this.stepMs - this.simNow();
      const realMs = this.simNow() >= this.now() - 1 ? lag : lag / this.speed;
      this.timer = setTimeout(() => void tick(), Math.max(10, realMs + 20));
    };
    void tick();
  }

  private async publishDue(): Promise<void> {
    while (!this.stopped && this.nextT + this.stepMs <= this.simNow()) {
      const t = this.nextT;
      for (const v of this.vessels) {
        const records = v.next(t, this.o.intervalS);
        const messages = [...(records ? v.singles(records) : []), ...v.dueReplay(t + this.stepMs)];
        for (const m of messages) await this.o.sink.publish(m.topic, m.payload);
      }
      this.nextT += this.stepMs;
      this.intervals++;
    }
  }

  async stop(): Promise<void> {
    this.stopped = true;
    clearTimeout(this.timer);
    await this.running?.catch(() => undefined);
  }
}
