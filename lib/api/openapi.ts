import { DEFAULT_RANGE_DAYS, MAX_RANGE_DAYS } from './params';
import { schemas, type JsonSchema } from './schemas';

/**
 * The OpenAPI 3.1 document of the JSON API, served at /api/v1/openapi.json.
 * Paths are relative to the server URL /api/v1. The API tests validate real
 * answers of every endpoint against the schemas published here, and check
 * that every route file under app/api/v1 is described and the reverse.
 */

const ref = (section: string, name: string) => ({ $ref: `#/components/${section}/${name}` });

const CSV_NOTE =
  'CSV (RFC 4180): CRLF line ends, a header row, one row per item of the JSON list; `within_pct` becomes one ' +
  'column per limit (`within_pct_3`, `within_pct_5`); null is the empty field.';

function ok(schemaName: string, description: string, csv: boolean) {
  return {
    description,
    content: {
      'application/json': { schema: ref('schemas', schemaName) },
      ...(csv ? { 'text/csv': { schema: { type: 'string', description: CSV_NOTE } } } : {}),
    },
  };
}

interface Operation {
  summary: string;
  description: string;
  parameters: string[];
  ok: { schema: string; description: string };
  csv: boolean;
  /** Error answers besides 401 and 403, which every data endpoint may give. */
  errors: (400 | 404)[];
}

const ERROR_RESPONSES = { 400: 'BadRequest', 401: 'Unauthorized', 403: 'Forbidden', 404: 'NotFound' } as const;

function operation(id: string, op: Operation) {
  const statuses = [...op.errors, 401, 403].sort() as (keyof typeof ERROR_RESPONSES)[];
  return {
    get: {
      operationId: id,
      summary: op.summary,
      description: op.description,
      parameters: op.parameters.map((p) => ref('parameters', p)),
      responses: {
        200: ok(op.ok.schema, op.ok.description, op.csv),
        ...Object.fromEntries(statuses.map((s) => [s, ref('responses', ERROR_RESPONSES[s])])),
        500: ref('responses', 'InternalError'),
      },
    },
  };
}

const RANGE = ['From', 'To', 'Format'];
const RANGE_ERRORS: (400 | 404)[] = [400, 404];

const errorResponse = (description: string) => ({
  description,
  content: { 'application/json': { schema: ref('schemas', 'Error') } },
});

const dayParameter = (name: 'from' | 'to', description: string) => ({
  name,
  in: 'query',
  required: false,
  description,
  schema: { type: 'string', format: 'date' },
});

const keyParameter = (description: string) => ({
  name: 'key',
  in: 'path',
  required: true,
  description,
  schema: { type: 'string' },
});

export function openApiDocument(): JsonSchema {
  return {
    openapi: '3.1.0',
    info: {
      title: 'Holdfast JSON API',
      version: '1',
      description:
        'Read-only daily station-keeping figures of a fleet of DP vessels (api-v1). Holdfast is advisory and ' +
        'after the fact: it is not part of any DP control system and not a class or compliance tool. Numbers are ' +
        'in the units of metrics-v1; a figure that cannot be computed is null, never 0. Days are fleet days ' +
        '(FLEET_TIME_ZONE) written YYYY-MM-DD; from and to are inclusive. A token reads what a user of its role ' +
        'reads: a charterer token only its campaign\'s vessels, on the campaign\'s days; anything else is 404.',
    },
    servers: [{ url: '/api/v1' }],
    security: [{ bearerAuth: [] }],
    paths: {
      '/vessels': operation('listVessels', {
        summary: 'Every registered vessel',
        description: 'By key, with the time of its latest station record and its flags not closed.',
        parameters: ['Format'],
        ok: { schema: 'VesselList', description: 'The vessels' },
        csv: true,
        errors: [400],
      }),
      '/vessels/{key}/daily': operation('getVesselDaily', {
        summary: 'Daily station-keeping, environment and power-limit figures of one vessel',
        description: 'One item per day of the range with a stored row (not computed yet, or no telemetry: absent, never zeros).',
        parameters: ['VesselKey', ...RANGE],
        ok: { schema: 'VesselDaily', description: 'The days' },
        csv: true,
        errors: RANGE_ERRORS,
      }),
      '/vessels/{key}/thrusters/daily': operation('getThrusterDaily', {
        summary: 'Daily figures of a vessel’s thrusters',
        description: 'One item per computed day and thruster, by day then thruster id.',
        parameters: ['VesselKey', ...RANGE],
        ok: { schema: 'ThrusterDaily', description: 'The thruster-days' },
        csv: true,
        errors: RANGE_ERRORS,
      }),
      '/vessels/{key}/thrusters': operation('getThrusters', {
        summary: 'Wear and projected service day of every registered thruster',
        description: 'As of today in the fleet time zone (as_of).',
        parameters: ['VesselKey', 'Format'],
        ok: { schema: 'ThrusterList', description: 'The thrusters' },
        csv: true,
        errors: RANGE_ERRORS,
      }),
      '/vessels/{key}/refs/daily': operation('getRefDaily', {
        summary: 'Daily figures of a vessel’s position reference systems',
        description: 'One item per computed day and reference system, by day then id.',
        parameters: ['VesselKey', ...RANGE],
        ok: { schema: 'RefDaily', description: 'The reference-system-days' },
        csv: true,
        errors: RANGE_ERRORS,
      }),
      '/flags': operation('listFlags', {
        summary: 'Trend flags',
        description: 'Newest first (opened_day, then id, descending).',
        parameters: ['Status', 'VesselFilter', 'Format'],
        ok: { schema: 'FlagList', description: 'The flags' },
        csv: true,
        errors: RANGE_ERRORS,
      }),
      '/campaigns/{key}/report': operation('getCampaignReport', {
        summary: 'A campaign’s figures per vessel over its dates',
        description:
          'Over the campaign’s days up to today (fleet time zone): DP hours; p95 from the merged radial-error ' +
          'histograms of the period (never an average of daily p95); within_pct for the campaign’s watch circles; ' +
          'limit events and blackouts. CSV: one row per vessel (the campaign fields are in the JSON only).',
        parameters: ['CampaignKey', 'Format'],
        ok: { schema: 'CampaignReport', description: 'The report' },
        csv: true,
        errors: RANGE_ERRORS,
      }),
      '/openapi.json': {
        get: {
          operationId: 'getOpenApi',
          summary: 'This document',
          description: 'Served without a token: it describes the API and holds no fleet data.',
          security: [],
          responses: {
            200: { description: 'The OpenAPI 3.1 document', content: { 'application/json': { schema: { type: 'object' } } } },
          },
        },
      },
    },
    components: {
      securitySchemes: {
        bearerAuth: {
          type: 'http',
          scheme: 'bearer',
          description: 'A token from `holdfast token create --name NAME --role ROLE [--campaign KEY]`.',
        },
      },
      parameters: {
        VesselKey: keyParameter('Vessel key from the fleet register'),
        CampaignKey: keyParameter('Campaign key from the fleet register'),
        From: dayParameter('from', `First day (inclusive); default: ${DEFAULT_RANGE_DAYS - 1} days before \`to\`. At most ${MAX_RANGE_DAYS} days per request.`),
        To: dayParameter('to', 'Last day (inclusive); default: today in the fleet time zone.'),
        Format: {
          name: 'format',
          in: 'query',
          required: false,
          description: 'json (default) or csv',
          schema: { type: 'string', enum: ['json', 'csv'], default: 'json' },
        },
        Status: {
          name: 'status',
          in: 'query',
          required: false,
          description: 'Flags of this status; all for every status',
          schema: { type: 'string', enum: ['open', 'acknowledged', 'closed', 'all'], default: 'open' },
        },
        VesselFilter: {
          name: 'vessel',
          in: 'query',
          required: false,
          description: 'Only this vessel’s flags (404 when no vessel has this key)',
          schema: { type: 'string' },
        },
      },
      responses: {
        BadRequest: errorResponse(
          `A parameter is wrong: invalid_day (not YYYY-MM-DD), invalid_range (from after to), range_too_long (more than ${MAX_RANGE_DAYS} days), invalid_parameter (format, status)`,
        ),
        Unauthorized: errorResponse('unauthorized: no token and no live session, or an unknown or revoked token'),
        Forbidden: errorResponse('forbidden: the caller’s role may not read this (a charterer asking for lifetime thruster wear)'),
        NotFound: errorResponse('not_found: no vessel or campaign has this key'),
        InternalError: errorResponse('internal_error: the server could not answer (its log has the details)'),
      },
      schemas,
    },
  };
}
