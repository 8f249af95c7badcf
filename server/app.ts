import { createHash } from 'node:crypto';
import fastifyMultipart from '@fastify/multipart';
import fastifySwagger from '@fastify/swagger';
import fastifySwaggerUi from '@fastify/swagger-ui';
import Fastify, { type FastifyInstance, type FastifyReply, type FastifyRequest } from 'fastify';
import { sql } from 'kysely';
import { hasZodFastifySchemaValidationErrors, jsonSchemaTransform, serializerCompiler, validatorCompiler } from 'fastify-type-provider-zod';
import type { Config } from './config.ts';
import { poolGrader, type Grader } from './grading/grader.ts';
import { Regrades } from './grading/regrade.ts';
import { createWorkerPool } from './pool/worker-pool.ts';
import { sameThreadPool } from './pool/same-thread-pool.ts';
import { ApiError, errorBody } from './errors.ts';
import { authorize, resolveScope, type Caller, type Scope } from './routes/access.ts';
import { callerOf } from './routes/caller.ts';
import { loggableUrl } from './routes/loggable-url.ts';
import { registerSessionRoutes } from './routes/session-routes.ts';
import { registerWorkspaceFiles } from './routes/workspace-files.ts';
import { routes } from './routes/index.ts';
import { ErrorResponse } from './routes/schemas.ts';
import type { RouteContext, RouteSpec } from './routes/route-spec.ts';
import { jsonDepth, MAX_JSON_DEPTH } from './routes/json-depth.ts';
import { arrayElementLines, filePosition } from './input/json-position.ts';
import { jsonElementLines } from './routes/json-element-lines.ts';
import { decodeUtf8 } from './routes/utf8.ts';
import { validationDetails } from './routes/validation-details.ts';
import type { Store } from './store/connection.ts';
import { findIdempotent, holdIdempotencyKey, MAX_IDEMPOTENCY_KEY, saveIdempotent } from './store/idempotency.ts';
import { isDatabaseUnavailable } from './store/unavailable.ts';

/** The longest path parameter the router reads (a student id has at most 64 characters). */
const MAX_PATH_PARAM = 100;

/** How long a client is asked to wait before sending a request again while the database is away. */
const RETRY_AFTER_SECONDS = '5';

export interface AppOptions {
  config: Config;
  store: Store;
  /** Where checking and drawing run; by default a worker pool of the app's own, closed with it. */
  grader?: Grader;
  /** Off in tests; pino otherwise. Logs carry request ids and URLs only, never bodies or tokens. */
  logger?: boolean | { stream: NodeJS.WritableStream };
}

/** What makes two requests the same for an Idempotency-Key: method, URL and the body as read. */
function requestHash(request: FastifyRequest, body: unknown): string {
  const text = typeof body === 'string' ? body : JSON.stringify(body ?? null);
  return createHash('sha256').update(`${request.method} ${request.url}\n${text}`).digest('hex');
}

const errorResponses = Object.fromEntries([400, 401, 403, 404, 409, 413, 415, 422, 500, 503].map((status) => [status, ErrorResponse]));

/** Who called and what the URL points to, settled before the body is validated. */
const resolved = new WeakMap<FastifyRequest, { caller: Caller; scope: Scope }>();

function register(app: FastifyInstance, spec: RouteSpec, options: AppOptions, services: Pick<RouteContext, 'grader' | 'regrades'>): void {
  const { db } = options.store;
  app.route({
    method: spec.method,
    url: spec.url,
    // Every route may answer with the common error body; the OpenAPI document says so.
    schema: { ...spec.schema, response: { ...errorResponses, ...spec.schema.response }, summary: spec.summary, security: [{ bearer: [] }], 'x-access': spec.access },
    // 401, then 404 or 403, come before any complaint about the body.
    async preValidation(request) {
      const caller = await callerOf(request, options.store, options.config);
      const scope = await resolveScope(db, request.params as Record<string, unknown>);
      authorize(caller, spec.access, scope);
      resolved.set(request, { caller, scope });
    },
    async handler(request, reply) {
      const { caller, scope } = resolved.get(request)!;
      const params = request.params as Record<string, string>;
      const key = spec.idempotent ? request.headers['idempotency-key'] : undefined;
      const keyText = typeof key === 'string' && caller.kind === 'staff' ? key : undefined;
      if (keyText !== undefined && keyText.length > MAX_IDEMPOTENCY_KEY) {
        throw new ApiError('invalid-input', undefined, [{ path: 'headers.idempotency-key', message: `at most ${MAX_IDEMPOTENCY_KEY} characters` }]);
      }
      // A multipart upload is read here, so that a repeat is recognised by its content.
      const body = spec.readBody ? await spec.readBody(request) : request.body;
      const context = { config: options.config, ...services, caller, scope, params, query: request.query as Record<string, unknown>, body, request, reply };
      // Slow work that needs no transaction (checking a batch) is done before one is opened, so that a
      // database connection is not held while the workers check.
      const prepared = spec.prepare ? await spec.prepare({ ...context, db }) : undefined;
      const run = async (trx: typeof db) => {
        const hash = keyText === undefined ? '' : requestHash(request, body);
        if (keyText !== undefined && caller.kind === 'staff') {
          if (spec.transactional) await holdIdempotencyKey(trx, caller.staffId, keyText);
          const seen = await findIdempotent(trx, caller.staffId, keyText);
          if (seen) {
            if (seen.requestHash !== hash) throw new ApiError('idempotency-mismatch');
            return { status: seen.statusCode, body: seen.body, replayed: true };
          }
        }
        const answer = await spec.handler({ ...context, db: trx, prepared });
        if (keyText !== undefined && caller.kind === 'staff') await saveIdempotent(trx, caller.staffId, keyText, hash, answer.status, answer.body);
        return { ...answer, replayed: false };
      };
      const answer = spec.transactional ? await db.transaction().execute(run) : await run(db);
      if (answer.replayed) reply.header('idempotent-replayed', 'true');
      if ('headers' in answer && answer.headers) reply.headers(answer.headers);
      if ('contentType' in answer && answer.contentType) reply.type(answer.contentType);
      return reply.code(answer.status).send(answer.body);
    },
  });
}

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

/** Request lines for the log: method and URL with student ids taken out; no headers, no body. */
function logRequest(request: FastifyRequest) {
  return { id: request.id, method: request.method, url: loggableUrl(request) };
}

/** Builds the app: content parsers, error mapping, OpenAPI, and every route. Never listens. */
export async function buildApp(options: AppOptions): Promise<FastifyInstance> {
  const app = Fastify({
    logger: options.logger
      ? { level: options.config.logLevel, serializers: { req: logRequest }, ...(typeof options.logger === 'object' ? { stream: options.logger.stream } : {}) }
      : false,
    bodyLimit: options.config.bodyLimitBytes,
    // The router's own refusals (a path that is not percent-encoding, a parameter past its length) answer in our error shape.
    frameworkErrors: (error, _request, reply) => {
      const message = error.code === 'FST_ERR_MAX_PARAM_LENGTH' ? `a path parameter is longer than ${MAX_PATH_PARAM} characters` : 'a path parameter is not valid percent-encoding (% must start two hex digits of UTF-8)';
      return (reply as FastifyReply).code(400).send(errorBody(new ApiError('invalid-input', undefined, [{ path: 'params', message }])));
    },
    routerOptions: { maxParamLength: MAX_PATH_PARAM },
  });
  app.setValidatorCompiler(validatorCompiler);
  app.setSerializerCompiler(serializerCompiler);

  // Bodies are decoded strictly: text that is not UTF-8 is refused, never read with replacement characters.
  app.removeContentTypeParser(['application/json', 'text/plain']);
  app.addContentTypeParser('application/json', { parseAs: 'buffer' }, (req, body, done) => {
    let text = '';
    try {
      text = decodeUtf8(body as Buffer, 'body');
      if (jsonDepth(text) > MAX_JSON_DEPTH) {
        return done(new ApiError('invalid-input', undefined, [{ path: 'body', message: `nested more than ${MAX_JSON_DEPTH} levels deep` }]), undefined);
      }
      const value = text.trim() === '' ? undefined : JSON.parse(text);
      if (Array.isArray(value)) jsonElementLines.set(req, arrayElementLines(text));
      done(null, value);
    } catch (error) {
      if (error instanceof ApiError) return done(error, undefined);
      done(new ApiError('invalid-input', undefined, [{ path: 'body', message: `not valid JSON: ${filePosition((error as Error).message, text)}` }]), undefined);
    }
  });
  app.addContentTypeParser(['text/csv', 'text/plain'], { parseAs: 'buffer' }, (_req, body, done) => {
    try {
      done(null, decodeUtf8(body as Buffer, 'body'));
    } catch (error) {
      done(error as Error, undefined);
    }
  });
  await app.register(fastifyMultipart, { limits: { fileSize: options.config.bodyLimitBytes, files: 2 } });

  app.setErrorHandler((error, request, reply) => {
    if (error instanceof ApiError) return reply.code(error.status).send(errorBody(error));
    if (hasZodFastifySchemaValidationErrors(error)) {
      const where = (error as { validationContext?: string }).validationContext ?? 'body';
      return reply.code(400).send(errorBody(new ApiError('invalid-input', undefined, validationDetails(where, error.validation))));
    }
    if (isDatabaseUnavailable(error)) {
      return reply.code(503).header('retry-after', RETRY_AFTER_SECONDS).send(errorBody(new ApiError('database-unavailable')));
    }
    // A unique constraint (a handle, a section name already used in the course): the request conflicts.
    if ((error as { code?: string }).code === '23505') {
      const constraint = (error as { constraint?: string }).constraint;
      return reply.code(409).send(errorBody(new ApiError('conflict', `already exists${constraint ? ` (${constraint.replace(/_/g, ' ')})` : ''}`)));
    }
    // An upload of more files than the two it reads is a wrong request, not a large one.
    if ((error as { code?: string }).code === 'FST_FILES_LIMIT') {
      return reply.code(400).send(errorBody(new ApiError('invalid-input', undefined, [{ path: 'body', message: 'at most two files: readings and, optionally, reported' }])));
    }
    const status = (error as { statusCode?: number }).statusCode;
    if (status === 413) return reply.code(413).send(errorBody(new ApiError('payload-too-large')));
    if (status === 415) return reply.code(415).send(errorBody(new ApiError('unsupported-media-type')));
    if (status !== undefined && status >= 400 && status < 500) {
      return reply.code(status).send(errorBody(new ApiError('invalid-input', (error as Error).message)));
    }
    request.log.error({ error: loggable(error) }, 'unhandled error');
    return reply.code(500).send(errorBody(new ApiError('internal')));
  });
  app.setNotFoundHandler((_request, reply) => reply.code(404).send(errorBody(new ApiError('not-found'))));

  await app.register(fastifySwagger, {
    openapi: {
      info: { title: 'Rateproof API', description: 'Refits, checks and grades kinetics analyses.', version: '1' },
      components: { securitySchemes: { bearer: { type: 'http', scheme: 'bearer' } } },
    },
    transform: jsonSchemaTransform,
  });
  await app.register(fastifySwaggerUi, { routePrefix: '/docs' });
  app.get('/openapi.json', { schema: { hide: true } }, async () => app.swagger());
  // Ready when the database answers; 503 while it is away, so that a load balancer sends no traffic.
  app.get('/health', { schema: { hide: true } }, async (_request, reply) => {
    try {
      await sql`select 1`.execute(options.store.db);
      return { ok: true, database: options.store.engine };
    } catch (error) {
      if (!isDatabaseUnavailable(error)) throw error;
      return reply.code(503).header('retry-after', RETRY_AFTER_SECONDS).send({ ok: false, database: options.store.engine, reason: 'the database cannot be reached' });
    }
  });

  const workers = options.config.workers;
  const pool = options.grader ? undefined : workers === 0 ? sameThreadPool() : createWorkerPool(workers);
  const grader = options.grader ?? poolGrader(pool!);
  const regrades = new Regrades(grader);
  app.addHook('onClose', async () => {
    // Regrades under way finish first: they need the workers and the database.
    await regrades.idle();
    await pool?.close();
  });
  for (const spec of routes) register(app, spec, options, { grader, regrades });
  registerSessionRoutes(app, options.store, options.config);
  registerWorkspaceFiles(app);
  return app;
}
