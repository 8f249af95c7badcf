import { errors, jwtVerify, type JWTPayload, type JWTVerifyGetKey } from 'jose';
import { AGS_CLAIM, CLAIM, DL_CLAIM, NRPS_CLAIM } from './claims.ts';
import { LaunchRefused, type RefusalCode } from './refusal.ts';

/** The registration a launch is checked against. */
export interface LaunchPlatform {
  issuer: string;
  clientId: string;
  deploymentIds: string[];
}

/** What a verified message carries that this service uses, whatever its type. */
interface VerifiedPerson {
  sub: string;
  displayName: string | null;
  roles: string[];
  contextId: string | undefined;
  /** The context's membership service (NRPS 2.0), when the platform offers it. */
  membershipsUrl: string | undefined;
  /** The context's line item container and the launched link's own line item (AGS 2.0), when offered. */
  lineItemsUrl: string | undefined;
  lineItemUrl: string | undefined;
}

/** A resource link launch, with the custom parameters of its link (LTI Core 1.3, 5.4.6). */
export interface VerifiedResourceLink extends VerifiedPerson {
  kind: 'resource-link';
  resourceLinkId: string;
  custom: Record<string, string>;
}

/** A deep linking request (Deep Linking 2.0, 4.4): where to answer and the data to echo. */
export interface VerifiedDeepLinking extends VerifiedPerson {
  kind: 'deep-linking';
  deploymentId: string;
  returnUrl: string;
  data: string | null;
}

export type VerifiedLaunch = VerifiedResourceLink | VerifiedDeepLinking;

/** How long after its issue an id_token is still taken, and the clock skew allowed (common practice, no source). */
const MAX_TOKEN_AGE_SECONDS = 300;
const CLOCK_TOLERANCE_SECONDS = 60;

/**
 * jose's errors as refusal codes. What jose throws that is not its own error comes from fetching the
 * platform's key set (a refused connection, a failed request); any other error of jose's means the
 * token could not be read.
 */
function refusalOf(error: unknown): RefusalCode {
  // jose reports an iat older than maxTokenAge as expiry of the iat claim.
  if (error instanceof errors.JWTExpired) return error.claim === 'iat' ? 'bad-issued-at' : 'token-expired';
  if (error instanceof errors.JWTClaimValidationFailed) {
    if (error.claim === 'iss') return 'unknown-issuer';
    if (error.claim === 'aud') return 'wrong-audience';
    if (error.claim === 'iat') return 'bad-issued-at';
    return 'claims-missing';
  }
  if (error instanceof errors.JWSSignatureVerificationFailed || error instanceof errors.JWKSNoMatchingKey || error instanceof errors.JWKSMultipleMatchingKeys) return 'bad-signature';
  if (error instanceof errors.JOSEAlgNotAllowed) return 'algorithm-not-allowed';
  if (error instanceof errors.JWKSTimeout || error instanceof errors.JWKSInvalid || !(error instanceof errors.JOSEError)) return 'platform-keys-unreachable';
  return 'token-malformed';
}

const text = (value: unknown): string | undefined => (typeof value === 'string' && value.length > 0 && value.length <= 255 ? value : undefined);

/**
 * Checks an id_token as the 1EdTech Security Framework 1.0 asks of a tool (5.1.3, authentication
 * response validation) and LTI Core 1.3 asks of a resource link launch (5.3, 5.4). Throws
 * `LaunchRefused` naming the first check that fails.
 */
export async function verifyLaunch(idToken: string, platform: LaunchPlatform, keys: JWTVerifyGetKey, nonce: string): Promise<VerifiedLaunch> {
  let claims: JWTPayload;
  try {
    // Signature by the platform's key set, RS256 only; iss exactly the registered issuer; aud
    // containing our client id; exp in the future and iat not too old (Security Framework 5.1.3, items 1-3, 6-8).
    ({ payload: claims } = await jwtVerify(idToken, keys, {
      algorithms: ['RS256'],
      issuer: platform.issuer,
      audience: platform.clientId,
      maxTokenAge: MAX_TOKEN_AGE_SECONDS,
      clockTolerance: CLOCK_TOLERANCE_SECONDS,
      requiredClaims: ['exp', 'iat', 'nonce'],
    }));
  } catch (error) {
    throw new LaunchRefused(refusalOf(error));
  }
  // Several audiences need azp, and an azp present must be our client id (5.1.3, items 4 and 5).
  const several = Array.isArray(claims.aud) && claims.aud.length > 1;
  if ((several || claims.azp !== undefined) && claims.azp !== platform.clientId) throw new LaunchRefused('wrong-audience');
  // The nonce sent with this login's state, and no other (5.1.3, item 9; the state keeps it used once).
  if (claims.nonce !== nonce) throw new LaunchRefused('nonce-mismatch');
  // LTI Core 1.3, 5.3.2: the version is 1.3.0.
  if (claims[CLAIM.version] !== '1.3.0') throw new LaunchRefused('wrong-version');
  // LTI Core 1.3, 5.3.3: the deployment is one registered for this platform.
  const deployment = claims[CLAIM.deploymentId];
  if (typeof deployment !== 'string' || !platform.deploymentIds.includes(deployment)) throw new LaunchRefused('unknown-deployment');
  // LTI Core 1.3, 5.3.6 (sub: an anonymous launch opens nothing here), 5.3.7 (roles), 5.4.1 (context).
  const sub = text(claims.sub);
  const roles = claims[CLAIM.roles];
  if (!sub || !Array.isArray(roles) || !roles.every((r) => typeof r === 'string')) throw new LaunchRefused('claims-missing');
  const person: VerifiedPerson = {
    sub,
    displayName: typeof claims.name === 'string' ? claims.name.slice(0, 200) : null,
    roles: roles as string[],
    contextId: text((claims[CLAIM.context] as { id?: unknown } | undefined)?.id),
    membershipsUrl: httpUrl((claims[NRPS_CLAIM] as { context_memberships_url?: unknown } | undefined)?.context_memberships_url),
    lineItemsUrl: httpUrl((claims[AGS_CLAIM] as { lineitems?: unknown } | undefined)?.lineitems),
    lineItemUrl: httpUrl((claims[AGS_CLAIM] as { lineitem?: unknown } | undefined)?.lineitem),
  };
  // LTI Core 1.3, 5.3.1: the message types this tool takes.
  const messageType = claims[CLAIM.messageType];
  if (messageType === 'LtiResourceLinkRequest') return resourceLink(claims, person);
  if (messageType === 'LtiDeepLinkingRequest') return deepLinking(claims, person, deployment);
  throw new LaunchRefused('unknown-message-type');
}

function resourceLink(claims: JWTPayload, person: VerifiedPerson): VerifiedResourceLink {
  // LTI Core 1.3, 5.3.5: a resource link launch names its resource link.
  const resourceLinkId = text((claims[CLAIM.resourceLink] as { id?: unknown } | undefined)?.id);
  if (!resourceLinkId) throw new LaunchRefused('claims-missing');
  // LTI Core 1.3, 5.4.6: custom parameters are a map of strings; anything else in it is left unread.
  const sent = claims[CLAIM.custom];
  const custom = typeof sent === 'object' && sent !== null ? Object.fromEntries(Object.entries(sent).filter((e): e is [string, string] => text(e[1]) !== undefined)) : {};
  return { kind: 'resource-link', ...person, resourceLinkId, custom };
}

function deepLinking(claims: JWTPayload, person: VerifiedPerson, deploymentId: string): VerifiedDeepLinking {
  // Deep Linking 2.0, 4.4.1: the settings name where to answer and what the platform accepts; the
  // only item this tool makes is an LTI resource link.
  const settings = claims[DL_CLAIM.settings] as { deep_link_return_url?: unknown; accept_types?: unknown; data?: unknown } | undefined;
  const returnUrl = httpUrl(settings?.deep_link_return_url);
  if (!returnUrl || !Array.isArray(settings?.accept_types)) throw new LaunchRefused('claims-missing');
  if (!settings.accept_types.includes('ltiResourceLink')) throw new LaunchRefused('link-type-not-accepted');
  // 4.4.1: data is opaque to the tool, echoed as sent.
  const data = typeof settings.data === 'string' && settings.data.length <= 4000 ? settings.data : null;
  return { kind: 'deep-linking', ...person, deploymentId, returnUrl, data };
}

/** An absolute http(s) URL, or undefined. */
function httpUrl(value: unknown): string | undefined {
  if (typeof value !== 'string' || value.length > 2000 || !URL.canParse(value)) return undefined;
  return ['http:', 'https:'].includes(new URL(value).protocol) ? value : undefined;
}
