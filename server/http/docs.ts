import fastifySwagger from '@fastify/swagger';
import fastifySwaggerUi from '@fastify/swagger-ui';
import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import { jsonSchemaTransform } from 'fastify-type-provider-zod';

/**
 * swagger-ui's own policy (its scripts and styles from this origin, any inline ones by hash) without
 * `upgrade-insecure-requests`, which would send a service run over plain HTTP on a campus network to
 * an HTTPS port it does not have, and without the outside validator, which is switched off.
 */
export function docsPolicy(header: string): string {
  return header.replace(/\s*upgrade-insecure-requests;?/, '').replace(' validator.swagger.io', '').trim();
}

/** The OpenAPI document at `/openapi.json` and swagger-ui at `/docs`, under a Content-Security-Policy of its own. */
export const docsPlugin = fp(async (app: FastifyInstance) => {
  await app.register(fastifySwagger, {
    openapi: {
      info: { title: 'Rateproof API', description: 'Refits, checks and grades kinetics analyses.', version: '1' },
      components: { securitySchemes: { bearer: { type: 'http', scheme: 'bearer' } } },
    },
    transform: jsonSchemaTransform,
  });
  await app.register(fastifySwaggerUi, { routePrefix: '/docs', staticCSP: true, transformStaticCSP: docsPolicy, uiConfig: { validatorUrl: null } });
  app.get('/openapi.json', { schema: { hide: true } }, async () => app.swagger());
}, { name: 'rateproof-docs' });
