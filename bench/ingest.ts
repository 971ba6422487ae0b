/**
 * npm run bench:ingest — how close the MQTT ingest path comes to the store's
 * own speed. In one run, on the same generated fleet traffic (vessels with 8
 * thrusters, 1-minute statistics, 14 table rows per interval):
 *   limit  the rows written straight to the store by the worker's writer
 *          (rendered as COPY text, COPY into staging + INSERT … ON
 *          CONFLICT), no MQTT, no JSON;
 *   e2e    contract messages (`records` batches and single records, QoS 1)
 *          through a broker into a `holdfast ingest` process, until the
 *          worker reports every row committed (checked against the tables).
 * Prints rows/s for each, the worker's memory, and a line per broker and
 * mode (the limit there is the mean of the limit runs just before and after
 * that e2e run), then last, for the live run on the last broker:
 *   ingest_ratio=R e2e_rows_per_s=N limit_rows_per_s=M
 * Target (issue 3): R ≥ 0.6 with Mosquitto; worker RSS < 250 MB.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import net from 'node:net';
import { Aedes } from 'aedes';
import mqtt from 'mqtt';
import { createPrisma } from '../lib/db/prisma';
import { importFleet } from '../lib/register/importFleet';
import { anyFreePort } from '../lib/net/freePort';
import { topicFor } from '../lib/telemetry/topic';
import { recordBatch } from '../ingest/recordBatch';
import { writeMessages, type PreparedMessage } from '../ingest/storeWriter';
import { Random } from '../seed/random';
import { benchDatabase, cpuSeconds, memoryOf, type BenchDatabase } from './benchEnv';
import { MOSQUITTO_BINARY, privateMosquitto, type PrivateBroker } from './privateMosquitto';
import { benchFleet, benchInterval, ROWS_PER_INTERVAL, type IntervalRecords } from './ingestFleet';

const VESSELS = Number(process.env.BENCH_VESSELS ?? 20);
const HOURS = Number(process.env.BENCH_HOURS ?? 12);
const SINGLE_SHARE = Number(process.env.BENCH_SINGLE_SHARE ?? 0.2); // share of hours sent as single-record messages
const STREAMS = ['station', 'thrusters', 'power', 'refs'] as const;
// BENCH_MODES / BENCH_BROKERS pick a subset while profiling, e.g. BENCH_BROKERS=mosquitto BENCH_MODES=backlog.
const MODES = (['backlog', 'live'] as const).filter((m) => (process.env.BENCH_MODES ?? 'backlog,live').split(',').includes(m));
const BROKERS = (process.env.BENCH_BROKERS ?? 'aedes,mosquitto').split(',');
const START = Date.UTC(2026, 10, 20);
const EXPECTED_ROWS = VESSELS * HOURS * 60 * ROWS_PER_INTERVAL;

interface Hour {
  vessel: string;
  single: boolean;
  records: Record<(typeof STREAMS)[number], unknown[]>;
}

function traffic(tag: string): Hour[] {
  const rng = new Random(42);
  const hours: Hour[] = [];
  for (let h = 0; h < HOURS; h++) {
    for (let v = 0; v < VESSELS; v++) {
      const records = { station: [], thrusters: [], power: [], refs: [] } as Hour['records'];
      for (let m = 0; m < 60; m++) {
        const r: IntervalRecords = benchInterval(START + (h * 60 + m) * 60_000, rng);
        for (const s of STREAMS) records[s].push(r[s]);
      }
      hours.push({ vessel: `bench-${tag}-${v}`, single: rng.next() < SINGLE_SHARE, records });
    }
  }
  return hours;
}

async function register(db: BenchDatabase, tag: string): Promise<Map<string, number>> {
  const prisma = createPrisma(db.url);
  await importFleet(prisma, benchFleet(VESSELS, tag));
  await prisma.$disconnect();
  const { rows } = await db.pool.query<{ key: string; id: number }>('SELECT key, id FROM vessel');
  return new Map(rows.map((r) => [r.key, r.id]));
}

async function limit(): Promise<number> {
  const db = await benchDatabase();
  try {
    const ids = await register(db, 'limit');
    const hours = traffic('limit');
    const client = await db.pool.connect();
    const started = performance.now();
    let batch: PreparedMessage[] = [];
    let rows = 0;
    const flush = async () => {
      await client.query('BEGIN');
      await writeMessages(client, batch, 'UTC');
      await client.query('COMMIT');
      batch = [];
      rows = 0;
    };
    for (const hour of hours) {
      for (const s of STREAMS) {
        // Rendered here, inside the timed loop: the worker renders every row too.
        const records = hour.records[s] as never[];
        batch.push({ topic: '', rejected: [], batch: recordBatch(s, ids.get(hour.vessel)!, records, () => records) });
      }
      rows += 60 * ROWS_PER_INTERVAL;
      if (rows >= 20_000) await flush();
    }
    if (batch.length) await flush();
    const seconds = (performance.now() - started) / 1000;
    client.release();
    const stored = await countRows(db);
    if (stored !== EXPECTED_ROWS) throw new Error(`limit phase stored ${stored} rows, expected ${EXPECTED_ROWS}`);
    console.log(`limit: ${EXPECTED_ROWS} rows in ${seconds.toFixed(2)} s (${db.label})`);
    return EXPECTED_ROWS / seconds;
  } finally {
    await db.close();
  }
}

async function countRows(db: BenchDatabase): Promise<number> {
  const { rows } = await db.pool.query<{ n: number }>(
    `SELECT ((SELECT count(*) FROM ts_station) + (SELECT count(*) FROM ts_thruster)
           + (SELECT count(*) FROM ts_power) + (SELECT count(*) FROM ts_ref))::int AS n`,
  );
  return rows[0]!.n;
}

/**
 * Rows the worker has committed (stored or skipped as duplicates), from its
 * own /metrics. The e2e clock stops on this rather than on counting the
 * tables: a count(*) over every table ten times a second kept PostgreSQL
 * scanning the very rows being timed (tens of ms a count near the end), on
 * the same two cores. The tables are counted once the clock has stopped.
 */
async function committedRows(metricsPort: number): Promise<number> {
  const text = await (await fetch(`http://127.0.0.1:${metricsPort}/metrics`)).text();
  let rows = 0;
  for (const m of text.matchAll(/^holdfast_ingest_(?:rows_stored|duplicates)_total\{[^}]*\} (\d+)$/gm)) rows += Number(m[1]);
  return rows;
}

/**
 * How long to wait before asking the worker again: half the time the rest
 * should take at the rate so far, between 20 and 500 ms. A scrape costs the
 * worker about 4 ms of CPU (its process metrics read /proc), so a run asks
 * a dozen or two times instead of every 100 ms, and still stops the clock
 * within about 20 ms of the last commit.
 */
function nextPollMs(committed: number, elapsedMs: number): number {
  const rest = committed > 0 ? ((EXPECTED_ROWS - committed) * elapsedMs) / committed : Infinity;
  return Math.min(500, Math.max(20, rest / 2));
}

function startWorker(db: BenchDatabase, mqttUrl: string, tag: string, metricsPort: number): Promise<ChildProcess> {
  // BENCH_WORKER_NODE_ARGS: extra node flags for the worker, e.g. "--cpu-prof --cpu-prof-dir=/tmp/prof".
  const nodeArgs = (process.env.BENCH_WORKER_NODE_ARGS ?? '').split(' ').filter(Boolean);
  const child = spawn(process.execPath, [...nodeArgs, 'bin/holdfast.mjs', 'ingest'], {
    env: {
      ...process.env,
      DATABASE_URL: db.url,
      MQTT_URL: mqttUrl,
      MQTT_TOPIC_ROOT: `bench-${tag}/v1`,
      MQTT_CLIENT_ID: `holdfast-bench-${tag}`,
      HOLDFAST_METRICS_PORT: String(metricsPort),
      LOG_LEVEL: 'info',
      LOG_FORMAT: 'json',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  return new Promise((resolve, reject) => {
    let output = '';
    const onData = (d: Buffer) => {
      output += d.toString();
      if (/subscribed to/.test(output)) resolve(child);
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', onData);
    child.once('exit', (code, signal) => signal !== 'SIGTERM' && reject(new Error(`worker exited (${code}): ${output}`)));
  });
}

type Mode = 'live' | 'backlog';

/**
 * live: the publisher sends while the worker runs (both share the cores).
 * backlog: everything is queued at the broker while the worker is stopped,
 * then the worker drains it — the store-and-forward case, and the worker's
 * own speed without a publisher competing for the CPU.
 */
async function endToEnd(mqttUrl: string, brokerLabel: string, mode: Mode): Promise<{ rowsPerS: number; peakMb: number }> {
  const tag = `${brokerLabel.slice(0, 1)}${mode.slice(0, 1)}${process.pid}`; // short: vessel keys have at most 32 characters
  const db = await benchDatabase();
  let worker: ChildProcess | undefined;
  try {
    await register(db, tag);
    const hours = traffic(tag);
    const metricsPort = await anyFreePort();
    worker = await startWorker(db, mqttUrl, tag, metricsPort);
    const publisher = await mqtt.connectAsync(mqttUrl, { clientId: `bench-pub-${tag}` });
    let peakMb = 0;
    const sampler = setInterval(() => void memoryOf(worker!.pid!).then((m) => (peakMb = Math.max(peakMb, m.rssMb))).catch(() => {}), 200);

    // Messages are serialised before the clock starts: the publisher shares the two cores.
    const messages: [topic: string, body: string][] = [];
    for (const hour of hours) {
      for (const s of STREAMS) {
        const topic = topicFor(`bench-${tag}/v1`, hour.vessel, s);
        if (hour.single) for (const r of hour.records[s]) messages.push([topic, JSON.stringify(r)]);
        else messages.push([topic, JSON.stringify({ records: hour.records[s] })]);
      }
    }
    let outstanding = 0;
    const publishAll = async () => {
      for (const [topic, body] of messages) {
        while (outstanding >= 500) await new Promise((r) => setTimeout(r, 1));
        outstanding++;
        publisher.publish(topic, body, { qos: 1 }, () => outstanding--);
      }
      while (outstanding > 0) await new Promise((r) => setTimeout(r, 5));
    };
    if (mode === 'backlog') {
      worker.kill('SIGTERM');
      await new Promise((r) => worker!.once('exit', r));
      await publishAll();
      worker = await startWorker(db, mqttUrl, tag, metricsPort);
    }
    // Other databases on the same server are other people's work: count this database's backends only.
    const backends = new RegExp(`^postgres: .* ${new URL(db.url).pathname.slice(1)} `);
    const cpuBefore = { worker: await cpuSeconds(worker.pid!), postgres: await cpuSeconds(backends), bench: process.cpuUsage() };
    const started = performance.now();
    if (mode === 'live') await publishAll();
    for (;;) {
      const committed = await committedRows(metricsPort);
      if (committed >= EXPECTED_ROWS) break;
      const elapsed = performance.now() - started;
      if (elapsed > 600_000) throw new Error(`e2e stalled at ${committed} of ${EXPECTED_ROWS} rows`);
      await new Promise((r) => setTimeout(r, nextPollMs(committed, elapsed)));
    }
    const seconds = (performance.now() - started) / 1000;
    const stored = await countRows(db);
    if (stored !== EXPECTED_ROWS) throw new Error(`e2e ${mode} stored ${stored} rows, expected ${EXPECTED_ROWS}`);
    const bench = process.cpuUsage(cpuBefore.bench);
    console.log(
      `  cpu seconds during e2e: worker ${((await cpuSeconds(worker.pid!)) - cpuBefore.worker).toFixed(2)}, ` +
        `postgres backends ${((await cpuSeconds(backends)) - cpuBefore.postgres).toFixed(2)}, ` +
        `publisher+embedded broker ${((bench.user + bench.system) / 1e6).toFixed(2)}`,
    );
    clearInterval(sampler);
    const final = await memoryOf(worker.pid!);
    peakMb = Math.max(peakMb, final.peakMb);
    await publisher.endAsync();
    console.log(`e2e ${mode} (${brokerLabel}): ${EXPECTED_ROWS} rows in ${seconds.toFixed(2)} s; worker peak RSS ${peakMb.toFixed(0)} MB`);
    return { rowsPerS: EXPECTED_ROWS / seconds, peakMb };
  } finally {
    if (worker && process.env.BENCH_WORKER_NODE_ARGS) {
      worker.kill('SIGINT');
      await new Promise((r) => worker!.once('exit', r));
    } else worker?.kill('SIGKILL');
    await db.close();
  }
}

async function embeddedBroker(): Promise<{ url: string; close(): Promise<void> }> {
  const broker = await Aedes.createBroker();
  const server = net.createServer(broker.handle);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  return {
    url: `mqtt://127.0.0.1:${(server.address() as net.AddressInfo).port}`,
    close: () => new Promise((resolve) => broker.close(() => server.close(() => resolve()))),
  };
}

/**
 * A Mosquitto for the run, configured as the README advises for ingest (a deep per-client queue, so a flood or a worker restart never
 * makes the broker drop QoS 1 messages), on a free port.
 */
/** A Mosquitto of the benchmark's own, or undefined where it is not installed. */
const ownMosquitto = async (): Promise<PrivateBroker | undefined> => (MOSQUITTO_BINARY ? privateMosquitto() : undefined);

async function main() {
  console.log(`bench:ingest — ${VESSELS} vessels × ${HOURS} h of 1-minute statistics = ${EXPECTED_ROWS} rows (${Math.round(SINGLE_SHARE * 100)} % of hours as single-record messages)`);
  // The limit is measured before and after every e2e run, and each run is compared with the mean of
  // the two beside it: on a shared machine the load changes within a minute, and a ratio against a
  // limit taken minutes earlier measured the neighbours as much as the worker.
  let limitBefore = await limit();
  const results: { label: string; rowsPerS: number; peakMb: number; limitRate: number }[] = [];
  const measure = async (url: string, broker: string, mode: Mode) => {
    const e2e = await endToEnd(url, broker, mode);
    const limitAfter = await limit();
    results.push({ label: `${broker.replace(' ', '-')} ${mode}`, ...e2e, limitRate: (limitBefore + limitAfter) / 2 });
    limitBefore = limitAfter;
  };
  if (BROKERS.includes('aedes')) {
    const aedes = await embeddedBroker();
    try {
      for (const mode of MODES) await measure(aedes.url, 'embedded aedes', mode);
    } finally {
      await aedes.close();
    }
  }
  if (BROKERS.includes('mosquitto')) {
    const given = process.env.BENCH_MQTT_URL;
    const own = given ? undefined : await ownMosquitto();
    try {
      const url = given ?? own?.url;
      if (url) for (const mode of MODES) await measure(url, 'mosquitto', mode);
      else console.log('mosquitto: not installed here; set BENCH_MQTT_URL to measure another broker');
    } finally {
      await own?.close();
    }
  }
  const line = (r: (typeof results)[number]) =>
    `ingest_ratio=${(r.rowsPerS / r.limitRate).toFixed(2)} e2e_rows_per_s=${Math.round(r.rowsPerS)} limit_rows_per_s=${Math.round(r.limitRate)}`;
  for (const r of results) {
    console.log(`broker=${r.label.split(' ')[0]} mode=${r.label.split(' ')[1]} worker_peak_rss_mb=${r.peakMb.toFixed(0)} ${line(r)}`);
  }
  // Last line: the live case (publisher and worker sharing the machine), on the last broker measured.
  const last = results.filter((r) => r.label.endsWith('live')).at(-1) ?? results.at(-1);
  if (last) console.log(line(last));
}

main().then(
  () => process.exit(0),
  (error) => {
    console.error(error);
    process.exit(1);
  },
);
