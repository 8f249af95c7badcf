import type { Kysely } from 'kysely';
import type { Database } from './database.ts';

export async function createCourse(db: Kysely<Database>, name: string) {
  return db.insertInto('courses').values({ name }).returning(['id', 'name', 'created_at as createdAt']).executeTakeFirstOrThrow();
}

export async function getCourse(db: Kysely<Database>, id: number) {
  return db.selectFrom('courses').select(['id', 'name', 'created_at as createdAt']).where('id', '=', id).executeTakeFirst();
}

export async function createSection(db: Kysely<Database>, courseId: number, name: string) {
  return db.insertInto('sections').values({ course_id: courseId, name }).returning(['id', 'course_id as courseId', 'name']).executeTakeFirstOrThrow();
}

export async function getSection(db: Kysely<Database>, id: number) {
  return db.selectFrom('sections').select(['id', 'course_id as courseId', 'name']).where('id', '=', id).executeTakeFirst();
}

export async function listSections(db: Kysely<Database>, courseId: number) {
  return db.selectFrom('sections').select(['id', 'course_id as courseId', 'name']).where('course_id', '=', courseId).orderBy('id').execute();
}

export async function createStaff(db: Kysely<Database>, courseId: number, handle: string, role: 'instructor' | 'ta', sectionIds: number[]) {
  const staff = await db
    .insertInto('staff')
    .values({ course_id: courseId, handle, role })
    .returning(['id', 'course_id as courseId', 'handle', 'role'])
    .executeTakeFirstOrThrow();
  if (sectionIds.length > 0) {
    await db.insertInto('ta_sections').values(sectionIds.map((s) => ({ staff_id: staff.id, section_id: s }))).execute();
  }
  return { ...staff, sectionIds };
}

export async function getStaff(db: Kysely<Database>, id: number) {
  return db.selectFrom('staff').select(['id', 'course_id as courseId', 'handle', 'role']).where('id', '=', id).executeTakeFirst();
}

/** Courses by id, or every course (for the admin). */
export async function listCourses(db: Kysely<Database>, ids?: number[]) {
  let query = db.selectFrom('courses').select(['id', 'name', 'created_at as createdAt']).orderBy('id');
  if (ids) {
    if (ids.length === 0) return [];
    query = query.where('id', 'in', ids);
  }
  return query.execute();
}

/** A course's staff with the sections each TA teaches and how many live tokens each holds. */
export async function listStaff(db: Kysely<Database>, courseId: number) {
  const staff = await db
    .selectFrom('staff')
    .select(['id', 'course_id as courseId', 'handle', 'role'])
    .select((eb) => eb.selectFrom('api_tokens').select(eb.fn.countAll<string>().as('n')).whereRef('api_tokens.staff_id', '=', 'staff.id').where('api_tokens.revoked_at', 'is', null).as('liveTokens'))
    .where('course_id', '=', courseId)
    .orderBy('id')
    .execute();
  const ids = staff.map((s) => s.id);
  const links = ids.length ? await db.selectFrom('ta_sections').select(['staff_id', 'section_id']).where('staff_id', 'in', ids).execute() : [];
  return staff.map((s) => ({ ...s, liveTokens: Number(s.liveTokens ?? 0), sectionIds: links.filter((l) => l.staff_id === s.id).map((l) => l.section_id) }));
}
