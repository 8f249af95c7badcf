import type { FastifyInstance, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import { ApiError } from '../errors.ts';
import type { ServiceMetrics } from '../metrics/service-metrics.ts';
import { bearerToken } from './caller.ts';
import { sameSecret } from './same-secret.ts';

const LOOPBACK = new Set(['127.0.0.1', '::1', '::ffff:127.0.0.1']);

/**
 * Who may read /metrics. With a metrics token configured, whoever sends it as a bearer token, from
 * anywhere. Without one, this machine only: a request from a loopback address that no proxy forwarded
 * (a proxy on the same machine connects from loopback too, but says whom it forwards for).
 */
export function mayReadMetrics(request: FastifyRequest, token: string | undefined): void {
  if (token) {
    const sent = bearerToken(request);
    if (!sent || !sameSecret(sent, token)) throw new ApiError('unauthenticated', 'the metrics token is required (Authorization: Bearer)');
    return;
  }
  const forwarded = request.headers['x-forwarded-for'] !== undefined || request.headers.forwarded !== undefined;
  if (forwarded || !LOOPBACK.has(request.socket.remoteAddress ?? '')) throw new ApiError('not-found');
}

/** Every request's duration by route pattern (never its URL: no student id in a label); `/metrics` to read them. */
export const metricsPlugin = fp(async (app: FastifyInstance, options: { metrics: ServiceMetrics; token?: string }) => {
  const { metrics, token } = options;
  app.addHook('onResponse', async (request, reply) => {
    metrics.requestSeconds.observe(
      { method: request.method, route: request.routeOptions.url ?? 'unmatched', status_class: `${Math.floor(reply.statusCode / 100)}xx` },
      reply.elapsedTime / 1000,
    );
  });
  app.get('/metrics', { schema: { hide: true } }, async (request, reply) => {
    mayReadMetrics(request, token);
    return reply.type(metrics.contentType).send(await metrics.text());
  });
}, { name: 'rateproof-metrics' });
