import { toCsv } from './csv';
import { ApiError, errorBody } from './errors';
import type { CsvTable } from './flatten';
import type { Format } from './params';

/**
 * Responses. Answers carry fleet data that a token was needed to see, so
 * nothing is stored by shared caches (`Cache-Control: no-store`).
 */

const NO_STORE = { 'cache-control': 'no-store' };

export function jsonResponse(body: unknown, status = 200): Response {
  return new Response(JSON.stringify(body), {
    status,
    headers: { 'content-type': 'application/json; charset=utf-8', ...NO_STORE },
  });
}

export function errorResponse(error: ApiError): Response {
  const response = jsonResponse(errorBody(error), error.status);
  // RFC 6750 section 3: a 401 names the scheme the client should use.
  if (error.status === 401) response.headers.set('www-authenticate', 'Bearer realm="holdfast"');
  return response;
}

/** Only these characters reach a Content-Disposition file name. */
const safeFileName = (name: string) => name.replace(/[^A-Za-z0-9._-]/g, '_');

export function csvResponse(table: CsvTable, fileName: string): Response {
  return new Response(toCsv(table.header, table.rows), {
    status: 200,
    headers: {
      // RFC 4180 section 3 registers text/csv with its `header` parameter.
      'content-type': 'text/csv; charset=utf-8; header=present',
      'content-disposition': `attachment; filename="${safeFileName(fileName)}.csv"`,
      ...NO_STORE,
    },
  });
}

/** A list endpoint: the JSON body, or its rows as CSV when `format=csv`. */
export function renderList(format: Format, json: () => unknown, csv: () => { table: CsvTable; fileName: string }): Response {
  if (format === 'csv') {
    const { table, fileName } = csv();
    return csvResponse(table, fileName);
  }
  return jsonResponse(json());
}
