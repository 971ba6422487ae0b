import { readFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { loadConfig, type Config } from '../lib/config';
import { readFleetFile, type FleetFile } from '../lib/register/fleetFile';
import { writeGroundTruth } from './scenarios/groundTruth';
import { buildPlan, DAY_MS } from './scenarios/plan';
import { runBackfill } from './demo/backfill';
import { historyStart, parseDay } from './demo/history';
import { LivePublisher } from './demo/live';
import { formatBytes, progressBar } from './demo/progress';
import { MqttSink, NdjsonSink, type Sink } from './demo/sinks';

const HELP = `npm run demo -- <mode> [options]     the demo fleet simulator (seed/README.md)

Modes:
  backfill            simulate the history of the whole fleet and publish it as fast as
                      possible, as records batches (progress bar on stderr)
  live                publish each interval as it ends, in real time or ×--speed

Options:
  --days D            history length in days: what backfill publishes, and where both
                      modes place the seeded faults (default HOLDFAST_DEMO_HISTORY_DAYS, 60)
  --from YYYY-MM-DD   first day of the history (default: D days before today, UTC);
                      with --from a backfill covers exactly D days, without it up to now
  --seed N            simulator and scenario seed (default HOLDFAST_DEMO_SEED, 1)
  --out FILE.ndjson   write {"topic","payload"} lines to FILE instead of publishing
  --truth FILE        ground-truth file (default: FILE.ground-truth.json beside --out,
                      else demo-ground-truth.json)
  --url URL           broker (default MQTT_URL, else the broker of a running holdfast start)
  --root ROOT         topic root (default MQTT_TOPIC_ROOT, fleet/v1)
  --fleet FILE        fleet register (default seed/fleet.json); --vessels K1,K2 a subset
  --workers N         backfill threads (default: the cores; 0 = this thread)
  --track             backfill: also the 1 Hz track stream (86,400 records a vessel-day)
  --no-track          live: without the track stream
  --interval S        live: interval length in seconds (default HOLDFAST_DEMO_INTERVAL_S)
  --speed N           live: simulated time runs N times faster, from --start until it
                      reaches the present, then in real time (default 1)
  --start ISO         live: simulated time to start at (default now; with --speed > 1, 24 h ago)

The same seed, --from and --days give the same data.`;

export class DemoUsageError extends Error {
  constructor(
    message: string,
    readonly exitCode = 2,
  ) {
    super(message);
  }
}

interface Args {
  mode: 'backfill' | 'live';
  days: number;
  fromMs?: number;
  seed: number;
  out?: string;
  truth: string;
  url?: string;
  root: string;
  fleet: FleetFile;
  workers: number;
  track?: boolean;
  intervalS: number;
  speed: number;
  startMs?: number;
}

function number(value: string | undefined, name: string, fallback: number, min: number): number {
  if (value === undefined) return fallback;
  const n = Number(value);
  if (!Number.isFinite(n) || n < min) throw new DemoUsageError(`--${name} must be a number ≥ ${min}`);
  return n;
}

export function parseDemoArgs(argv: string[], config: Config): Args {
  const { positionals, values } = parseArgs({
    args: argv,
    allowPositionals: true,
    options: {
      days: { type: 'string' },
      from: { type: 'string' },
      seed: { type: 'string' },
      out: { type: 'string' },
      truth: { type: 'string' },
      url: { type: 'string' },
      root: { type: 'string' },
      fleet: { type: 'string' },
      vessels: { type: 'string' },
      workers: { type: 'string' },
      track: { type: 'boolean' },
      'no-track': { type: 'boolean' },
      interval: { type: 'string' },
      speed: { type: 'string' },
      start: { type: 'string' },
      help: { type: 'boolean', short: 'h' },
    },
  });
  const mode = positionals[0];
  if (values.help) throw new DemoUsageError(HELP, 0);
  if (mode !== 'backfill' && mode !== 'live') throw new DemoUsageError(HELP);
  const fleetFile = values.fleet ?? 'seed/fleet.json';
  let fleet = readFleetFile(readFileSync(fleetFile, 'utf8'), fleetFile);
  if (values.vessels) {
    const keys = values.vessels.split(',').map((k) => k.trim());
    const unknown = keys.filter((k) => !fleet.vessels.some((v) => v.key === k));
    if (unknown.length) throw new DemoUsageError(`--vessels: not in ${fleetFile}: ${unknown.join(', ')}`);
    fleet = { ...fleet, vessels: fleet.vessels.filter((v) => keys.includes(v.key)) };
  }
  let fromMs: number | undefined;
  let startMs: number | undefined;
  try {
    if (values.from) fromMs = parseDay(values.from);
    if (values.start) {
      startMs = Date.parse(values.start);
      if (Number.isNaN(startMs)) throw new Error(`--start: not a date and time: ${values.start}`);
    }
  } catch (e) {
    throw new DemoUsageError((e as Error).message);
  }
  const out = values.out;
  return {
    mode,
    days: Math.floor(number(values.days, 'days', config.HOLDFAST_DEMO_HISTORY_DAYS, 1)),
    fromMs,
    seed: Math.floor(number(values.seed, 'seed', config.HOLDFAST_DEMO_SEED, 0)) >>> 0,
    out,
    truth: values.truth ?? (out ? out.replace(/\.ndjson$/i, '') + '.ground-truth.json' : 'demo-ground-truth.json'),
    url: values.url,
    root: values.root ?? config.MQTT_TOPIC_ROOT,
    fleet,
    workers: Math.floor(number(values.workers, 'workers', os.availableParallelism(), 0)),
    track: values['no-track'] ? false : values.track,
    intervalS: Math.floor(number(values.interval, 'interval', config.HOLDFAST_DEMO_INTERVAL_S, 1)),
    speed: number(values.speed, 'speed', 1, 1),
    startMs,
  };
}

/** The broker: --url, MQTT_URL, or the embedded one of a running `holdfast start` (its runtime file). */
async function brokerUrl(args: Args, config: Config): Promise<string> {
  if (args.url) return args.url;
  if (config.MQTT_URL) return config.MQTT_URL;
  const { readRuntimeFile } = await import('../cli/runtime');
  const running = readRuntimeFile(config);
  if (running) return running.mqttUrl;
  throw new DemoUsageError('no broker: give --url, set MQTT_URL, or run holdfast start first (or use --out FILE.ndjson)');
}

/** `npm run demo -- …`: returns when a backfill is done; live runs until SIGINT/SIGTERM. */
export async function demoCli(argv: string[], config: Config = loadConfig()): Promise<void> {
  const args = parseDemoArgs(argv, config);
  const now = Date.now();
  const fromMs = args.fromMs ?? historyStart(now, args.days);
  const plan = buildPlan(args.fleet, args.seed, fromMs, args.days);
  writeGroundTruth(args.truth, plan);
  const sink: Sink = args.out
    ? new NdjsonSink(args.out)
    : await MqttSink.connect({ url: await brokerUrl(args, config), username: config.MQTT_USERNAME, password: config.MQTT_PASSWORD });
  const where = args.out ? path.resolve(args.out) : `${args.root}/… over MQTT`;
  console.error(`demo ${args.mode}: ${args.fleet.vessels.length} vessels, seed ${args.seed}, faults from ${new Date(fromMs).toISOString().slice(0, 10)}; ground truth in ${args.truth}; data to ${where}`);

  if (args.mode === 'backfill') {
    // Never past the present: the ingest worker refuses records from the future.
    const toMs = Math.min(fromMs + args.days * DAY_MS, Math.floor(now / 60_000) * 60_000);
    if (args.fromMs === undefined && toMs < now - 60_000) throw new Error('internal: history ends before now');
    const bar = progressBar();
    try {
      const done = await runBackfill({ fleet: args.fleet, plan, fromMs, toMs, topicRoot: args.root, track: args.track ?? false, workers: args.workers, sink, onProgress: bar.update });
      bar.done(done);
      console.error(`backfill: ${done.records} intervals, ${done.messages} messages, ${formatBytes(done.bytes)} in ${(done.elapsedMs / 1000).toFixed(1)} s`);
    } finally {
      await sink.close();
    }
    return;
  }

  const live = new LivePublisher({
    fleet: args.fleet,
    plan,
    sink,
    topicRoot: args.root,
    intervalS: args.intervalS,
    fromMs: args.startMs ?? (args.speed > 1 ? now - DAY_MS : now),
    speed: args.speed,
    track: args.track ?? true,
    onError: (e) => console.error(`demo live: ${e.message}`),
  });
  live.start();
  await new Promise<void>((resolve) => {
    process.once('SIGINT', resolve);
    process.once('SIGTERM', resolve);
  });
  await live.stop();
  await sink.close();
  console.error(`demo live: ${live.intervals} interval(s) of ${args.fleet.vessels.length} vessels, ${sink.messages} messages`);
}

// Run as a script (npm run demo), not when imported.
if (import.meta.url === `file://${process.argv[1]}` || process.argv[1]?.endsWith('seed/cli.ts')) {
  demoCli(process.argv.slice(2)).catch((error: unknown) => {
    if (error instanceof DemoUsageError) {
      (error.exitCode === 0 ? console.log : console.error)(error.message);
      process.exit(error.exitCode);
    }
    console.error(error instanceof Error && !(error.name === 'ConfigError' || error.name === 'FleetFileError') ? (error.stack ?? error.message) : String((error as Error).message ?? error));
    process.exit(1);
  });
}
