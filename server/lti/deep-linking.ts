import { randomBytes } from 'node:crypto';
import { importJWK, SignJWT } from 'jose';
import type { Kysely } from 'kysely';
import type { Database } from '../store/database.ts';
import { signingKey } from '../store/lti-keys.ts';
import type { PendingDeepLink } from '../store/lti-deep-links.ts';
import { CLAIM, DL_CLAIM } from './claims.ts';
import { lineItemFor } from './grade-service.ts';

/**
 * The custom parameters a deep-linked resource link carries (LTI Core 1.3, 5.4.6): the platform sends
 * them back in every launch of the link, which is how its first launch finds where it was placed.
 */
export const CUSTOM = { assignmentId: 'rateproof_assignment_id', sectionId: 'rateproof_section_id' } as const;

/** How long our deep linking response is valid (common practice, no source: long enough for one form post). */
const RESPONSE_SECONDS = 300;

/** The pair a deep-linked resource link names in its custom parameters, if it names one. */
export function placedByCustom(custom: Record<string, string>): { assignmentId: number; sectionId: number } | undefined {
  const [assignmentId, sectionId] = [Number(custom[CUSTOM.assignmentId]), Number(custom[CUSTOM.sectionId])];
  return Number.isSafeInteger(assignmentId) && assignmentId > 0 && Number.isSafeInteger(sectionId) && sectionId > 0 ? { assignmentId, sectionId } : undefined;
}

export interface Placed {
  assignmentId: number;
  sectionId: number;
  title: string;
}

/**
 * The deep linking response (Deep Linking 2.0, 4.5): a JWT signed RS256 with our current signing key
 * (its kid in the header), from our client id to the platform, holding one LTI resource link whose
 * custom parameters name the assignment and section chosen, with a line item for its scores (a
 * platform offering AGS 2.0 makes it and binds it to the link), and the request's data echoed.
 */
export async function deepLinkingResponse(db: Kysely<Database>, link: PendingDeepLink, platform: { issuer: string; clientId: string }, placed: Placed): Promise<string> {
  const key = await signingKey(db);
  // A platform is registered before any launch, and registration makes the signing key.
  if (!key) throw new Error('no signing key: no platform has been registered');
  const item = {
    type: 'ltiResourceLink',
    title: placed.title,
    custom: { [CUSTOM.assignmentId]: String(placed.assignmentId), [CUSTOM.sectionId]: String(placed.sectionId) },
    lineItem: lineItemFor({ id: placed.assignmentId, title: placed.title }),
  };
  return new SignJWT({
    nonce: randomBytes(16).toString('base64url'),
    [CLAIM.deploymentId]: link.deploymentId,
    [CLAIM.messageType]: 'LtiDeepLinkingResponse',
    [CLAIM.version]: '1.3.0',
    ...(link.data !== null ? { [DL_CLAIM.data]: link.data } : {}),
    [DL_CLAIM.contentItems]: [item],
  })
    .setProtectedHeader({ alg: 'RS256', kid: key.kid, typ: 'JWT' })
    .setIssuer(platform.clientId)
    .setAudience(platform.issuer)
    .setIssuedAt()
    .setExpirationTime(`${RESPONSE_SECONDS}s`)
    .sign(await importJWK(key.privateJwk, 'RS256'));
}
