import { z } from 'zod';

/**
 * Every error the API returns: a code, an HTTP status and a message; `details` name each field and
 * the reason. The HTTP layer maps these to responses; anything else is a 500 with no internals.
 */
export const apiErrors = {
  'unauthenticated': { status: 401, message: 'a valid API token is required' },
  'forbidden': { status: 403, message: 'your role does not allow this' },
  'not-found': { status: 404, message: 'not found' },
  'invalid-input': { status: 400, message: 'the request is not valid' },
  'invalid-encoding': { status: 400, message: 'the body is not valid UTF-8' },
  'conflict': { status: 409, message: 'the request conflicts with stored data' },
  'payload-too-large': { status: 413, message: 'the body is larger than allowed' },
  'unsupported-media-type': { status: 415, message: 'send application/json, text/csv or multipart/form-data' },
  'idempotency-mismatch': { status: 422, message: 'this Idempotency-Key was used with a different request' },
  'nothing-stored': { status: 422, message: 'no submission in the request is valid; nothing was stored' },
  'missing-settings': { status: 422, message: 'a PUT replaces the settings whole: state every setting the assignment has (null clears one), or send PATCH to change some' },
  'beyond-rubric-item': { status: 422, message: "the points are beyond what the finding's rubric item has left; nothing was stored" },
  'too-many-requests': { status: 429, message: 'too many tries from this address; wait a minute and try again' },
  'platform-unavailable': { status: 502, message: "the learning platform did not answer as its services should; nothing was changed, so try again later" },
  'database-unavailable': { status: 503, message: 'the database cannot be reached just now; nothing was changed, so send the request again shortly' },
  'internal': { status: 500, message: 'internal error' },
} as const;

export type ApiErrorCode = keyof typeof apiErrors;

/** The codes, in the order above: the OpenAPI document's enum of `error.code`. */
export const errorCodes = Object.keys(apiErrors) as [ApiErrorCode, ...ApiErrorCode[]];
export const ErrorCode = z.enum(errorCodes);

/** Each code with its status and default message, for a generated table of the API's errors. */
export const errorCatalogue: Array<{ code: ApiErrorCode; status: number; message: string }> = errorCodes.map((code) => ({ code, ...apiErrors[code] }));

export interface ErrorDetail {
  path: string;
  message: string;
}

export class ApiError extends Error {
  override readonly name = 'ApiError';
  readonly status: number;
  constructor(
    readonly code: ApiErrorCode,
    message?: string,
    readonly details?: ErrorDetail[],
  ) {
    super(message ?? apiErrors[code].message);
    this.status = apiErrors[code].status;
  }
}

/** The body of every error response. */
export function errorBody(error: ApiError): { error: { code: ApiErrorCode; message: string; details?: ErrorDetail[] } } {
  return { error: { code: error.code, message: error.message, ...(error.details ? { details: error.details } : {}) } };
}
