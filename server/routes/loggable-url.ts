import type { FastifyRequest } from 'fastify';
import { routes } from './index.ts';

/**
 * A request's URL as the log may keep it: no student id, whichever route it reached. A URL that
 * matched a route is logged as the route's pattern with only its internal numeric ids filled in
 * (`/v1/sections/3/roster/:studentId`); any other URL keeps only the segments that are numbers or words
 * of the route table, every other segment being `:redacted`. The query string is left out, its values
 * being as free as the path's.
 */
const ROUTE_WORDS = new Set(['v1', 'session', 'docs', 'openapi.json', 'health', 'web', ...routes.flatMap((r) => r.url.split('/').filter((p) => p && !p.startsWith(':')))]);
const INTERNAL_ID = /^\d{1,10}$/;

export function loggableUrl(request: Pick<FastifyRequest, 'url'> & { routeOptions?: { url?: string }; params?: unknown }): string {
  const pattern = request.routeOptions?.url;
  const params = (request.params ?? {}) as Record<string, unknown>;
  if (pattern) {
    return pattern.replace(/:(\w+)/g, (whole, name: string) => {
      const value = params[name];
      return name !== 'studentId' && typeof value === 'string' && INTERNAL_ID.test(value) ? value : whole;
    });
  }
  const path = request.url.split('?')[0];
  return path
    .split('/')
    .map((segment) => (segment === '' || INTERNAL_ID.test(segment) || ROUTE_WORDS.has(segment) ? segment : ':redacted'))
    .join('/');
}
