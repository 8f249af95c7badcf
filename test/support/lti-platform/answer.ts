/** What the test platform answers over HTTP: a status other than 200, and headers, only where a service needs them. */
export interface Answer {
  type: string;
  body: string;
  status?: number;
  headers?: Record<string, string>;
}

/** A request the platform refuses with this status; the message names the field or header at fault. */
export class Refused extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly headers: Record<string, string> = {},
  ) {
    super(message);
  }
}

/** A bearer token's scopes (undefined: no valid token) must hold one of these. */
export function requireScope(granted: ReadonlySet<string> | undefined, anyOf: string[]): void {
  // RFC 6750, 3.1: no valid token is a 401, a token without the scope a 403.
  if (!granted) throw new Refused(401, 'no valid bearer token', { 'www-authenticate': 'Bearer error="invalid_token"' });
  if (!anyOf.some((scope) => granted.has(scope))) throw new Refused(403, `the token lacks the scope ${anyOf.join(' or ')}`, { 'www-authenticate': 'Bearer error="insufficient_scope"' });
}
