import { createHash } from 'node:crypto';
import type { FastifyInstance, FastifyReply, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import { ApiError } from '../errors.ts';
import { findIdempotent, holdIdempotencyKey, MAX_IDEMPOTENCY_KEY, saveIdempotent } from '../store/idempotency.ts';

/** A first request under an Idempotency-Key, whose answer is to be kept. */
interface PendingKey {
  staffId: number;
  key: string;
  hash: string;
}

declare module 'fastify' {
  interface FastifyRequest {
    idempotencyKey: PendingKey | null;
  }
}

/** What makes two requests the same for an Idempotency-Key: method, URL and the body as read. */
function requestHash(request: FastifyRequest): string {
  const body = request.upload ?? request.body;
  const text = typeof body === 'string' ? body : JSON.stringify(body ?? null);
  return createHash('sha256').update(`${request.method} ${request.url}\n${text}`).digest('hex');
}

/**
 * preHandler hook of an idempotent route, after its transaction opened: a repeat of a request a staff
 * member made under the same key gets the first answer again; the key with another request is a 422.
 */
export async function replayIdempotent(request: FastifyRequest, reply: FastifyReply): Promise<FastifyReply | undefined> {
  const key = request.headers['idempotency-key'];
  if (typeof key !== 'string' || request.caller.kind !== 'staff') return undefined;
  if (key.length > MAX_IDEMPOTENCY_KEY) {
    throw new ApiError('invalid-input', undefined, [{ path: 'headers.idempotency-key', message: `at most ${MAX_IDEMPOTENCY_KEY} characters` }]);
  }
  const { staffId } = request.caller;
  const hash = requestHash(request);
  // A second request with the same key waits here until the first one's transaction ends.
  if (request.transaction) await holdIdempotencyKey(request.db, staffId, key);
  const seen = await findIdempotent(request.db, staffId, key);
  if (seen) {
    if (seen.requestHash !== hash) throw new ApiError('idempotency-mismatch');
    return reply.code(seen.statusCode).header('idempotent-replayed', 'true').send(seen.body);
  }
  request.idempotencyKey = { staffId, key, hash };
  return undefined;
}

/** preSerialization hook: a first successful answer is kept under its key, in the request's transaction. */
export async function keepIdempotent(request: FastifyRequest, reply: FastifyReply, payload: unknown): Promise<unknown> {
  const pending = request.idempotencyKey;
  if (pending && reply.statusCode < 300) await saveIdempotent(request.db, pending.staffId, pending.key, pending.hash, reply.statusCode, payload);
  return payload;
}

export const idempotencyPlugin = fp(async (app: FastifyInstance) => {
  app.decorateRequest('idempotencyKey', null);
}, { name: 'rateproof-idempotency' });
