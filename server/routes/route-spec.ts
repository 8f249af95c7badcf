import type { FastifyReply, FastifyRequest } from 'fastify';
import type { Kysely } from 'kysely';
import type { z } from 'zod';
import type { Config } from '../config.ts';
import type { Grader } from '../grading/grader.ts';
import type { Regrades } from '../grading/regrade.ts';
import type { Database } from '../store/database.ts';
import type { Access, Caller, Scope } from './access.ts';

/** What a handler gets: the database, who called, what the URL's ids point to, and the parsed request. */
export interface RouteContext {
  db: Kysely<Database>;
  config: Config;
  /** Checking and drawing, done off the event loop. */
  grader: Grader;
  /** Regrades running in the background, and how far each is. */
  regrades: Regrades;
  caller: Caller;
  scope: Scope;
  params: Record<string, string>;
  query: Record<string, unknown>;
  body: unknown;
  request: FastifyRequest;
  reply: FastifyReply;
  /** What `prepare` made, if the route has one. */
  prepared?: unknown;
}

export interface RouteAnswer {
  status: number;
  body: unknown;
  /** For files (PDF, CSV, ZIP); JSON otherwise. */
  contentType?: string;
  headers?: Record<string, string>;
}

/**
 * One route: the table of these is the API. The authorisation test walks the same table, so a new
 * route cannot escape it.
 */
export interface RouteSpec {
  method: 'GET' | 'POST' | 'PUT' | 'PATCH';
  url: string;
  access: Access;
  summary: string;
  schema: {
    params?: z.ZodType;
    querystring?: z.ZodType;
    body?: z.ZodType;
    response: Record<number, z.ZodType>;
  };
  /** Reads a body the content-type parsers leave alone (a multipart upload); its result is `body`. */
  readBody?(request: FastifyRequest): Promise<unknown>;
  /** Honours an Idempotency-Key header: a repeat returns the first response. */
  idempotent?: boolean;
  /** Runs inside one database transaction: nothing is half-stored. */
  transactional?: boolean;
  /** Work done before the transaction opens, outside it (checking a batch); its result reaches the handler. */
  prepare?(ctx: RouteContext): Promise<unknown>;
  handler(ctx: RouteContext): Promise<RouteAnswer>;
}
