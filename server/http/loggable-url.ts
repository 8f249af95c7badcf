import type { FastifyRequest } from 'fastify';

/**
 * A request's URL as the log may keep it: no student id, whichever route it reached. A URL that
 * matched a route is logged as the route's pattern with only its internal numeric ids filled in
 * (`/v1/sections/3/roster/:studentId`); any other URL keeps only the segments that are numbers or words
 * of the route table, every other segment being `:redacted`. The query string is left out, its values
 * being as free as the path's.
 */
const INTERNAL_ID = /^\d{1,10}$/;
const OTHER_WORDS = ['v1', 'session', 'docs', 'openapi.json', 'health', 'ready', 'metrics', 'web'];

/** The words of a route table's URLs and of the app's other paths: what a logged URL may keep. */
export function urlWords(routes: ReadonlyArray<{ url: string }>): ReadonlySet<string> {
  return new Set([...OTHER_WORDS, ...routes.flatMap((r) => r.url.split('/').filter((p) => p && !p.startsWith(':')))]);
}

export function loggableUrl(request: Pick<FastifyRequest, 'url'> & { routeOptions?: { url?: string }; params?: unknown }, words: ReadonlySet<string>): string {
  const pattern = request.routeOptions?.url;
  const params = (request.params ?? {}) as Record<string, unknown>;
  if (pattern) {
    return pattern.replace(/:(\w+)/g, (whole, name: string) => {
      const value = params[name];
      // Read before validation, an id is the URL's text; after, the number it was parsed to.
      const id = typeof value === 'number' ? String(value) : value;
      return name !== 'studentId' && typeof id === 'string' && INTERNAL_ID.test(id) ? id : whole;
    });
  }
  const path = request.url.split('?')[0];
  return path
    .split('/')
    .map((segment) => (segment === '' || INTERNAL_ID.test(segment) || words.has(segment) ? segment : ':redacted'))
    .join('/');
}
