/**
 * Why a login or launch was refused: a code for the log and the refusal page. The codes carry no
 * personal data, and nothing the platform sent is logged beside them.
 */
export const refusalCodes = [
  'state-missing',
  'state-unknown',
  'state-expired',
  'nonce-replayed',
  'nonce-mismatch',
  'token-missing',
  'token-malformed',
  'unknown-issuer',
  'bad-signature',
  'platform-keys-unreachable',
  'algorithm-not-allowed',
  'token-expired',
  'bad-issued-at',
  'wrong-audience',
  'unknown-deployment',
  'wrong-version',
  'deep-linking-not-instructor',
  'link-type-not-accepted',
  'unknown-message-type',
  'claims-missing',
  'no-mapped-role',
  'not-enrolled',
  'ticket-unknown',
  'ticket-cross-site',
] as const;
export type RefusalCode = (typeof refusalCodes)[number];

export class LaunchRefused extends Error {
  override readonly name = 'LaunchRefused';
  constructor(readonly code: RefusalCode) {
    super(`launch refused: ${code}`);
  }
}
