import { spawn, type ChildProcess } from 'node:child_process';
import { stopChild } from '../cli/webServer';
import { anyFreePort } from '../lib/net/freePort';

/** What one worker has committed so far, from its own /metrics (sums over every stream and reason). */
export interface WorkerCounts {
  messages: number;
  rowsStored: number;
  duplicates: number;
  rejected: number;
}

export interface IngestProcess {
  child: ChildProcess;
  clientId: string;
  metricsPort: number;
  /** Everything the process printed so far. */
  output(): string;
  counts(): Promise<WorkerCounts>;
  stop(): Promise<void>;
}

export interface IngestProcessOptions {
  databaseUrl: string;
  mqttUrl: string;
  topicRoot: string;
  clientId: string;
  /** MQTT_SHARED_GROUP: workers with the same group split the traffic ($share/GROUP/…). */
  sharedGroup?: string;
}

const sum = (text: string, metric: string) => {
  let n = 0;
  for (const m of text.matchAll(new RegExp(`^${metric}(?:\\{[^}]*\\})? (\\d+)$`, 'gm'))) n += Number(m[1]);
  return n;
};

/**
 * One `holdfast ingest` process, as production runs it (its own process, its
 * own client id, settings from the environment), resolved once it has
 * subscribed. For the scale-out test and bench:scale.
 */
export async function startIngestProcess(o: IngestProcessOptions): Promise<IngestProcess> {
  const metricsPort = await anyFreePort();
  const child = spawn(process.execPath, ['bin/holdfast.mjs', 'ingest'], {
    env: {
      ...process.env,
      DATABASE_URL: o.databaseUrl,
      MQTT_URL: o.mqttUrl,
      MQTT_TOPIC_ROOT: o.topicRoot,
      MQTT_CLIENT_ID: o.clientId,
      ...(o.sharedGroup ? { MQTT_SHARED_GROUP: o.sharedGroup } : {}),
      HOLDFAST_METRICS_PORT: String(metricsPort),
      LOG_LEVEL: 'info',
      LOG_FORMAT: 'json',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  await new Promise<void>((resolve, reject) => {
    const onData = (d: Buffer) => {
      output += d.toString();
      if (/subscribed to/.test(output)) resolve();
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', onData);
    child.once('exit', (code) => reject(new Error(`holdfast ingest exited (${code}) before subscribing: ${output}`)));
  });
  return {
    child,
    clientId: o.clientId,
    metricsPort,
    output: () => output,
    async counts() {
      const text = await (await fetch(`http://127.0.0.1:${metricsPort}/metrics`)).text();
      return {
        messages: sum(text, 'holdfast_ingest_messages_total'),
        rowsStored: sum(text, 'holdfast_ingest_rows_stored_total'),
        duplicates: sum(text, 'holdfast_ingest_duplicates_total'),
        rejected: sum(text, 'holdfast_ingest_rejected_total'),
      };
    },
    stop: () => stopChild(child, 10_000),
  };
}
