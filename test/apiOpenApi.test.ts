import { readdirSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { GET } from '../app/api/v1/openapi.json/route';
import { openApiValidator } from './apiHelpers';

/**
 * The OpenAPI document: served without a token, describes exactly the route
 * files under app/api/v1, and its schemas reject answers that are wrong (so
 * the endpoint tests that validate against it can fail).
 */

type Doc = {
  openapi: string;
  paths: Record<string, { get: { security?: unknown[]; parameters?: unknown[]; responses: Record<string, any> } }>;
  components: { schemas: Record<string, unknown> };
};

async function served(): Promise<Doc> {
  const response = await GET();
  expect(response.status).toBe(200);
  expect(response.headers.get('content-type')).toBe('application/json; charset=utf-8');
  return (await response.json()) as Doc;
}

/** app/api/v1/vessels/[key]/daily/route.ts → /vessels/{key}/daily */
function routePaths(dir = path.resolve('app/api/v1'), prefix = ''): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    if (entry.isFile()) return entry.name === 'route.ts' ? [prefix || '/'] : [];
    const segment = entry.name.replace(/^\[(.+)\]$/, '{$1}');
    return routePaths(path.join(dir, entry.name), `${prefix}/${segment}`);
  });
}

describe('GET /api/v1/openapi.json', () => {
  it('is an OpenAPI 3.1 document served without a token', async () => {
    const doc = await served();
    expect(doc.openapi).toBe('3.1.0');
    expect(doc.paths['/openapi.json']!.get.security).toEqual([]);
  });

  it('describes every route file under app/api/v1, and nothing else', async () => {
    expect(Object.keys((await served()).paths).sort()).toEqual(routePaths().sort());
  });

  it('documents, for every data endpoint, a JSON and a CSV answer, 401, 403 and 500', async () => {
    const doc = await served();
    for (const [p, { get }] of Object.entries(doc.paths)) {
      if (p === '/openapi.json') continue;
      expect(Object.keys(get.responses), p).toEqual(expect.arrayContaining(['200', '401', '403', '500']));
      expect(Object.keys(get.responses['200'].content), p).toEqual(['application/json', 'text/csv']);
      expect(get.parameters, p).toContainEqual({ $ref: '#/components/parameters/Format' });
    }
  });

  it('marks nullable figures with a type list, never the OpenAPI 3.0 `nullable`', async () => {
    const text = JSON.stringify((await served()).components.schemas);
    expect(text).not.toContain('"nullable"');
    expect(text).toContain('"type":["number","null"]');
  });

  it('rejects answers that do not match (the endpoint tests can fail)', () => {
    const v = openApiValidator();
    const vessel = { key: 'kelvick-skua', name: 'Kelvick Skua', type: 'supply', dp_class: 2, last_seen: null, open_flags: 0 };
    expect(v.errors('/vessels', 200, { vessels: [vessel] })).toEqual([]);
    const wrong: unknown[] = [
      { vessels: [{ ...vessel, open_flags: undefined }] }, // missing field
      { vessels: [{ ...vessel, colour: 'red' }] }, // field not in the document
      { vessels: [{ ...vessel, last_seen: 0 }] }, // 0 where null or a time belongs
      { vessels: [{ ...vessel, last_seen: '2026-01-10 10:00' }] }, // not ISO 8601 UTC
      { vessels: [{ ...vessel, dp_class: 4 }] },
      {},
    ];
    for (const body of wrong) expect(v.errors('/vessels', 200, JSON.parse(JSON.stringify(body))), JSON.stringify(body)).not.toEqual([]);

    const day = { vessel: 'kelvick-skua', days: [{ day: '2026-01-10', dp_hours: null }] };
    expect(v.errors('/vessels/{key}/daily', 200, day)).not.toEqual([]);
    expect(v.errors('/flags', 400, { error: { code: 'teapot', message: 'x' } })).not.toEqual([]);
    expect(v.errors('/flags', 400, { error: { code: 'invalid_parameter', message: 'x' } })).toEqual([]);
  });
});
