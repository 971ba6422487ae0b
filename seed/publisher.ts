import mqtt, { type MqttClient } from 'mqtt';
import type { Logger } from '../lib/log/logger';
import type { FleetFile } from '../lib/register/fleetFile';
import { topicFor } from '../lib/telemetry/topic';
import { chunkRecords } from './chunkRecords';
import { DemoVessel, type DemoRecords } from './demoTelemetry';
import { demoSite } from './sites';

export interface DemoPublisherOptions {
  url: string;
  username?: string;
  password?: string;
  topicRoot: string;
  fleet: FleetFile;
  /** Interval length of live records, seconds. */
  intervalS: number;
  log: Logger;
}

const STREAMS = ['station', 'thrusters', 'power', 'refs'] as const;
const HISTORY_DT_S = 60;

/**
 * Publishes the demo fleet's telemetry over MQTT (QoS 1), exactly as a
 * vessel gateway would: live intervals as single records, history as
 * store-and-forward `records` batches.
 */
export class DemoPublisher {
  private client?: MqttClient;
  private timer?: NodeJS.Timeout;
  private readonly vessels: DemoVessel[];
  private nextT = 0;
  private stopped = false;

  constructor(private readonly options: DemoPublisherOptions) {
    this.vessels = options.fleet.vessels.map((v, i) => new DemoVessel(v, demoSite(i)));
  }

  async connect(): Promise<void> {
    this.client = await mqtt.connectAsync(this.options.url, {
      clientId: `holdfast-demo-${process.pid}`,
      username: this.options.username,
      password: this.options.password,
      protocolVersion: 4,
      reconnectPeriod: 2_000,
    });
  }

  /** Publish `days` of history ending at `untilMs`, one-minute intervals, as batches. */
  async publishHistory(days: number, untilMs: number): Promise<number> {
    const end = Math.floor(untilMs / 60_000) * 60_000;
    const start = end - days * 86_400_000;
    let count = 0;
    // Own generators: the live ones must keep seeing increasing times.
    const vessels = this.options.fleet.vessels.map((v, i) => new DemoVessel(v, demoSite(i)));
    for (const vessel of vessels) {
      // One day per pass keeps memory small for long histories.
      for (let dayStart = start; dayStart < end; dayStart += 86_400_000) {
        const batch: Record<(typeof STREAMS)[number], unknown[]> = { station: [], thrusters: [], power: [], refs: [] };
        for (let t = dayStart; t < Math.min(end, dayStart + 86_400_000); t += HISTORY_DT_S * 1000) {
          const records = vessel.interval(t, HISTORY_DT_S);
          for (const stream of STREAMS) batch[stream].push(records[stream]);
        }
        for (const stream of STREAMS) {
          for (const payload of chunkRecords(batch[stream])) {
            await this.client!.publishAsync(topicFor(this.options.topicRoot, vessel.vessel.key, stream), payload, { qos: 1 });
          }
          count += batch[stream].length;
        }
      }
    }
    return count;
  }

  /** Publish each interval as it ends, until `stop()`. */
  startLive(fromMs = Date.now()): void {
    const step = this.options.intervalS * 1000;
    this.nextT = Math.floor(fromMs / step) * step;
    const tick = async () => {
      const now = Date.now();
      while (this.nextT + step <= now) {
        for (const vessel of this.vessels) await this.publishInterval(vessel, vessel.interval(this.nextT, this.options.intervalS));
        this.nextT += step;
      }
      if (this.stopped) return;
      this.timer = setTimeout(() => void tick().catch((e) => this.options.log.warn(`demo publish failed: ${(e as Error).message}`)), this.nextT + step - Date.now() + 50);
    };
    void tick();
  }

  /** Live intervals also send their 1 Hz track as one batch (history does not: 86,400 rows a vessel-day). */
  private async publishInterval(vessel: DemoVessel, records: DemoRecords) {
    for (const stream of STREAMS) {
      await this.client!.publishAsync(topicFor(this.options.topicRoot, vessel.vessel.key, stream), JSON.stringify(records[stream]), { qos: 1 });
    }
    const track = topicFor(this.options.topicRoot, vessel.vessel.key, 'track');
    await this.client!.publishAsync(track, JSON.stringify({ records: records.track }), { qos: 1 });
  }

  async stop(): Promise<void> {
    this.stopped = true;
    clearTimeout(this.timer);
    await this.client?.endAsync();
  }
}
