import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import { ApiError } from '../errors.ts';
import { arrayElementLines, filePosition } from '../input/json-position.ts';
import { jsonDepth, MAX_JSON_DEPTH } from './json-depth.ts';
import { decodeUtf8 } from './utf8.ts';

declare module 'fastify' {
  interface FastifyRequest {
    /**
     * The line each element of a JSON array body starts on, so that a batch's problems can say where
     * in the file each submission is; null for any other body.
     */
    jsonElementLines: number[] | null;
  }
}

/** The routes that take HTML form posts: those a learning platform's browser pages send. */
const FORM_ROUTES = '/v1/lti/';

/**
 * Bodies are decoded strictly: text that is not UTF-8 is refused, never read with replacement
 * characters, and JSON nested deeper than any body the API reads is refused before it is parsed.
 */
export const bodyParsersPlugin = fp(async (app: FastifyInstance) => {
  app.decorateRequest('jsonElementLines', null);
  app.removeContentTypeParser(['application/json', 'text/plain']);
  app.addContentTypeParser('application/json', { parseAs: 'buffer' }, (request, body, done) => {
    let text = '';
    try {
      text = decodeUtf8(body as Buffer, 'body');
      if (jsonDepth(text) > MAX_JSON_DEPTH) {
        return done(new ApiError('invalid-input', undefined, [{ path: 'body', message: `nested more than ${MAX_JSON_DEPTH} levels deep` }]), undefined);
      }
      const value = text.trim() === '' ? undefined : JSON.parse(text);
      if (Array.isArray(value)) request.jsonElementLines = arrayElementLines(text);
      done(null, value);
    } catch (error) {
      if (error instanceof ApiError) return done(error, undefined);
      done(new ApiError('invalid-input', undefined, [{ path: 'body', message: `not valid JSON: ${filePosition((error as Error).message, text)}` }]), undefined);
    }
  });
  // A learning platform's browser posts forms to the LTI routes (login initiation, launch), read as
  // an object of strings. Nowhere else: a form another site posts to a sign-in route must stay a 415.
  app.addContentTypeParser('application/x-www-form-urlencoded', { parseAs: 'buffer' }, (request, body, done) => {
    try {
      if (!request.routeOptions.url?.startsWith(FORM_ROUTES)) return done(new ApiError('unsupported-media-type'), undefined);
      done(null, Object.fromEntries(new URLSearchParams(decodeUtf8(body as Buffer, 'body'))));
    } catch (error) {
      done(error as Error, undefined);
    }
  });
  app.addContentTypeParser(['text/csv', 'text/plain'], { parseAs: 'buffer' }, (_request, body, done) => {
    try {
      done(null, decodeUtf8(body as Buffer, 'body'));
    } catch (error) {
      done(error as Error, undefined);
    }
  });
}, { name: 'rateproof-body-parsers' });
