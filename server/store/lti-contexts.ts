import type { Kysely } from 'kysely';
import type { Database, EnrolmentStatus } from './database.ts';

/** A context's service URLs as a launch sent them: its membership service (NRPS 2.0) and line item container (AGS 2.0). */
export interface ContextUrls {
  membershipsUrl?: string;
  lineItemsUrl?: string;
}

/** Keeps the service URLs a launch sent for its context; one not sent keeps what an earlier launch sent. */
export async function storeContextUrls(db: Kysely<Database>, platformId: number, contextId: string, urls: ContextUrls): Promise<void> {
  const set = { ...(urls.membershipsUrl !== undefined ? { memberships_url: urls.membershipsUrl } : {}), ...(urls.lineItemsUrl !== undefined ? { line_items_url: urls.lineItemsUrl } : {}) };
  if (Object.keys(set).length === 0) return;
  await db
    .insertInto('lti_contexts')
    .values({ platform_id: platformId, context_id: contextId, ...set })
    .onConflict((oc) => oc.columns(['platform_id', 'context_id']).doUpdateSet(set))
    .execute();
}

/** The platform contexts whose resource links are placed on a section, each with its membership URL if one is known. */
export async function contextsOfSection(db: Kysely<Database>, sectionId: number) {
  return db
    .selectFrom('lti_placements')
    .leftJoin('lti_contexts', (join) => join.onRef('lti_contexts.platform_id', '=', 'lti_placements.platform_id').onRef('lti_contexts.context_id', '=', 'lti_placements.context_id'))
    .select(['lti_placements.platform_id as platformId', 'lti_placements.context_id as contextId', 'lti_contexts.memberships_url as membershipsUrl'])
    .where('lti_placements.section_id', '=', sectionId)
    .distinct()
    .orderBy('lti_placements.platform_id')
    .orderBy('lti_placements.context_id')
    .execute();
}

/** The students a platform made (by launch or roster pull), by the platform's subject id, wherever in the course they are. */
export async function platformStudents(db: Kysely<Database>, platformId: number): Promise<Map<string, { rowId: number; sectionId: number; studentId: string; status: EnrolmentStatus }>> {
  const rows = await db
    .selectFrom('lti_users')
    .innerJoin('students', 'students.id', 'lti_users.student_row_id')
    .select(['lti_users.sub as sub', 'students.id as rowId', 'students.section_id as sectionId', 'students.student_id as studentId', 'students.status as status'])
    .where('lti_users.platform_id', '=', platformId)
    .execute();
  return new Map(rows.map(({ sub, ...row }) => [sub, row]));
}
