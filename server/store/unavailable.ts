/**
 * Whether an error means the database is away (stopped, restarting, unreachable) rather than that the
 * request was wrong: such a request may simply be sent again later.
 */
const NETWORK_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENOTFOUND', 'EAI_AGAIN']);
// PostgreSQL's SQLSTATEs: 08000-08007 are connection exceptions (08P01, a protocol violation, is the
// request's fault, not the server's absence); 57P01-57P03 are an administrator's shutdown, a crash
// shutdown and "cannot connect now" (starting up); 53300 is too many connections.
const SERVER_STATES = /^(0800[0-7]|57P0[123]|53300)$/;
const LOST_CONNECTION = /^(Connection terminated|Client has encountered a connection error|timeout exceeded when trying to connect)/;

export function isDatabaseUnavailable(error: unknown): boolean {
  const e = error as { code?: unknown; message?: unknown } | null;
  if (!e || typeof e !== 'object') return false;
  if (typeof e.code === 'string' && (NETWORK_CODES.has(e.code) || SERVER_STATES.test(e.code))) return true;
  return typeof e.message === 'string' && LOST_CONNECTION.test(e.message);
}
