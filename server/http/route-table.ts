import type { FastifyInstance, FastifyReply, FastifyRequest, RawReplyDefaultExpression, RawRequestDefaultExpression, RawServerDefault, RouteGenericInterface, ContextConfigDefault } from 'fastify';
import fp from 'fastify-plugin';
import type { ZodTypeProvider } from 'fastify-type-provider-zod';
import type { z } from 'zod';
import { apiErrors } from '../errors.ts';
import type { Access, CallerAt } from './access.ts';
import { identifyCaller } from './caller.ts';
import { keepIdempotent, replayIdempotent } from './idempotency.ts';
import { readUpload } from './multipart-csv.ts';
import { errorResponseAt } from './schemas.ts';
import { resolveScope, type ScopeOf } from './scope.ts';
import { openTransaction } from './transaction.ts';

declare module 'fastify' {
  interface FastifyContextConfig {
    /** Who may call the route (see `Access`). */
    access?: Access;
  }
  interface FastifyRequest {
    /** What a route's `prepare` made before its transaction opened. */
    prepared: unknown;
  }
}

export interface RouteSchema {
  params?: z.ZodType;
  querystring?: z.ZodType;
  body?: z.ZodType;
  response: Record<number, z.ZodType>;
}

type ParamsOf<S extends RouteSchema> = S['params'] extends z.ZodType ? z.output<S['params']> : Record<never, never>;

/**
 * A handler's request: params, query and body typed by the route's zod schemas, the scope by its URL's
 * ids, the caller by its access level (a student never reaches a staff route's handler, nor staff a student's).
 */
export type RouteRequest<S extends RouteSchema, Prepared = unknown, A extends Access = Access> = FastifyRequest<RouteGenericInterface, RawServerDefault, RawRequestDefaultExpression, S, ZodTypeProvider> & {
  scope: ScopeOf<ParamsOf<S>>;
  prepared: Prepared;
  caller: CallerAt<A>;
};
export type RouteReply<S extends RouteSchema> = FastifyReply<RouteGenericInterface, RawServerDefault, RawRequestDefaultExpression, RawReplyDefaultExpression, ContextConfigDefault, S, ZodTypeProvider>;

/** What a handler may answer: a body one of its response schemas takes, or the reply it sent itself. */
type Answer<S extends RouteSchema> = z.input<S['response'][keyof S['response']]> | RouteReply<S>;

/**
 * One route: the table of these is the API. The authorisation test walks the same table, so a new
 * route cannot escape it.
 */
export interface Route<S extends RouteSchema, Prepared, A extends Access = Access> {
  method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  url: string;
  access: A;
  summary: string;
  schema: S;
  /** Runs inside one database transaction (`request.db`): nothing is half-stored. */
  transactional?: boolean;
  /** Honours an Idempotency-Key header: a repeat returns the first response. */
  idempotent?: boolean;
  /** Takes CSV files as a multipart upload (`request.upload`). */
  upload?: boolean;
  /** Tries per address are limited (`config.codeTriesPerMinute`): a route that takes a guessable secret. */
  rateLimited?: boolean;
  /**
   * Slow work done before the transaction opens (checking a batch), so that no database connection
   * is held while the workers check; its result is `request.prepared`. The scope of such a route is
   * read before its transaction.
   */
  prepare?(request: RouteRequest<S, unknown, A>): Promise<Prepared>;
  handler(request: RouteRequest<S, Prepared, A>, reply: RouteReply<S>): Promise<Answer<S>>;
}

/** A route of the table, its types erased once they have checked its handler. */
export type RouteSpec = Route<RouteSchema, unknown>;

export function defineRoute<S extends RouteSchema, Prepared = undefined, A extends Access = Access>(route: Route<S, Prepared, A>): RouteSpec {
  return route as unknown as RouteSpec;
}

/** Every route may answer with the common error body, at each status an error code has, listing that status's codes; the OpenAPI document says so. */
const errorResponses = Object.fromEntries([...new Set(Object.values(apiErrors).map((e) => e.status))].map((status) => [status, errorResponseAt(status)]));

const prepareHook = (prepare: NonNullable<RouteSpec['prepare']>) =>
  async function prepareBeforeTransaction(request: FastifyRequest): Promise<void> {
    request.prepared = await prepare(request as RouteRequest<RouteSchema>);
  };

/**
 * Registers the table with the zod type provider. Each route's hooks run in this order: who called
 * (401), its transaction, the URL's rows and whether the caller may reach them (404, 403), all before
 * the body is validated (400); then an upload is read, slow work done, and an Idempotency-Key looked up.
 */
export const routeTablePlugin = fp(async (app: FastifyInstance, { routes }: { routes: RouteSpec[] }) => {
  app.decorateRequest('prepared', null);
  const typed = app.withTypeProvider<ZodTypeProvider>();
  for (const route of routes) {
    const signedIn = route.access !== 'public';
    const opensLate = route.transactional === true && route.prepare !== undefined;
    const preValidation = [...(signedIn ? [identifyCaller] : []), ...(route.transactional && !opensLate ? [openTransaction] : []), ...(signedIn ? [resolveScope] : [])];
    const preHandler = [...(route.upload ? [readUpload] : []), ...(route.prepare ? [prepareHook(route.prepare)] : []), ...(opensLate ? [openTransaction] : []), ...(route.idempotent ? [replayIdempotent] : [])];
    typed.route({
      method: route.method,
      url: route.url,
      schema: { ...route.schema, response: { ...errorResponses, ...route.schema.response }, summary: route.summary, 'x-access': route.access, ...(signedIn ? { security: [{ bearer: [] }] } : {}) },
      // An empty rateLimit takes the limit the rate-limit plugin was registered with (server/app.ts).
      config: { access: route.access, ...(route.rateLimited ? { rateLimit: {} } : {}) },
      preValidation,
      preHandler,
      ...(route.idempotent ? { preSerialization: keepIdempotent } : {}),
      handler: route.handler as (request: FastifyRequest, reply: FastifyReply) => Promise<unknown>,
    });
  }
}, { name: 'rateproof-route-table', dependencies: ['rateproof-caller', 'rateproof-scope', 'rateproof-transaction', 'rateproof-idempotency', 'rateproof-upload'] });
