import { randomBytes } from 'node:crypto';
import type { Kysely } from 'kysely';
import type { Database } from '../store/database.ts';
import { useLoginState, storeLoginState, storeTicket } from '../store/lti-launch-states.ts';
import { getPlatform, placementOf, platformsOfIssuer, type PlatformRow } from '../store/lti-platforms.ts';
import { launchedStaff, launchedStudent, type LaunchedPerson } from '../store/lti-users.ts';
import { launchedRole } from './claims.ts';
import { platformKeys } from './platform-keys.ts';
import { LaunchRefused } from './refusal.ts';
import { verifyLaunch } from './verify-launch.ts';

/** How long a login's state waits for its launch, and a launch's ticket for its same-site step (common practice, no source). */
const STATE_SECONDS = 600;
const TICKET_SECONDS = 60;

const secret = () => randomBytes(32).toString('base64url');

export interface LoginFields {
  iss: string;
  login_hint: string;
  target_link_uri: string;
  lti_message_hint?: string;
  client_id?: string;
  lti_deployment_id?: string;
}

/**
 * Third-party initiated login (Security Framework 1.0, 5.1.1.1) answered with the authentication
 * request (5.1.1.2): the URL of the platform's authorisation endpoint to send the browser to, with a
 * fresh state and nonce stored server-side. An issuer (and client id, when given) not registered, or
 * a deployment id given that is not, is refused.
 */
export async function startLogin(db: Kysely<Database>, fields: LoginFields, redirectUri: string): Promise<string> {
  const [platform, ...others] = await platformsOfIssuer(db, fields.iss, fields.client_id);
  // An issuer registered with several client ids must say which it means.
  if (!platform || others.length > 0) throw new LaunchRefused('unknown-issuer');
  if (fields.lti_deployment_id !== undefined && !platform.deploymentIds.includes(fields.lti_deployment_id)) throw new LaunchRefused('unknown-deployment');
  const [state, nonce] = [secret(), secret()];
  await storeLoginState(db, state, nonce, platform.id, STATE_SECONDS);
  const url = new URL(platform.authUrl);
  const params: Record<string, string> = {
    scope: 'openid',
    response_type: 'id_token',
    response_mode: 'form_post',
    prompt: 'none',
    client_id: platform.clientId,
    redirect_uri: redirectUri,
    login_hint: fields.login_hint,
    state,
    nonce,
    ...(fields.lti_message_hint !== undefined ? { lti_message_hint: fields.lti_message_hint } : {}),
  };
  for (const [name, value] of Object.entries(params)) url.searchParams.set(name, value);
  return url.toString();
}

/** Where a verified launch goes: a ticket for a student or staff session, or a page saying the activity is not placed. */
export type LaunchOutcome = { kind: 'ticket'; ticket: string; as: 'student' | 'staff' } | { kind: 'not-placed' };

/**
 * The authentication response (Security Framework 1.0, 5.1.1.3): the state used up first (single
 * use, whatever follows), the id_token verified against the platform that state was issued for, and
 * the launched person found or made. Everything the launch stores is written in one transaction.
 */
export async function completeLaunch(db: Kysely<Database>, idToken: string | undefined, state: string | undefined): Promise<LaunchOutcome> {
  if (!state) throw new LaunchRefused('state-missing');
  const use = await useLoginState(db, state);
  if (use.outcome === 'unknown') throw new LaunchRefused('state-unknown');
  if (use.outcome === 'used') throw new LaunchRefused('nonce-replayed');
  if (use.outcome === 'expired') throw new LaunchRefused('state-expired');
  if (!idToken) throw new LaunchRefused('token-missing');
  const platform = (await getPlatform(db, use.platformId))!;
  const launch = await verifyLaunch(idToken, platform, platformKeys(platform.jwksUrl), use.nonce);
  const role = launchedRole(launch.roles);
  if (!role) throw new LaunchRefused('no-mapped-role');
  return db.transaction().execute((trx) => admit(trx, platform, launch, role));
}

async function admit(db: Kysely<Database>, platform: PlatformRow, launch: Awaited<ReturnType<typeof verifyLaunch>>, role: 'instructor' | 'ta' | 'student'): Promise<LaunchOutcome> {
  const person: LaunchedPerson = { platformId: platform.id, courseId: platform.courseId, sub: launch.sub, displayName: launch.displayName, roles: launch.roles };
  const ticket = secret();
  if (role === 'instructor') {
    await storeTicket(db, ticket, { staffId: await launchedStaff(db, person, 'instructor') }, TICKET_SECONDS);
    return { kind: 'ticket', ticket, as: 'staff' };
  }
  // A learner's or a TA's launch lands in the section the resource link was placed on.
  const placement = launch.contextId === undefined ? undefined : await placementOf(db, platform.id, launch.contextId, launch.resourceLinkId);
  if (!placement) return { kind: 'not-placed' };
  if (role === 'ta') {
    await storeTicket(db, ticket, { staffId: await launchedStaff(db, person, 'ta', placement.sectionId) }, TICKET_SECONDS);
    return { kind: 'ticket', ticket, as: 'staff' };
  }
  const studentRowId = await launchedStudent(db, person, placement.sectionId);
  if (studentRowId === undefined) throw new LaunchRefused('not-enrolled');
  await storeTicket(db, ticket, { studentRowId }, TICKET_SECONDS);
  return { kind: 'ticket', ticket, as: 'student' };
}
