import Ajv2020 from 'ajv/dist/2020';
import { getSharedPool } from '../lib/db/sharedPool';
import { openApiDocument } from '../lib/api/openapi';
import { createApiToken } from '../lib/api/tokens';
import { readFleetFile } from '../lib/register/fleetFile';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { registerFleet } from './helpers/fleet';

/**
 * What the API tests share: a migrated database that the route handlers read
 * through the web app's own shared pool (each vitest file runs in its own
 * process, so one DATABASE_URL per file), a fleet with a campaign, a token,
 * direct calls of route handlers, daily rows written with SQL, and a
 * validator built from the served OpenAPI document.
 */

export interface ApiTest {
  db: TestDatabase;
  token: string;
  /** Vessel key → id. */
  ids: Record<string, number>;
}

/** Two vessels (one with thrusters and refs, one bare) and one campaign with both. */
export function apiFleet(campaign: { from: string; to: string }) {
  return readFleetFile(
    JSON.stringify({
      v: 1,
      vessels: [
        {
          key: 'kelvick-skua',
          name: 'Kelvick Skua',
          type: 'supply',
          dp_class: 2,
          watch_circles_m: [3, 5],
          heading_limits_deg: [3, 5],
          thrusters: [
            { id: 'T1', kind: 'tunnel', rated_kw: 900, service_interval_h: 1000, wear_h_at_install: 100 },
            { id: 'T2', kind: 'azimuth', rated_kw: 1500, service_interval_h: 2000 },
            { id: 'T3', kind: 'azimuth', rated_kw: 1500, service_interval_h: 500, wear_h_at_install: 600 },
          ],
          buses: [{ id: 'A', rated_kw: 3000 }],
          refs: [
            { id: 'GNSS1', kind: 'gnss' },
            { id: 'HPR1', kind: 'hydroacoustic' },
          ],
        },
        {
          key: 'ardle-shag',
          name: 'Ardle Shag, "the Shag"',
          type: 'construction',
          dp_class: 3,
          watch_circles_m: [2.5, 4],
          heading_limits_deg: [3, 5],
          thrusters: [],
          buses: [],
          refs: [],
        },
      ],
      campaigns: [
        {
          key: 'north-spool',
          charterer: 'Example Charterer',
          vessels: ['kelvick-skua', 'ardle-shag'],
          from: campaign.from,
          to: campaign.to,
          site: { name: 'Example Field', lat: 60.5, lon: 2.25 },
          watch_circles_m: [2, 3.05],
        },
      ],
    }),
  );
}

export async function startApiTest(campaign = { from: '2026-01-01', to: '2026-01-31' }): Promise<ApiTest> {
  const db = await createMigratedDatabase();
  // The route handlers read their settings through lib/config, as in the web app.
  process.env.DATABASE_URL = db.url;
  process.env.FLEET_TIME_ZONE = 'UTC';
  await registerFleet(db.url, apiFleet(campaign));
  const { rows } = await db.pool.query<{ key: string; id: number }>('SELECT key, id FROM vessel');
  const { token } = await createApiToken(db.pool, { name: 'api tests', role: 'admin' });
  return { db, token, ids: Object.fromEntries(rows.map((r) => [r.key, r.id])) };
}

export async function stopApiTest(t: ApiTest | undefined): Promise<void> {
  if (process.env.DATABASE_URL) await getSharedPool().end();
  await t?.db.drop();
}

type Handler<P> = (request: Request, context: { params: Promise<P> }) => Promise<Response> | Response;

/** GET `/api/v1{path}` straight through a route handler, as Next.js would call it. */
export function call<P>(handler: Handler<P>, path: string, params: P, token: string | null): Promise<Response> | Response {
  const headers: Record<string, string> = token === null ? {} : { authorization: `Bearer ${token}` };
  return handler(new Request(`http://holdfast.test/api/v1${path}`, { headers }), { params: Promise.resolve(params) });
}

/** A full daily_vessel row; `values` overrides columns. */
export async function insertVesselDay(db: TestDatabase, vesselId: number, day: string, values: Record<string, unknown> = {}) {
  const row: Record<string, unknown> = {
    vessel_id: vesselId,
    day,
    station_records: 1440,
    dp_intervals: 1440,
    dp_hours: 24,
    samples: 0,
    ...values,
  };
  const columns = Object.keys(row);
  // Column names come from this test file only; values are bound.
  await db.pool.query(
    `INSERT INTO daily_vessel (${columns.join(', ')}) VALUES (${columns.map((_, i) => `$${i + 1}`).join(', ')})`,
    Object.values(row).map((v) => (v !== null && typeof v === 'object' && !Array.isArray(v) ? JSON.stringify(v) : v)),
  );
}

/** A histogram of 101 bins with `counts` at the given bins. */
export function histogram(counts: Record<number, number>): number[] {
  const h = new Array<number>(101).fill(0);
  for (const [bin, n] of Object.entries(counts)) h[Number(bin)] = n;
  return h;
}

// ---- OpenAPI validation -------------------------------------------------

type Doc = {
  paths: Record<string, { get: { responses: Record<string, unknown> } }>;
  components: { schemas: Record<string, unknown>; responses: Record<string, unknown> };
};

const BASE = 'https://holdfast.test/openapi';

/**
 * Validates answers against the published document with Ajv's JSON Schema
 * 2020-12 dialect (the dialect of OpenAPI 3.1), strict mode on so a mistyped
 * keyword in the document fails too. The document's component schemas become
 * the $defs of one schema, and its refs are pointed at them.
 */
export function openApiValidator() {
  const doc = openApiDocument() as unknown as Doc;
  const retarget = (schema: unknown) =>
    JSON.parse(JSON.stringify(schema).replaceAll('"#/components/schemas/', `"${BASE}#/$defs/`)) as object;
  const ajv = new Ajv2020({ strict: true, allErrors: true, allowUnionTypes: true });
  ajv.addFormat('date', /^\d{4}-\d{2}-\d{2}$/);
  ajv.addFormat('date-time', /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d+)?Z$/);
  ajv.addSchema({ $id: BASE, $defs: retarget(doc.components.schemas) });

  const responseOf = (path: string, status: number) => {
    const operation = doc.paths[path];
    if (!operation) throw new Error(`the document has no path ${path}`);
    let response = operation.get.responses[String(status)] as { $ref?: string; content?: Record<string, { schema: unknown }> };
    if (!response) throw new Error(`${path} documents no ${status} answer`);
    if (response.$ref) response = doc.components.responses[response.$ref.split('/').pop()!] as typeof response;
    return response;
  };

  return {
    /** Ajv's errors for `body` as the JSON answer `status` of `path` (a document path like /vessels/{key}/daily); [] when valid. */
    errors(path: string, status: number, body: unknown): unknown[] {
      const schema = responseOf(path, status).content?.['application/json']?.schema;
      if (!schema) throw new Error(`${path} ${status} has no JSON schema`);
      const validate = ajv.compile(retarget(schema));
      return validate(body) ? [] : (validate.errors ?? []);
    },
    /** True when `path` documents a text/csv answer for `status`. */
    hasCsv(path: string, status: number): boolean {
      return Boolean(responseOf(path, status).content?.['text/csv']);
    },
  };
}

/** Reads a response as JSON after checking its status and JSON type. */
export async function jsonOf(response: Response, status = 200): Promise<any> {
  const text = await response.text();
  if (response.status !== status) throw new Error(`expected ${status}, got ${response.status}: ${text}`);
  if (!response.headers.get('content-type')?.startsWith('application/json')) throw new Error(`not JSON: ${text}`);
  return JSON.parse(text);
}

/** RFC 4180 records of a CSV answer (the tests' own small parser, independent of lib/api/csv.ts). */
export function parseCsv(text: string): string[][] {
  const records: string[][] = [];
  let field = '';
  let record: string[] = [];
  let i = 0;
  while (i < text.length) {
    if (text[i] === '"') {
      i++;
      while (i < text.length) {
        if (text[i] === '"' && text[i + 1] === '"') (field += '"'), (i += 2);
        else if (text[i] === '"') break;
        else field += text[i++];
      }
      i++;
    } else if (text[i] === ',') record.push(field), (field = ''), i++;
    else if (text.startsWith('\r\n', i)) record.push(field), records.push(record), (field = ''), (record = []), (i += 2);
    else field += text[i++];
  }
  if (field !== '' || record.length > 0) throw new Error('CSV does not end with CRLF');
  return records;
}

/** A trend flag row; `status` closed gets a close reason, as the table requires. */
export async function insertFlag(
  db: TestDatabase,
  vesselId: number,
  f: { subject: string; metric: string; status: 'open' | 'acknowledged' | 'closed'; openedDay: string; statistic: number },
): Promise<number> {
  const { rows } = await db.pool.query<{ id: string }>(
    `INSERT INTO flag (vessel_id, subject, metric, method, severity, opened_day, window_from, window_to,
                       statistic, statistic_name, explanation, status, close_reason, last_evaluated_day)
     VALUES ($1, $2, $3, 'mann_kendall', 'warning', $4::date, $4::date - 29, $4::date, $5, 'kendall_z',
             'Efficiency index falling, "steadily", over 30 days', $6,
             CASE WHEN $6 = 'closed' THEN 'resolved' END, $4::date)
     RETURNING id`,
    [vesselId, f.subject, f.metric, f.openedDay, f.statistic, f.status],
  );
  return Number(rows[0]!.id);
}
