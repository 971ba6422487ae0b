import type { Pool } from 'pg';
import { inject } from 'vitest';
import { IngestWorker } from '../../ingest/worker';
import { silentLogger } from '../../lib/log/logger';

/** A worker reading `topicRoot` into `pool`, quiet, on the test broker (not started). */
export const testWorker = (
  pool: Pool,
  clientId: string,
  topicRoot: string,
  extra: { sharedGroup?: string; processMetrics?: boolean } = {},
) => new IngestWorker({ pool, mqttUrl: inject('mqttUrl'), clientId, topicRoot, fleetTimeZone: 'UTC', log: silentLogger, ...extra });
