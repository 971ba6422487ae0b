/**
 * npm run bench:scale — ingest throughput with 1 and with 2 `holdfast ingest`
 * processes on one MQTT 5 shared subscription ($share/GROUP/…), against a
 * Mosquitto of our own, measured in the same run.
 *
 * Each run: a fresh database, BENCH_VESSELS (20) generated vessels ×
 * BENCH_HOURS (12) h of 1-minute statistics (bench/ingestFleet.ts: 14 rows an
 * interval) sent as one `records` message per vessel-hour and stream, QoS 1,
 * while the workers run; the clock stops when the workers' /metrics report
 * every row committed, and the tables are then counted (exact, or the run
 * fails). Runs go 1, 2, 2, 1 workers (BENCH_ROUNDS pairs), so a change in the
 * machine's load over the run weighs on both. CPU seconds per process show
 * where the time went: on two cores, with PostgreSQL, the broker and the
 * publisher on the same machine, a second worker may add no throughput.
 *
 * Last line: scale_ratio=R rows_per_s_1=N rows_per_s_2=M  (R = 2 workers / 1)
 */
import os from 'node:os';
import mqtt from 'mqtt';
import { createPrisma } from '../lib/db/prisma';
import { importFleet } from '../lib/register/importFleet';
import { topicFor } from '../lib/telemetry/topic';
import { Random } from '../seed/random';
import { benchDatabase, cpuSeconds } from './benchEnv';
import { benchFleet, benchInterval, ROWS_PER_INTERVAL } from './ingestFleet';
import { privateMosquitto, type PrivateBroker } from './privateMosquitto';
import { startIngestProcess, type IngestProcess } from './scaleWorkers';

const VESSELS = Number(process.env.BENCH_VESSELS ?? 20);
const HOURS = Number(process.env.BENCH_HOURS ?? 12);
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 1);
const STREAMS = ['station', 'thrusters', 'power', 'refs'] as const;
const EXPECTED_ROWS = VESSELS * HOURS * 60 * ROWS_PER_INTERVAL;

interface RunResult {
  workers: number;
  rowsPerS: number;
  split: number[];
  cpu: { workers: number[]; postgres: number; broker: number; publisher: number };
  load: number;
}

/** The whole run's messages, serialised before the clock starts (the publisher shares the cores). */
function messages(tag: string, root: string): [string, string][] {
  const rng = new Random(42);
  const out: [string, string][] = [];
  for (let h = 0; h < HOURS; h++) {
    for (let v = 0; v < VESSELS; v++) {
      const records = { station: [], thrusters: [], power: [], refs: [] } as Record<(typeof STREAMS)[number], unknown[]>;
      for (let m = 0; m < 60; m++) {
        const r = benchInterval(Date.UTC(2026, 10, 20) + (h * 60 + m) * 60_000, rng);
        for (const s of STREAMS) records[s].push(r[s]);
      }
      for (const s of STREAMS) out.push([topicFor(root, `bench-${tag}-${v}`, s), JSON.stringify({ records: records[s] })]);
    }
  }
  return out;
}

async function run(broker: PrivateBroker, workerCount: number, index: number): Promise<RunResult> {
  const tag = `sc${index}${process.pid % 10000}`;
  const root = `scale-${tag}/v1`;
  const db = await benchDatabase();
  const workers: IngestProcess[] = [];
  try {
    const prisma = createPrisma(db.url);
    await importFleet(prisma, benchFleet(VESSELS, tag));
    await prisma.$disconnect();
    for (let w = 0; w < workerCount; w++) {
      workers.push(await startIngestProcess({ databaseUrl: db.url, mqttUrl: broker.url, topicRoot: root, clientId: `holdfast-${tag}-${w}`, sharedGroup: `ingest-${tag}` }));
    }
    const all = messages(tag, root);
    const publisher = await mqtt.connectAsync(broker.url, { clientId: `pub-${tag}`, protocolVersion: 5 });
    const backends = new RegExp(`^postgres: .* ${new URL(db.url).pathname.slice(1)} `);
    const cpu0 = {
      workers: await Promise.all(workers.map((w) => cpuSeconds(w.child.pid!))),
      postgres: await cpuSeconds(backends),
      broker: await cpuSeconds(broker.pid),
      publisher: process.cpuUsage(),
    };
    const started = performance.now();
    let outstanding = 0;
    for (const [topic, body] of all) {
      while (outstanding >= 500) await new Promise((r) => setTimeout(r, 1));
      outstanding++;
      publisher.publish(topic, body, { qos: 1 }, () => outstanding--);
    }
    let split: number[] = [];
    for (;;) {
      split = await Promise.all(workers.map(async (w) => (await w.counts()).rowsStored));
      if (split.reduce((a, b) => a + b, 0) >= EXPECTED_ROWS) break;
      if (performance.now() - started > 600_000) throw new Error(`stalled at ${split.join('+')} of ${EXPECTED_ROWS} rows`);
      await new Promise((r) => setTimeout(r, 50));
    }
    const seconds = (performance.now() - started) / 1000;
    const publisherCpu = process.cpuUsage(cpu0.publisher);
    const cpu = {
      workers: await Promise.all(workers.map(async (w, i) => (await cpuSeconds(w.child.pid!)) - cpu0.workers[i]!)),
      postgres: (await cpuSeconds(backends)) - cpu0.postgres,
      broker: (await cpuSeconds(broker.pid)) - cpu0.broker,
      publisher: (publisherCpu.user + publisherCpu.system) / 1e6,
    };
    await publisher.endAsync();
    const { rows } = await db.pool.query<{ n: number }>(
      `SELECT ((SELECT count(*) FROM ts_station) + (SELECT count(*) FROM ts_thruster)
             + (SELECT count(*) FROM ts_power) + (SELECT count(*) FROM ts_ref))::int AS n`,
    );
    if (rows[0]!.n !== EXPECTED_ROWS) throw new Error(`${workerCount} worker(s) stored ${rows[0]!.n} rows, expected ${EXPECTED_ROWS}`);
    const result = { workers: workerCount, rowsPerS: EXPECTED_ROWS / seconds, split, cpu, load: os.loadavg()[0]! };
    console.log(
      `${workerCount} worker(s): ${EXPECTED_ROWS} rows in ${seconds.toFixed(2)} s = ${Math.round(result.rowsPerS)} rows/s (split ${split.join(' / ')}); ` +
        `CPU s: workers ${cpu.workers.map((c) => c.toFixed(1)).join(' + ')}, postgres ${cpu.postgres.toFixed(1)}, mosquitto ${cpu.broker.toFixed(1)}, ` +
        `publisher ${cpu.publisher.toFixed(1)}; load average ${result.load.toFixed(1)}`,
    );
    return result;
  } finally {
    for (const w of workers) await w.stop();
    await db.close();
  }
}

async function main(): Promise<void> {
  console.log(`bench:scale — ${VESSELS} vessels × ${HOURS} h = ${EXPECTED_ROWS} rows a run; ${os.cpus().length} cores`);
  const broker = await privateMosquitto();
  const results: RunResult[] = [];
  try {
    let index = 0;
    for (let r = 0; r < ROUNDS; r++) for (const n of [1, 2, 2, 1]) results.push(await run(broker, n, index++));
  } finally {
    await broker.close();
  }
  const mean = (n: number) => {
    const rs = results.filter((r) => r.workers === n).map((r) => r.rowsPerS);
    return rs.reduce((a, b) => a + b, 0) / rs.length;
  };
  console.log(`scale_ratio=${(mean(2) / mean(1)).toFixed(2)} rows_per_s_1=${Math.round(mean(1))} rows_per_s_2=${Math.round(mean(2))}`);
}

main().then(
  () => process.exit(0),
  (error) => {
    console.error(error);
    process.exit(1);
  },
);
