import type { Kysely } from 'kysely';
import type { PlatformRegistration } from '../../schemas/api/lti.ts';
import type { Database } from './database.ts';

export interface PlatformRow extends PlatformRegistration {
  id: number;
  createdAt: Date;
}

const columns = [
  'id',
  'course_id as courseId',
  'issuer',
  'client_id as clientId',
  'auth_url as authUrl',
  'token_url as tokenUrl',
  'jwks_url as jwksUrl',
  'created_at as createdAt',
] as const;

const fieldsOf = (p: PlatformRegistration) => ({ course_id: p.courseId, issuer: p.issuer, client_id: p.clientId, auth_url: p.authUrl, token_url: p.tokenUrl, jwks_url: p.jwksUrl });

async function withDeployments(db: Kysely<Database>, rows: Omit<PlatformRow, 'deploymentIds'>[]): Promise<PlatformRow[]> {
  if (rows.length === 0) return [];
  const deployments = await db.selectFrom('lti_deployments').selectAll().where('platform_id', 'in', rows.map((r) => r.id)).orderBy('deployment_id').execute();
  return rows.map((r) => ({ ...r, deploymentIds: deployments.filter((d) => d.platform_id === r.id).map((d) => d.deployment_id) }));
}

async function setDeployments(db: Kysely<Database>, platformId: number, deploymentIds: string[]): Promise<void> {
  await db.deleteFrom('lti_deployments').where('platform_id', '=', platformId).execute();
  await db.insertInto('lti_deployments').values([...new Set(deploymentIds)].map((d) => ({ platform_id: platformId, deployment_id: d }))).execute();
}

/** An issuer and client id already registered (undefined if free), other than `exceptId`. */
export async function registeredAs(db: Kysely<Database>, issuer: string, clientId: string, exceptId = 0): Promise<number | undefined> {
  const row = await db.selectFrom('lti_platforms').select('id').where('issuer', '=', issuer).where('client_id', '=', clientId).where('id', '<>', exceptId).executeTakeFirst();
  return row?.id;
}

export async function createPlatform(db: Kysely<Database>, p: PlatformRegistration): Promise<PlatformRow> {
  const { id } = await db.insertInto('lti_platforms').values(fieldsOf(p)).returning('id').executeTakeFirstOrThrow();
  await setDeployments(db, id, p.deploymentIds);
  return (await getPlatform(db, id))!;
}

/** Replaces a platform's registration whole, its deployments with it. */
export async function updatePlatform(db: Kysely<Database>, id: number, p: PlatformRegistration): Promise<PlatformRow | undefined> {
  const updated = await db.updateTable('lti_platforms').set(fieldsOf(p)).where('id', '=', id).returning('id').executeTakeFirst();
  if (!updated) return undefined;
  await setDeployments(db, id, p.deploymentIds);
  return getPlatform(db, id);
}

export async function getPlatform(db: Kysely<Database>, id: number): Promise<PlatformRow | undefined> {
  const rows = await db.selectFrom('lti_platforms').select(columns).where('id', '=', id).execute();
  return (await withDeployments(db, rows))[0];
}

export async function listPlatforms(db: Kysely<Database>): Promise<PlatformRow[]> {
  return withDeployments(db, await db.selectFrom('lti_platforms').select(columns).orderBy('id').execute());
}

/**
 * The platforms registered under an issuer, narrowed to one client id when the platform names it
 * (a login initiation may leave it out; an id_token's audience decides which then).
 */
export async function platformsOfIssuer(db: Kysely<Database>, issuer: string, clientId?: string): Promise<PlatformRow[]> {
  let query = db.selectFrom('lti_platforms').select(columns).where('issuer', '=', issuer);
  if (clientId !== undefined) query = query.where('client_id', '=', clientId);
  return withDeployments(db, await query.orderBy('id').execute());
}

/** Places a platform's resource link on an assignment and section (placing it again moves it). */
export async function placeResourceLink(
  db: Kysely<Database>,
  p: { platformId: number; contextId: string; resourceLinkId: string; assignmentId: number; sectionId: number; staffId: number | null },
): Promise<void> {
  const row = { platform_id: p.platformId, context_id: p.contextId, resource_link_id: p.resourceLinkId, assignment_id: p.assignmentId, section_id: p.sectionId, placed_by: p.staffId };
  await db
    .insertInto('lti_placements')
    .values(row)
    .onConflict((oc) => oc.columns(['platform_id', 'context_id', 'resource_link_id']).doUpdateSet({ assignment_id: p.assignmentId, section_id: p.sectionId, placed_by: p.staffId, placed_at: new Date() }))
    .execute();
}

/** Whether any of a platform's resource links is placed (its course then cannot change under them). */
export async function hasPlacements(db: Kysely<Database>, platformId: number): Promise<boolean> {
  return (await db.selectFrom('lti_placements').select('platform_id').where('platform_id', '=', platformId).limit(1).executeTakeFirst()) !== undefined;
}

/** Where a resource link was placed, if it was. */
export async function placementOf(db: Kysely<Database>, platformId: number, contextId: string, resourceLinkId: string) {
  return db
    .selectFrom('lti_placements')
    .select(['assignment_id as assignmentId', 'section_id as sectionId'])
    .where('platform_id', '=', platformId)
    .where('context_id', '=', contextId)
    .where('resource_link_id', '=', resourceLinkId)
    .executeTakeFirst();
}
