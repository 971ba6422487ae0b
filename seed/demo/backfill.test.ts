import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readFleetFile } from '../../lib/register/fleetFile';
import { buildPlan, type ScenarioPlan } from '../scenarios/plan';
import { runBackfill } from './backfill';
import { LivePublisher } from './live';
import type { Sink } from './sinks';

const all = readFleetFile(readFileSync('seed/fleet.json', 'utf8'));
const FROM = Date.UTC(2026, 9, 5);
const HOUR = 3_600_000;

/** Keeps every message in order. */
class MemorySink implements Sink {
  readonly sent: { topic: string; payload: string }[] = [];
  messages = 0;
  bytes = 0;
  async publish(topic: string, payload: string) {
    this.sent.push({ topic, payload });
    this.messages++;
    this.bytes += payload.length;
  }
  async close() {}
}

const recordsOf = (payload: string): { t: string }[] => {
  const body = JSON.parse(payload) as { records?: { t: string }[] } & { t: string };
  return body.records ?? [body];
};

describe('demo backfill', () => {
  it('is deterministic for a seed: the same messages in the same order on 0 or 2 worker threads', async () => {
    const fleet = { ...all, vessels: all.vessels.slice(2, 5) };
    const plan = buildPlan(fleet, 9, FROM, 1);
    const run = async (workers: number) => {
      const sink = new MemorySink();
      const p = await runBackfill({ fleet, plan, fromMs: FROM, toMs: FROM + 3 * HOUR, topicRoot: 'det/v1', workers, sink });
      expect(p).toMatchObject({ vesselDays: 3, totalVesselDays: 3, records: 3 * 180, messages: sink.sent.length });
      return sink.sent;
    };
    const inThread = await run(0);
    expect(await run(2)).toEqual(inThread);
    // Day by day, vessels in register order, four statistics streams each, as records batches.
    expect(inThread.map((m) => m.topic.split('/').slice(2).join('/'))).toEqual(
      fleet.vessels.flatMap((v) => ['station', 'thrusters', 'power', 'refs'].map((s) => `${v.key}/${s}`)),
    );
    for (const m of inThread) expect(recordsOf(m.payload)).toHaveLength(180);
  }, 60_000);

  it('keeps a link outage back and sends it late, as records batches after newer data', async () => {
    const fleet = { ...all, vessels: [all.vessels[6]!] };
    const key = fleet.vessels[0]!.key;
    const plan: ScenarioPlan = { seed: 1, fromMs: FROM, days: 1, faults: [{ kind: 'link_outage', vessel: key, fromMs: FROM + HOUR, toMs: FROM + 2 * HOUR, replayMs: FROM + 3 * HOUR }] };
    const sink = new MemorySink();
    await runBackfill({ fleet, plan, fromMs: FROM, toMs: FROM + 4 * HOUR, topicRoot: 'out/v1', workers: 0, sink });
    const station = sink.sent.filter((m) => m.topic === `out/v1/${key}/station`).map((m) => recordsOf(m.payload).map((r) => Date.parse(r.t)));
    expect(station).toHaveLength(2);
    const [regular, backlog] = station as [number[], number[]];
    expect(regular).toHaveLength(180);
    expect(regular.some((t) => t >= FROM + HOUR && t < FROM + 2 * HOUR)).toBe(false);
    expect(backlog).toEqual(Array.from({ length: 60 }, (_, k) => FROM + HOUR + k * 60_000));
    // Every stream's backlog follows all of the regular batches.
    const firstLate = sink.sent.findIndex((m) => recordsOf(m.payload).length === 60);
    expect(sink.sent.slice(firstLate).every((m) => recordsOf(m.payload).length === 60)).toBe(true);
    expect(sink.sent.slice(firstLate).map((m) => m.topic.split('/').pop())).toEqual(['station', 'thrusters', 'power', 'refs']);
  }, 60_000);
});

describe('demo live', () => {
  it('publishes single records per interval (and the track as a batch), accelerated until it reaches the present, never ahead of it', async () => {
    const fleet = { ...all, vessels: all.vessels.slice(0, 2) };
    const plan = buildPlan(fleet, 1, FROM, 30);
    const sink = new MemorySink();
    const start = Date.now() - 2 * HOUR;
    const live = new LivePublisher({ fleet, plan, sink, topicRoot: 'live/v1', intervalS: 60, fromMs: start, speed: 7200 });
    live.start();
    await expect.poll(() => live.intervals, { timeout: 30_000, interval: 100 }).toBeGreaterThanOrEqual(100);
    await live.stop();
    const stations = sink.sent.filter((m) => m.topic.endsWith('/station')).map((m) => JSON.parse(m.payload) as { t: string; dt: number });
    expect(stations.length).toBe(2 * live.intervals);
    for (const s of stations) {
      expect(s.dt).toBe(60);
      expect(Date.parse(s.t) + 60_000).toBeLessThanOrEqual(Date.now());
    }
    const track = sink.sent.find((m) => m.topic.endsWith('/track'));
    if (track) expect(recordsOf(track.payload).length).toBeLessThanOrEqual(60);
  }, 60_000);
});
