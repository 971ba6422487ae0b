/**
 * The API's error answers: `{"error": {"code", "message"}}` with an HTTP
 * status (api-v1). Handlers throw an ApiError; lib/api/route.ts turns it into
 * the response, so every endpoint answers errors the same way.
 */

export type ApiErrorStatus = 400 | 401 | 403 | 404 | 500;

/** Every code the API sends, with its status (docs/api.md lists them). */
export const ERROR_CODES = {
  invalid_day: 400,
  invalid_range: 400,
  range_too_long: 400,
  invalid_parameter: 400,
  unauthorized: 401,
  forbidden: 403,
  not_found: 404,
  internal_error: 500,
} as const satisfies Record<string, ApiErrorStatus>;

export type ApiErrorCode = keyof typeof ERROR_CODES;

export class ApiError extends Error {
  readonly status: ApiErrorStatus;
  constructor(
    readonly code: ApiErrorCode,
    message: string,
  ) {
    super(message);
    this.name = 'ApiError';
    this.status = ERROR_CODES[code];
  }
}

export interface ErrorBody {
  error: { code: ApiErrorCode; message: string };
}

export function errorBody(error: ApiError): ErrorBody {
  return { error: { code: error.code, message: error.message } };
}

export function notFound(what: 'vessel' | 'campaign', key: string): ApiError {
  return new ApiError('not_found', `no ${what} has the key "${key.slice(0, 64)}"`);
}
