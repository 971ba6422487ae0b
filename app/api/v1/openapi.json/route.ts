import { openApiDocument } from '../../../../lib/api/openapi';
import { jsonResponse } from '../../../../lib/api/render';

/** The OpenAPI document: public, it describes the API and holds no fleet data. */
export function GET(): Response {
  return jsonResponse(openApiDocument());
}
