import { IngestWorker } from '../ingest/worker';
import { silentLogger } from '../lib/log/logger';
import type { TestDatabase } from './helpers/db';

/** What the broker access tests share (test/broker*.test.ts). */

/** A started ingest worker reading `topicRoot` at `mqttUrl` with these credentials. */
export async function signedInWorker(
  db: TestDatabase,
  options: { mqttUrl: string; username: string; password: string; clientId: string; topicRoot: string },
): Promise<IngestWorker> {
  const worker = new IngestWorker({
    pool: db.pool,
    mqttUrl: options.mqttUrl,
    mqttUsername: options.username,
    mqttPassword: options.password,
    clientId: options.clientId,
    topicRoot: options.topicRoot,
    fleetTimeZone: 'UTC',
    log: silentLogger,
    processMetrics: false,
  });
  await worker.start();
  return worker;
}

/** A minimal valid station record (telemetry-v1) at minute `minute` of `hour` on a fixed day. */
export function stationRecord(minute: number, hour = 10): string {
  const at = `2026-11-20T${String(hour).padStart(2, '0')}:${String(minute).padStart(2, '0')}:00Z`;
  return JSON.stringify({ v: 1, t: at, dt: 60, mode: 'auto_position', dp_s: 30, n: 0 });
}

/** The minutes of the station records stored for one vessel, in time order. */
export async function storedMinutes(db: TestDatabase, vesselKey: string): Promise<number[]> {
  const { rows } = await db.pool.query<{ m: number }>(
    `SELECT extract(minute FROM s.t)::int AS m FROM ts_station s JOIN vessel v ON v.id = s.vessel_id WHERE v.key = $1 ORDER BY s.t`,
    [vesselKey],
  );
  return rows.map((r) => r.m);
}
