import type { FastifyInstance, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import type { ControlledTransaction, Kysely } from 'kysely';
import type { Database } from '../store/database.ts';

declare module 'fastify' {
  interface FastifyRequest {
    /** The request's transaction on a transactional route (from its `openTransaction` hook on), else the database. */
    db: Kysely<Database>;
    /** The open transaction, until the reply settles it. */
    transaction: ControlledTransaction<Database> | null;
  }
}

/** Hook of a transactional route: from here on, everything the request reads or writes is one transaction. */
export async function openTransaction(request: FastifyRequest): Promise<void> {
  request.transaction = await request.server.store.db.startTransaction().execute();
  request.db = request.transaction;
}

/** Commits a successful request's transaction, rolls back any other; nothing is half-stored. */
async function settle(request: FastifyRequest, commit: boolean): Promise<void> {
  const trx = request.transaction;
  if (!trx) return;
  request.transaction = null;
  request.db = request.server.store.db;
  if (!commit) return trx.rollback().execute();
  try {
    await trx.commit().execute();
  } catch (error) {
    // A commit that fails for another reason than the database's own rollback (a lost connection)
    // keeps its connection checked out; a rollback hands it back to the pool, even when it fails too.
    if (!trx.isRolledBack) await trx.rollback().execute().catch(() => undefined);
    throw error;
  }
}

/**
 * `request.db` and `request.transaction`. The transaction ends as the reply is sent: committed when
 * the status is below 400 (a commit that fails becomes the reply's error), rolled back otherwise, and
 * rolled back too when a request ends without a reply.
 */
export const transactionPlugin = fp(async (app: FastifyInstance) => {
  app.decorateRequest<Kysely<Database> | null>('db', null);
  app.decorateRequest('transaction', null);
  app.addHook('onRequest', async (request) => {
    request.db = app.store.db;
  });
  // A rollback that fails (the connection lost with the database) leaves the reply as it was: the
  // server drops an open transaction with its connection, so nothing is stored either way.
  const rollBack = async (request: FastifyRequest) => {
    try {
      await settle(request, false);
    } catch (error) {
      request.log.error({ error: { name: (error as Error).name } }, 'a transaction could not be rolled back');
    }
  };
  app.addHook('onSend', async (request, reply, payload) => {
    if (reply.statusCode < 400) await settle(request, true);
    else await rollBack(request);
    return payload;
  });
  app.addHook('onResponse', rollBack);
}, { name: 'rateproof-transaction', dependencies: ['rateproof-services'] });
