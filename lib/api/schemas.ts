/**
 * JSON Schemas (2020-12, the dialect of OpenAPI 3.1) of every object the API
 * answers with. lib/api/openapi.ts publishes them; the CSV columns follow
 * their property order (lib/api/flatten.ts); the API tests validate real
 * answers against the published document. Every object lists all its fields
 * as required and allows no others, so a field added, dropped or renamed in a
 * query without changing its schema fails the tests.
 *
 * Units are those of metrics-v1. A figure that cannot be computed is null,
 * never 0: such fields are `type: [T, "null"]`.
 */

export type JsonSchema = Record<string, unknown>;

const ref = (name: string): JsonSchema => ({ $ref: `#/components/schemas/${name}` });

const nullableNumber = (description: string): JsonSchema => ({ type: ['number', 'null'], description });
const nullableInteger = (description: string): JsonSchema => ({ type: ['integer', 'null'], minimum: 0, description });
const text = (description: string): JsonSchema => ({ type: 'string', description });
const day = (description: string): JsonSchema => ({ type: 'string', format: 'date', description });

function record(description: string, properties: Record<string, JsonSchema>): JsonSchema {
  return { type: 'object', description, properties, required: Object.keys(properties), additionalProperties: false };
}

const vesselKey = text('Vessel key from the fleet register');

/** within_pct: one entry per watch circle, keyed by the limit in metres as written in the register. */
const withinPct = (whose: string): JsonSchema => ({
  type: 'object',
  description:
    `Percentage of samples (DP intervals) inside each watch circle of ${whose}, keyed by the limit in metres ` +
    'as written in the fleet register; null when there were no samples. The bin holding the limit counts ' +
    'by the fraction of its width below it (metrics-v1).',
  propertyNames: { pattern: '^[0-9]+(\\.[0-9]+)?$' },
  additionalProperties: { type: ['number', 'null'], minimum: 0, maximum: 100 },
});

export const schemas = {
  Error: record('An error answer', {
    error: record('What went wrong', {
      code: {
        type: 'string',
        enum: [
          'invalid_day',
          'invalid_range',
          'range_too_long',
          'invalid_parameter',
          'unauthorized',
          'forbidden',
          'not_found',
          'internal_error',
        ],
        description: 'Stable, machine-readable code',
      },
      message: text('One line for a person'),
    }),
  }),

  Vessel: record('A registered vessel', {
    key: vesselKey,
    name: text('Vessel name'),
    type: text('Vessel type as registered'),
    dp_class: { type: 'integer', minimum: 1, maximum: 3, description: 'DP equipment class 1, 2 or 3' },
    last_seen: {
      type: ['string', 'null'],
      format: 'date-time',
      description: 'Start time of the latest station record (ISO 8601, UTC); null when the vessel never reported',
    },
    open_flags: { type: 'integer', minimum: 0, description: 'Trend flags with status open or acknowledged' },
  }),
  VesselList: record('Every registered vessel, by key', {
    vessels: { type: 'array', items: ref('Vessel') },
  }),

  VesselDay: record('One fleet day of a vessel (daily job output)', {
    day: day('Fleet day (FLEET_TIME_ZONE)'),
    dp_hours: { type: ['number', 'null'], minimum: 0, description: 'Σ dp_s / 3600 over all station intervals, hours; null when no station record of the day arrived' },
    p50_m: nullableNumber('Median radial error of DP intervals, m (10 means ≥ 10 m)'),
    p95_m: nullableNumber('95th percentile radial error, m (10 means ≥ 10 m)'),
    p95_overflow: { type: ['boolean', 'null'], description: 'True when p95 fell in the overflow bin: show "≥ 10 m"' },
    p99_m: nullableNumber('99th percentile radial error, m (10 means ≥ 10 m)'),
    r_rms_m: nullableNumber('RMS radial error, m'),
    r_max_m: nullableNumber('Largest radial error, m'),
    within_pct: withinPct('the vessel'),
    hdg_rms_deg: nullableNumber('RMS heading error, degrees'),
    hdg_max_abs_deg: nullableNumber('Largest absolute heading error, degrees'),
    wind_mean_ms: nullableNumber('Mean wind over DP intervals, weighted by dt, m/s'),
    gust_max_ms: nullableNumber('Largest gust over DP intervals, m/s'),
    current_mean_ms: nullableNumber('Mean current over DP intervals, weighted by dt, m/s'),
    p95_norm: nullableNumber('p95 as a ratio to what the vessel’s weather fit expects for the day (1 = as expected)'),
    limit_events: nullableInteger('Power limit events, all buses, every mode'),
    limit_seconds: nullableNumber('Seconds at the power limit, all buses, s'),
    limit_events_per_dp_day: nullableNumber('limit_events · 24 / dp_hours; null when there was no DP time'),
    blackouts: nullableInteger('Intervals with a blackout, all buses'),
    peak_load_ratio: nullableNumber('Largest kw_max / kw_available over intervals and buses'),
  }),
  VesselDaily: record('Daily figures of one vessel; days without a stored row are absent', {
    vessel: vesselKey,
    days: { type: 'array', items: ref('VesselDay') },
  }),

  ThrusterDay: record('One fleet day of one thruster', {
    day: day('Fleet day (FLEET_TIME_ZONE)'),
    thruster: text('Thruster id (unit id of the telemetry)'),
    run_hours: { type: 'number', minimum: 0, description: 'Σ run_s / 3600, hours' },
    wear_hours: nullableNumber(
      'Load-weighted equivalent hours at rated load (ISO 281 life exponent, Palmgren–Miner); null when it ran and no interval sent load bands',
    ),
    starts: { type: 'integer', minimum: 0, description: 'Σ starts' },
    azimuth_travel_deg: nullableNumber('Σ azimuth travel, degrees'),
    efficiency_index: nullableNumber('Σ(thrust_kn·run_s) / Σ(power_kw^(2/3)·run_s), kN/kW^(2/3)'),
  }),
  ThrusterDaily: record('Daily figures of a vessel’s thrusters; days without a stored row are absent', {
    vessel: vesselKey,
    days: { type: 'array', items: ref('ThrusterDay') },
  }),

  ThrusterService: record('A registered thruster’s wear against its service interval', {
    id: text('Thruster id'),
    kind: { type: 'string', enum: ['tunnel', 'azimuth', 'main', 'retractable', 'other'] },
    wear_hours_total: {
      type: 'number',
      description: 'wear_h_at_install + Σ daily wear_hours up to as_of (days with unknown wear add nothing), hours',
    },
    wear_hours_to_service: {
      type: 'number',
      description: 'Service interval − wear_hours_total, hours; negative when overdue',
    },
    projected_service_day: {
      type: ['string', 'null'],
      format: 'date',
      description:
        'as_of + ⌈to_service / rate⌉ days at the mean daily wear of the 30 days ending on as_of (days with a figure); as_of when due; null without a rate or more than 100 years ahead',
    },
  }),
  ThrusterList: record('Every registered thruster of a vessel, by id', {
    vessel: vesselKey,
    as_of: day('The day the projection is made on: today in the fleet time zone'),
    thrusters: { type: 'array', items: ref('ThrusterService') },
  }),

  RefDay: record('One fleet day of one position reference system', {
    day: day('Fleet day (FLEET_TIME_ZONE)'),
    ref: text('Reference system id (unit id of the telemetry)'),
    online_hours: nullableNumber('Σ online_s / 3600, hours'),
    weight_mean: nullableNumber('Mean weight, weighted by online_s'),
    sd_m_median: nullableNumber('Median of sd_m over intervals online, m'),
    rejections: nullableInteger('Σ rejected'),
  }),
  RefDaily: record('Daily figures of a vessel’s reference systems; days without a stored row are absent', {
    vessel: vesselKey,
    days: { type: 'array', items: ref('RefDay') },
  }),

  Flag: record('A trend flag', {
    id: { type: 'integer', minimum: 1 },
    vessel: vesselKey,
    subject: { type: 'string', pattern: '^(vessel|thruster:.+|ref:.+)$', description: 'vessel, thruster:ID or ref:ID' },
    metric: text('The metric that drifts'),
    method: text('The trend method (e.g. Mann–Kendall, EWMA)'),
    severity: { type: 'string', enum: ['advisory', 'warning', 'alarm'] },
    opened_day: day('Fleet day the flag opened'),
    window_from: day('First day of the window the statistic covers'),
    window_to: day('Last day of the window'),
    statistic: { type: 'number', description: 'Value of the statistic that triggered the flag' },
    statistic_name: text('What the statistic is'),
    explanation: text('One paragraph for a person'),
    status: { type: 'string', enum: ['open', 'acknowledged', 'closed'] },
  }),
  FlagList: record('Trend flags, newest first', {
    flags: { type: 'array', items: ref('Flag') },
  }),

  CampaignVesselFigures: record('One vessel over the campaign’s period', {
    vessel: vesselKey,
    name: text('Vessel name'),
    days_computed: { type: 'integer', minimum: 0, description: 'Days of the period with computed figures' },
    dp_hours: {
      type: ['number', 'null'],
      minimum: 0,
      description: 'Σ daily dp_hours over the computed days; null when no day is computed',
    },
    p95_m: nullableNumber('95th percentile radial error of the merged histograms of the period, m (10 means ≥ 10 m)'),
    p95_overflow: { type: ['boolean', 'null'], description: 'True when p95 fell in the overflow bin: show "≥ 10 m"' },
    within_pct: withinPct('the campaign'),
    limit_events: nullableInteger('Σ daily power limit events'),
    blackouts: nullableInteger('Σ daily blackouts'),
  }),
  CampaignReport: record('A campaign’s figures over its dates', {
    campaign: record('The campaign as registered', {
      key: text('Campaign key'),
      charterer: text('Charterer'),
      from: day('First day of the campaign'),
      to: day('Last day of the campaign'),
      site: record('Where the work is', {
        name: text('Site name'),
        lat: { type: 'number', minimum: -90, maximum: 90, description: 'Latitude, degrees (WGS84)' },
        lon: { type: 'number', minimum: -180, maximum: 180, description: 'Longitude, degrees (WGS84)' },
      }),
      watch_circles_m: { type: 'array', items: { type: 'number', minimum: 0 }, description: 'The campaign’s limits, m' },
    }),
    as_of: day('Today in the fleet time zone'),
    period: {
      oneOf: [
        record('The days reported: the campaign’s dates, clipped to as_of', {
          from: day('First day reported'),
          to: day('Last day reported'),
        }),
        { type: 'null', description: 'The campaign has not started yet' },
      ],
    },
    vessels: { type: 'array', items: ref('CampaignVesselFigures') },
  }),
} satisfies Record<string, JsonSchema>;

export type SchemaName = keyof typeof schemas;

/** The property names of a record schema, in order: the CSV columns. */
export function columnsOf(name: SchemaName): string[] {
  const schema = schemas[name] as { properties?: Record<string, unknown> };
  if (!schema?.properties) throw new Error(`schema ${name} has no properties`);
  return Object.keys(schema.properties);
}
