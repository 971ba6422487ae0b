import { parse as parseYaml } from 'yaml';
import { z } from 'zod';
import { UNIT_ID, VESSEL_KEY } from '../telemetry/schemas';

/**
 * The fleet register file, version 1 (JSON, or YAML of the same shape).
 * `readFleetFile` returns the whole file or every error, each prefixed by its
 * path: `vessels[3].thrusters[1].rated_kw: must be > 0`.
 */

const positive = z.number({ error: 'must be a number' }).gt(0, 'must be > 0');
const day = z
  .string({ error: 'must be a date YYYY-MM-DD' })
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'must be a date YYYY-MM-DD')
  .refine((d) => !Number.isNaN(Date.parse(`${d}T00:00:00Z`)) && new Date(`${d}T00:00:00Z`).toISOString().startsWith(d), 'is not a real date');
const ascendingLimits = z
  .array(positive)
  .min(1, 'must list at least one limit')
  .refine((a) => a.every((v, i) => i === 0 || v > a[i - 1]!), 'must be ascending');
const unitId = z.string({ error: 'must be a string' }).regex(UNIT_ID, 'must match ^[A-Za-z0-9_-]{1,16}$');

const thruster = z.object({
  id: unitId,
  kind: z.enum(['tunnel', 'azimuth', 'main', 'retractable', 'other'], { error: 'must be tunnel, azimuth, main, retractable or other' }),
  rated_kw: positive,
  diameter_m: positive.optional(),
  life_exponent: positive.default(3),
  service_interval_h: positive,
  wear_h_at_install: z.number({ error: 'must be a number' }).min(0, 'must be ≥ 0').default(0),
});

const vessel = z.object({
  key: z.string({ error: 'must be a string' }).regex(VESSEL_KEY, 'must match ^[a-z0-9][a-z0-9-]{1,31}$'),
  name: z.string({ error: 'must be a string' }).trim().min(1, 'must not be empty'),
  type: z.string({ error: 'must be a string' }).trim().min(1, 'must not be empty'),
  dp_class: z.union([z.literal(1), z.literal(2), z.literal(3)], { error: 'must be 1, 2 or 3' }),
  watch_circles_m: ascendingLimits,
  heading_limits_deg: ascendingLimits,
  thrusters: z.array(thruster),
  buses: z.array(z.object({ id: unitId, rated_kw: positive })),
  refs: z
    .array(
      z.object({
        id: unitId,
        kind: z.enum(['gnss', 'hydroacoustic', 'laser', 'radar', 'taut_wire', 'other'], {
          error: 'must be gnss, hydroacoustic, laser, radar, taut_wire or other',
        }),
      }),
    ),
});

const campaign = z
  .object({
    key: z.string({ error: 'must be a string' }).regex(VESSEL_KEY, 'must match ^[a-z0-9][a-z0-9-]{1,31}$'),
    charterer: z.string({ error: 'must be a string' }).trim().min(1, 'must not be empty'),
    vessels: z.array(z.string({ error: 'must be a vessel key' })).min(1, 'must list at least one vessel'),
    from: day,
    to: day,
    site: z.object({
      name: z.string({ error: 'must be a string' }).trim().min(1, 'must not be empty'),
      lat: z.number({ error: 'must be a number' }).min(-90, 'must be from -90 to 90').max(90, 'must be from -90 to 90'),
      lon: z.number({ error: 'must be a number' }).min(-180, 'must be from -180 to 180').max(180, 'must be from -180 to 180'),
    }),
    watch_circles_m: ascendingLimits,
  })
  .superRefine((c, ctx) => {
    if (c.from > c.to) ctx.addIssue({ code: 'custom', path: ['to'], message: 'must not be before from' });
  });

export const fleetFileSchema = z.object({
  v: z.literal(1, { error: 'must be 1' }),
  vessels: z.array(vessel),
  campaigns: z.array(campaign).default([]),
});

/**
 * Checks across entries (duplicate keys and ids, campaign vessels missing from
 * the file). They read the raw body so that they report alongside the field
 * errors instead of waiting for those to be fixed first.
 */
function crossChecks(body: unknown): string[] {
  const errors: string[] = [];
  const list = (v: unknown, key: string): unknown[] => {
    const items = (v as Record<string, unknown> | null)?.[key];
    return Array.isArray(items) ? items : [];
  };
  const field = (v: unknown, key: string): unknown => (v as Record<string, unknown> | null)?.[key];
  const duplicates = (items: unknown[], key: string, path: string, label: string) => {
    const seen = new Set<unknown>();
    items.forEach((item, i) => {
      const k = field(item, key);
      if (typeof k !== 'string') return;
      if (seen.has(k)) errors.push(`${path}[${i}]: ${label} "${k}" is listed twice`);
      seen.add(k);
    });
  };

  const vessels = list(body, 'vessels');
  duplicates(vessels, 'key', 'vessels', 'vessel');
  vessels.forEach((v, i) => {
    duplicates(list(v, 'thrusters'), 'id', `vessels[${i}].thrusters`, 'thruster');
    duplicates(list(v, 'buses'), 'id', `vessels[${i}].buses`, 'bus');
    duplicates(list(v, 'refs'), 'id', `vessels[${i}].refs`, 'reference system');
  });
  const campaigns = list(body, 'campaigns');
  duplicates(campaigns, 'key', 'campaigns', 'campaign');
  const keys = new Set(vessels.map((v) => field(v, 'key')));
  campaigns.forEach((c, i) =>
    list(c, 'vessels').forEach((key, j) => {
      if (typeof key === 'string' && !keys.has(key)) errors.push(`campaigns[${i}].vessels[${j}]: vessel "${key}" is not in this file`);
    }),
  );
  return errors;
}

export type FleetFile = z.infer<typeof fleetFileSchema>;
export type FleetVessel = FleetFile['vessels'][number];

export class FleetFileError extends Error {
  constructor(readonly errors: string[]) {
    super(`The fleet register file has ${errors.length} error${errors.length === 1 ? '' : 's'}:\n${errors.map((e) => `  ${e}`).join('\n')}`);
    this.name = 'FleetFileError';
  }
}

export function formatPath(path: readonly PropertyKey[]): string {
  return path.map((p, i) => (typeof p === 'number' ? `[${p}]` : i === 0 ? String(p) : `.${String(p)}`)).join('');
}

/** Parse and validate a register file's text; YAML when the name says so or it is not JSON. */
export function readFleetFile(text: string, fileName = 'fleet.json'): FleetFile {
  let body: unknown;
  try {
    body = /\.ya?ml$/i.test(fileName) ? parseYaml(text) : JSON.parse(text);
  } catch (error) {
    throw new FleetFileError([`${fileName}: cannot be read (${(error as Error).message.split('\n')[0]})`]);
  }
  const result = fleetFileSchema.safeParse(body);
  const errors = [
    ...(result.error?.issues ?? []).map((issue) => `${formatPath(issue.path) || '(file)'}: ${issue.message}`),
    ...crossChecks(body),
  ];
  if (errors.length > 0 || !result.success) throw new FleetFileError(errors);
  return result.data;
}
