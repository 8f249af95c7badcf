import type { FastifyRequest } from 'fastify';

/**
 * The line each element of a JSON array body starts on, kept by the body parser for the request it
 * read, so that a batch's problems can say where in the file each submission is.
 */
export const jsonElementLines = new WeakMap<FastifyRequest, number[]>();
