import { randomBytes } from 'node:crypto';
import type { Kysely } from 'kysely';
import type { Database } from '../store/database.ts';
import { useLoginState, storeLoginState, storeTicket } from '../store/lti-launch-states.ts';
import { getAssignment, listAssignments } from '../store/assignments.ts';
import { getSection, listSections } from '../store/courses.ts';
import { storeDeepLink } from '../store/lti-deep-links.ts';
import { storeContextUrls } from '../store/lti-contexts.ts';
import { storeLineItem } from '../store/lti-line-items.ts';
import { getPlatform, placeResourceLink, placementOf, platformsOfIssuer, type PlatformRow } from '../store/lti-platforms.ts';
import { launchedStaff, launchedStudent, type LaunchedPerson } from '../store/lti-users.ts';
import { launchedRole } from './claims.ts';
import { placedByCustom } from './deep-linking.ts';
import { platformKeys } from './platform-keys.ts';
import { LaunchRefused } from './refusal.ts';
import { verifyLaunch, type VerifiedDeepLinking, type VerifiedResourceLink } from './verify-launch.ts';

/** How long a login's state waits for its launch, and a launch's ticket for its same-site step (common practice, no source). */
const STATE_SECONDS = 600;
const TICKET_SECONDS = 60;
/** How long an instructor has to choose what a deep link places (common practice, no source). */
const CHOICE_SECONDS = 1800;

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

export interface Choices {
  assignments: { id: number; title: string }[];
  sections: { id: number; name: string }[];
}

/**
 * Where a verified launch goes: a ticket for a student or staff session, a page saying the activity
 * is not placed, or (a deep linking request) the choice of an assignment and section under a ticket.
 */
export type LaunchOutcome = { kind: 'ticket'; ticket: string; as: 'student' | 'staff' } | { kind: 'not-placed' } | ({ kind: 'choose'; ticket: string } & Choices);

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
  // Of the context only its service URLs are kept: the membership URL from staff alone, as a roster
  // pull is theirs to start (NRPS 2.0); the line item container from anyone's launch (AGS 2.0).
  if (launch.contextId !== undefined) {
    await storeContextUrls(db, platform.id, launch.contextId, { ...(role !== 'student' ? { membershipsUrl: launch.membershipsUrl } : {}), lineItemsUrl: launch.lineItemsUrl });
  }
  if (launch.kind === 'deep-linking') return chooseToPlace(db, platform, launch, role);
  return db.transaction().execute((trx) => admit(trx, platform, launch, role));
}

/**
 * A deep linking request (Deep Linking 2.0, 4.4) places an activity: only an instructor of the course
 * may (a TA sees one section, a learner none). Kept under a ticket for the choice that answers it.
 */
async function chooseToPlace(db: Kysely<Database>, platform: PlatformRow, launch: VerifiedDeepLinking, role: 'instructor' | 'ta' | 'student'): Promise<LaunchOutcome> {
  if (role !== 'instructor') throw new LaunchRefused('deep-linking-not-instructor');
  const ticket = secret();
  await storeDeepLink(db, ticket, { platformId: platform.id, deploymentId: launch.deploymentId, returnUrl: launch.returnUrl, data: launch.data }, CHOICE_SECONDS);
  const [assignments, sections] = await Promise.all([listAssignments(db, platform.courseId), listSections(db, platform.courseId)]);
  return { kind: 'choose', ticket, assignments: assignments.map(({ id, title }) => ({ id, title })), sections: sections.map(({ id, name }) => ({ id, name })) };
}

/**
 * Where a resource link is placed: by hand (the lti-placement route) or, for a link deep-linked here,
 * recorded at its first launch from the assignment and section its custom parameters name, when
 * both are of the platform's course. A placement already made stands (an instructor may move it).
 */
async function placementFor(db: Kysely<Database>, platform: PlatformRow, launch: VerifiedResourceLink) {
  if (launch.contextId === undefined) return undefined;
  const placed = await placementOf(db, platform.id, launch.contextId, launch.resourceLinkId);
  if (placed) return placed;
  const named = placedByCustom(launch.custom);
  if (!named || (await ofCourse(db, platform.courseId, named)) !== true) return undefined;
  await placeResourceLink(db, { platformId: platform.id, contextId: launch.contextId, resourceLinkId: launch.resourceLinkId, ...named, staffId: null });
  return named;
}

/** Whether an assignment and a section are both of a course; the field that is not, otherwise. */
export async function ofCourse(db: Kysely<Database>, courseId: number, pair: { assignmentId: number; sectionId: number }): Promise<true | 'assignmentId' | 'sectionId'> {
  if ((await getAssignment(db, pair.assignmentId))?.courseId !== courseId) return 'assignmentId';
  if ((await getSection(db, pair.sectionId))?.courseId !== courseId) return 'sectionId';
  return true;
}

async function admit(db: Kysely<Database>, platform: PlatformRow, launch: VerifiedResourceLink, role: 'instructor' | 'ta' | 'student'): Promise<LaunchOutcome> {
  const person: LaunchedPerson = { platformId: platform.id, courseId: platform.courseId, sub: launch.sub, displayName: launch.displayName, roles: launch.roles };
  const ticket = secret();
  const placement = await placementFor(db, platform, launch);
  // AGS 2.0: the line item the platform bound to this link is where its assignment's scores go.
  if (placement && launch.lineItemUrl !== undefined) await storeLineItem(db, { platformId: platform.id, contextId: launch.contextId!, assignmentId: placement.assignmentId, url: launch.lineItemUrl });
  if (role === 'instructor') {
    await storeTicket(db, ticket, { staffId: await launchedStaff(db, person, 'instructor') }, TICKET_SECONDS);
    return { kind: 'ticket', ticket, as: 'staff' };
  }
  // A learner's or a TA's launch lands in the section the resource link was placed on.
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
