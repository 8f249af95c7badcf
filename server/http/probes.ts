import type { FastifyInstance } from 'fastify';
import fp from 'fastify-plugin';
import { pendingMigrations } from '../store/migrate.ts';
import { isDatabaseUnavailable } from '../store/unavailable.ts';
import { RETRY_AFTER_SECONDS } from './error-handler.ts';

/**
 * Two probes, apart: `/health` says the process answers (restart it when it does not); `/ready` says
 * it can serve, its database reachable and its schema current (send it no traffic while it is not).
 */
export const probesPlugin = fp(async (app: FastifyInstance) => {
  app.get('/health', { schema: { hide: true } }, async () => ({ ok: true }));

  app.get('/ready', { schema: { hide: true } }, async (_request, reply) => {
    const database = app.store.engine;
    const notReady = (reason: string) => reply.code(503).header('retry-after', RETRY_AFTER_SECONDS).send({ ready: false, database, reason });
    let pending: string[];
    try {
      pending = await pendingMigrations(app.store.db);
    } catch (error) {
      if (!isDatabaseUnavailable(error)) throw error;
      return notReady('the database cannot be reached');
    }
    if (pending.length > 0) return notReady(`migrations not applied: ${pending.join(', ')}`);
    return { ready: true, database };
  });
}, { name: 'rateproof-probes', dependencies: ['rateproof-services'] });
