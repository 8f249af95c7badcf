import type { FastifyError, FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import { hasZodFastifySchemaValidationErrors } from 'fastify-type-provider-zod';
import { ApiError, errorBody } from '../errors.ts';
import { isDatabaseUnavailable } from '../store/unavailable.ts';
import { validationDetails } from './validation-details.ts';

/** The longest path parameter the router reads (a student id has at most 64 characters). */
export const MAX_PATH_PARAM = 100;

/** How long a client is asked to wait before sending a request again while the database is away. */
export const RETRY_AFTER_SECONDS = '5';

/**
 * What the log keeps of an unexpected error: its class, its code (a SQLSTATE, an errno) and where it
 * was thrown. Not its message or a database's detail, which can quote a request's text or student ids.
 */
function loggable(error: unknown): { name: string; code?: string; at: string[] } {
  const e = error instanceof Error ? error : new Error('not an Error');
  const code = (error as { code?: unknown }).code;
  const at = (e.stack ?? '').split('\n').filter((line) => line.trimStart().startsWith('at ')).map((line) => line.trim()).slice(0, 8);
  return { name: e.name, ...(typeof code === 'string' ? { code } : {}), at };
}

/** Any error as one of ours, with the status to send; undefined for what no client caused (a 500). */
function asApiError(error: unknown): { known: ApiError; status?: number } | undefined {
  const known = ourCode(error);
  if (known) return { known };
  // Any other refusal of the framework's (a multipart stream cut short, say) keeps its own 4xx.
  const { statusCode } = error as { statusCode?: number };
  if (statusCode !== undefined && statusCode >= 400 && statusCode < 500) return { known: new ApiError('invalid-input', (error as Error).message), status: statusCode };
  return undefined;
}

/** The errors that have a code of their own: ours, a body that fails its schema, the database away, a duplicate, the framework's 413, 415 and 404. */
function ourCode(error: unknown): ApiError | undefined {
  if (error instanceof ApiError) return error;
  if (hasZodFastifySchemaValidationErrors(error)) {
    const where = (error as { validationContext?: string }).validationContext ?? 'body';
    return new ApiError('invalid-input', undefined, validationDetails(where, error.validation));
  }
  if (isDatabaseUnavailable(error)) return new ApiError('database-unavailable');
  const { code, statusCode, constraint } = error as { code?: string; statusCode?: number; constraint?: string };
  // A unique constraint (a handle, a section name already used in the course): the request conflicts.
  if (code === '23505') return new ApiError('conflict', `already exists${constraint ? ` (${constraint.replace(/_/g, ' ')})` : ''}`);
  // An upload of more files than the two it reads is a wrong request, not a large one.
  if (code === 'FST_FILES_LIMIT') return new ApiError('invalid-input', undefined, [{ path: 'body', message: 'at most two files: readings and, optionally, reported' }]);
  if (statusCode === 413) return new ApiError('payload-too-large');
  if (statusCode === 415) return new ApiError('unsupported-media-type');
  if (statusCode === 404) return new ApiError('not-found');
  return undefined;
}

/** Sends an error in the API's shape; the status is the code's, or the framework's own 4xx it stands for. */
function sendError(reply: FastifyReply, error: ApiError, status = error.status): FastifyReply {
  if (error.code === 'database-unavailable') reply.header('retry-after', RETRY_AFTER_SECONDS);
  return reply.code(status).send(errorBody(error));
}

/**
 * The router's own refusals, before any route is chosen (a path that is not percent-encoding, a
 * parameter past its length): passed to Fastify as `frameworkErrors`.
 */
export function frameworkErrors(error: FastifyError, _request: FastifyRequest, reply: FastifyReply): void {
  const message = error.code === 'FST_ERR_MAX_PARAM_LENGTH' ? `a path parameter is longer than ${MAX_PATH_PARAM} characters` : 'the path is not valid percent-encoding (% must start two hex digits of UTF-8)';
  sendError(reply, new ApiError('invalid-input', undefined, [{ path: 'url', message }]));
}

/** Every error, ours or the framework's, answers `{error: {code, message, details}}`; an unknown route is a 404 in the same shape. */
export const errorHandlerPlugin = fp(async (app: FastifyInstance) => {
  app.setErrorHandler((error, request, reply) => {
    const answer = asApiError(error);
    if (answer) return sendError(reply, answer.known, answer.status);
    request.log.error({ error: loggable(error) }, 'unhandled error');
    return sendError(reply, new ApiError('internal'));
  });
  app.setNotFoundHandler((_request, reply) => sendError(reply, new ApiError('not-found')));
}, { name: 'rateproof-error-handler' });
