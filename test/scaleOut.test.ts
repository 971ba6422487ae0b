import mqtt from 'mqtt';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { benchFleet, benchInterval, ROWS_PER_INTERVAL } from '../bench/ingestFleet';
import { MOSQUITTO_BINARY, privateMosquitto, type PrivateBroker } from '../bench/privateMosquitto';
import { startIngestProcess, type IngestProcess, type WorkerCounts } from '../bench/scaleWorkers';
import { topicFor } from '../lib/telemetry/topic';
import { Random } from '../seed/random';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { registerFleet, uniqueSuffix } from './helpers/fleet';
import { waitFor } from './helpers/waitFor';

/**
 * Issue 9, "must show 3": two `holdfast ingest` processes on one MQTT 5
 * shared subscription ($share/GROUP/…) against a Mosquitto of our own split a
 * fleet's traffic: every record is stored exactly once (none lost, none
 * doubled) and each worker takes a real share. Records go one per message,
 * so the broker hands out thousands of messages and the split is visible
 * per worker. Skipped, with the reason in its name, where Mosquitto is not
 * installed (the embedded aedes broker has no shared subscriptions).
 */
const VESSELS = 24;
const MINUTES = 40;
const STREAMS = ['station', 'thrusters', 'power', 'refs'] as const;
const MESSAGES = VESSELS * MINUTES * STREAMS.length;
const ROWS = VESSELS * MINUTES * ROWS_PER_INTERVAL;

describe.skipIf(!MOSQUITTO_BINARY)(`scale-out: two ingest processes on one shared subscription${MOSQUITTO_BINARY ? '' : ' (skipped: mosquitto is not installed)'}`, () => {
  const s = uniqueSuffix();
  const tag = `so${s}`;
  const root = `scale-${s}/v1`;
  let db: TestDatabase;
  let broker: PrivateBroker;
  const workers: IngestProcess[] = [];

  beforeAll(async () => {
    db = await createMigratedDatabase();
    await registerFleet(db.url, benchFleet(VESSELS, tag));
    broker = await privateMosquitto();
    for (const name of ['a', 'b']) {
      workers.push(await startIngestProcess({ databaseUrl: db.url, mqttUrl: broker.url, topicRoot: root, clientId: `holdfast-scale-${name}-${s}`, sharedGroup: `ingest-${s}` }));
    }
  });
  afterAll(async () => {
    for (const w of workers) await w.stop();
    await broker?.close();
    await db?.drop();
  });

  const tableCounts = async () =>
    (
      await db.pool.query(
        `SELECT (SELECT count(*) FROM ts_station)::int AS station, (SELECT count(*) FROM ts_thruster)::int AS thruster,
                (SELECT count(*) FROM ts_power)::int AS power, (SELECT count(*) FROM ts_ref)::int AS ref,
                (SELECT count(*) FROM quarantine)::int AS rejected`,
      )
    ).rows[0];

  it('subscribes both workers to the same $share group over MQTT 5', () => {
    for (const w of workers) expect(w.output()).toContain(`subscribed to $share/ingest-${s}/${root}/+/+ (MQTT 5)`);
  });

  it(
    `stores ${MESSAGES} single-record messages exactly once between them, each worker taking a real share`,
    async () => {
      const rng = new Random(9);
      const publisher = await mqtt.connectAsync(broker.url, { clientId: `scale-pub-${s}`, protocolVersion: 5 });
      try {
        let outstanding = 0;
        for (let m = 0; m < MINUTES; m++) {
          for (let v = 0; v < VESSELS; v++) {
            const records = benchInterval(Date.UTC(2026, 10, 20, 6) + m * 60_000, rng);
            for (const stream of STREAMS) {
              while (outstanding >= 200) await new Promise((r) => setTimeout(r, 1));
              outstanding++;
              publisher.publish(topicFor(root, `bench-${tag}-${v}`, stream), JSON.stringify(records[stream]), { qos: 1 }, () => outstanding--);
            }
          }
        }
        await waitFor(() => outstanding === 0, 30_000, 'every PUBACK from the broker');
      } finally {
        await publisher.endAsync();
      }

      let counts: WorkerCounts[] = [];
      const total = async () => {
        counts = await Promise.all(workers.map((w) => w.counts()));
        return counts.reduce((n, c) => n + c.messages, 0);
      };
      await waitFor(async () => (await total()) >= MESSAGES, 40_000, `${MESSAGES} committed messages`);
      await new Promise((r) => setTimeout(r, 1_000)); // a stray second delivery would show now
      await total();

      // None lost, none doubled: exactly the rows sent, in every table, and every message taken once.
      expect(await tableCounts()).toEqual({ station: VESSELS * MINUTES, thruster: VESSELS * MINUTES * 8, power: VESSELS * MINUTES * 2, ref: VESSELS * MINUTES * 3, rejected: 0 });
      expect(counts.reduce((n, c) => n + c.messages, 0)).toBe(MESSAGES);
      expect(counts.reduce((n, c) => n + c.rowsStored, 0)).toBe(ROWS);
      expect(counts.map((c) => c.duplicates)).toEqual([0, 0]);
      // A real share each: Mosquitto deals shared messages round robin, so about half; a quarter is the floor here.
      for (const c of counts) expect(c.messages).toBeGreaterThan(MESSAGES / 4);
      console.log(`scale-out: ${MESSAGES} messages split ${counts.map((c) => c.messages).join(' / ')} between the two workers`);
    },
    60_000,
  );
});
