import { z } from 'zod';

/**
 * Every environment setting Holdfast reads, in one schema. Nothing else in the
 * code base reads `process.env`: call `loadConfig()` once at start and pass
 * the result down.
 */

// loadConfig drops empty strings before parsing, so unset and "" are alike.
const optionalText = z.string().trim().optional();

/** A port number; with `off`, 0 is allowed and means "turned off". */
const port = (fallback: number, { off = false } = {}) => {
  const message = off ? 'must be a whole number from 0 (off) to 65535' : 'must be a whole number from 1 to 65535';
  return z.coerce
    .number({ error: message })
    .int(message)
    .min(off ? 0 : 1, message)
    .max(65535, message)
    .default(fallback);
};

const postgresUrl = optionalText.refine(
  (v) => v === undefined || /^postgres(ql)?:\/\/.+/.test(v),
  'must be a postgres:// or postgresql:// URL',
);

const mqttUrl = optionalText.refine(
  (v) => v === undefined || /^(mqtts?|wss?|tcp):\/\/.+/.test(v),
  'must be an mqtt://, mqtts://, ws:// or wss:// URL',
);

function isIanaZone(zone: string): boolean {
  try {
    new Intl.DateTimeFormat('en-GB', { timeZone: zone });
    return true;
  } catch {
    return false;
  }
}

const onOff = (fallback: 'on' | 'off') =>
  z
    .enum(['on', 'off', 'true', 'false', '1', '0'], { error: 'must be on or off' })
    .default(fallback)
    .transform((v) => v === 'on' || v === 'true' || v === '1');

export const envSchema = z.object({
  DATABASE_URL: postgresUrl,
  MQTT_URL: mqttUrl,
  MQTT_USERNAME: optionalText,
  MQTT_PASSWORD: optionalText,
  MQTT_TOPIC_ROOT: z
    .string()
    .trim()
    .default('fleet/v1')
    .refine(
      (v) => v.length > 0 && !/[#+]/.test(v) && !v.startsWith('/') && !v.endsWith('/'),
      'must be a topic prefix without wildcards or leading/trailing "/" (e.g. fleet/v1)',
    ),
  MQTT_CLIENT_ID: z.string().trim().min(1).max(64).default('holdfast-ingest'),
  // The share name of `$share/{group}/{filter}` (MQTT 5, section 4.8.2): no "/", "+" or "#".
  MQTT_SHARED_GROUP: optionalText.refine(
    (v) => v === undefined || /^[^/+#]{1,64}$/.test(v),
    'must be a group name of 1 to 64 characters without "/", "+" or "#"',
  ),
  PORT: port(3000),
  HOLDFAST_DATA_DIR: z.string().trim().min(1, 'must not be empty').default('./.holdfast'),
  FLEET_TIME_ZONE: z
    .string()
    .trim()
    .default('UTC')
    .refine(isIanaZone, 'must be an IANA time zone name such as UTC or Europe/Oslo'),
  HOLDFAST_STORE: z
    .enum(['auto', 'timescale', 'partitions'], { error: 'must be auto, timescale or partitions' })
    .default('auto'),
  HOLDFAST_EMBEDDED_PG_PORT: port(5488),
  HOLDFAST_EMBEDDED_MQTT_PORT: port(1884),
  HOLDFAST_METRICS_PORT: port(9464, { off: true }),
  INGEST_BATCH_ROWS: z.coerce
    .number({ error: 'must be a whole number of rows from 100 to 1000000' })
    .int('must be a whole number of rows from 100 to 1000000')
    .min(100, 'must be a whole number of rows from 100 to 1000000')
    .max(1_000_000, 'must be a whole number of rows from 100 to 1000000')
    .default(20_000),
  INGEST_BUFFER_ROWS: z.coerce
    .number({ error: 'must be a whole number of rows from 100 to 10000000' })
    .int('must be a whole number of rows from 100 to 10000000')
    .min(100, 'must be a whole number of rows from 100 to 10000000')
    .max(10_000_000, 'must be a whole number of rows from 100 to 10000000')
    .default(60_000),
  // Believe X-Forwarded-For (the entry the proxy appended) for the per-address sign-in limit:
  // on only behind a proxy that sets it, since a direct client can write the header itself.
  HOLDFAST_TRUST_PROXY: onOff('off'),
  HOLDFAST_DEMO: onOff('on'),
  HOLDFAST_DEMO_INTERVAL_S: z.coerce
    .number({ error: 'must be a whole number of seconds from 1 to 3600' })
    .int('must be a whole number of seconds from 1 to 3600')
    .min(1, 'must be a whole number of seconds from 1 to 3600')
    .max(3600, 'must be a whole number of seconds from 1 to 3600')
    .default(10),
  // Days of simulated history backfilled into a store without telemetry (0: none), and where the
  // demo's seeded faults are placed (seed/README.md).
  HOLDFAST_DEMO_HISTORY_DAYS: z.coerce
    .number({ error: 'must be a whole number of days from 0 to 365' })
    .int('must be a whole number of days from 0 to 365')
    .min(0, 'must be a whole number of days from 0 to 365')
    .max(365, 'must be a whole number of days from 0 to 365')
    .default(60),
  // Seed of the demo simulator and its scenario plan: the same seed gives the same data.
  HOLDFAST_DEMO_SEED: z.coerce
    .number({ error: 'must be a whole number from 0 to 4294967295' })
    .int('must be a whole number from 0 to 4294967295')
    .min(0, 'must be a whole number from 0 to 4294967295')
    .max(4_294_967_295, 'must be a whole number from 0 to 4294967295')
    .default(1),
  LOG_LEVEL: z
    .enum(['debug', 'info', 'warn', 'error'], { error: 'must be debug, info, warn or error' })
    .default('info'),
  LOG_FORMAT: z.enum(['auto', 'json', 'text'], { error: 'must be auto, json or text' }).default('auto'),
});

export type Env = z.infer<typeof envSchema>;
