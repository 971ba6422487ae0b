import type { FleetVessel } from '../../lib/register/fleetFile';
import { topicFor } from '../../lib/telemetry/topic';
import { chunkRecords, chunkRecordTexts } from '../chunkRecords';
import { faultsFor } from '../scenarios/faults';
import { faultsOf, type ScenarioPlan } from '../scenarios/plan';
import { demoSite } from '../sites';
import type { TrackRecord } from '../../lib/telemetry/schemas';
import { VesselSimulator, type SimTexts } from '../sim/vesselSimulator';

/** One MQTT message: topic and UTF-8 JSON payload. */
export interface Message {
  topic: string;
  payload: string;
}

export const STAT_STREAMS = ['station', 'thrusters', 'power', 'refs'] as const;
type StatStream = (typeof STAT_STREAMS)[number];

/**
 * One demo vessel as its onboard gateway sees it: the simulator with the
 * scenario plan's faults, and the link. While the plan's link outage lasts the
 * gateway keeps the vessel's records; it sends them as `records` batches when
 * the replay time comes (the backlog arrives after newer data: late).
 */
export class SimulatedVessel {
  readonly key: string;
  private readonly sim: VesselSimulator;
  private readonly outage?: { fromMs: number; toMs: number; replayMs: number };
  private withheld: Record<StatStream, string[]> = { station: [], thrusters: [], power: [], refs: [] };
  private withheldTrack: TrackRecord[] = [];
  private pending = 0;

  constructor(
    vessel: FleetVessel,
    index: number,
    plan: ScenarioPlan,
    private readonly topicRoot: string,
    options: { track?: boolean; warmUpS?: number } = {},
  ) {
    this.key = vessel.key;
    this.sim = new VesselSimulator(vessel, demoSite(index), { seed: plan.seed, track: options.track, faults: faultsFor(plan, vessel), warmUpS: options.warmUpS });
    const outage = faultsOf(plan, vessel.key).find((f) => f.kind === 'link_outage');
    if (outage?.kind === 'link_outage') this.outage = outage;
  }

  /** The records (as JSON text) of [tMs, tMs + dt s), or undefined while the link is down (kept for the replay). */
  next(tMs: number, dt: number): SimTexts | undefined {
    const records = this.sim.intervalText(tMs, dt);
    const o = this.outage;
    if (!o || tMs < o.fromMs || tMs >= o.toMs) return records;
    for (const stream of STAT_STREAMS) this.withheld[stream].push(records[stream]);
    if (records.track) for (const r of records.track) this.withheldTrack.push(r);
    this.pending++;
    return undefined;
  }

  /** The backlog as `records` batches once `nowMs` has reached the replay time (else none). */
  dueReplay(nowMs: number): Message[] {
    return this.outage && this.pending > 0 && nowMs >= this.outage.replayMs ? this.flush() : [];
  }

  /** Whatever is still kept, as `records` batches. */
  flush(): Message[] {
    if (this.pending === 0) return [];
    const out: Message[] = [];
    for (const stream of STAT_STREAMS) {
      for (const payload of chunkRecordTexts(this.withheld[stream])) out.push({ topic: topicFor(this.topicRoot, this.key, stream), payload });
    }
    for (const payload of chunkRecords(this.withheldTrack)) out.push({ topic: topicFor(this.topicRoot, this.key, 'track'), payload });
    this.withheld = { station: [], thrusters: [], power: [], refs: [] };
    this.withheldTrack = [];
    this.pending = 0;
    return out;
  }

  /** Batches of a run of intervals (backfill): one or more `records` payloads per stream. */
  batches(records: readonly SimTexts[]): Message[] {
    const out: Message[] = [];
    for (const stream of STAT_STREAMS) {
      for (const payload of chunkRecordTexts(records.map((r) => r[stream]))) out.push({ topic: topicFor(this.topicRoot, this.key, stream), payload });
    }
    const track = records.flatMap((r) => r.track ?? []);
    for (const payload of chunkRecords(track)) out.push({ topic: topicFor(this.topicRoot, this.key, 'track'), payload });
    return out;
  }

  /** Single-record payloads of one interval (live), its track as one batch. */
  singles(records: SimTexts): Message[] {
    const out = STAT_STREAMS.map((stream) => ({ topic: topicFor(this.topicRoot, this.key, stream), payload: records[stream] }));
    if (records.track?.length) out.push({ topic: topicFor(this.topicRoot, this.key, 'track'), payload: JSON.stringify({ records: records.track }) });
    return out;
  }
}
