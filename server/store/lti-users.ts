import type { Kysely } from 'kysely';
import { createStaff } from './courses.ts';
import type { Database } from './database.ts';
import { addToRoster } from './students.ts';

/** What a launch says of its person: the platform's subject id, display name and roles, nothing else. */
export interface LaunchedPerson {
  platformId: number;
  courseId: number;
  sub: string;
  displayName: string | null;
  roles: string[];
}

/** The launched person's row, made on their first launch; the name and roles are refreshed on each. */
async function launchUser(db: Kysely<Database>, p: LaunchedPerson) {
  return db
    .insertInto('lti_users')
    .values({ platform_id: p.platformId, sub: p.sub, display_name: p.displayName, roles: JSON.stringify(p.roles) })
    .onConflict((oc) => oc.columns(['platform_id', 'sub']).doUpdateSet({ display_name: p.displayName, roles: JSON.stringify(p.roles) }))
    .returning(['id', 'student_row_id', 'staff_id'])
    .executeTakeFirstOrThrow();
}

/**
 * The roster row of a launched learner: theirs from an earlier launch, or a new one in the placed
 * section, under a pseudonymous student id made from their launch row (`lti-<n>`), never the
 * platform's subject id. Undefined when that row is no longer enrolled (withdrawn or removed here).
 * `staffId` is who enrolled them: none for a launch, the instructor who pulled the roster otherwise.
 */
export async function launchedStudent(db: Kysely<Database>, p: LaunchedPerson, sectionId: number, staffId: number | null = null): Promise<number | undefined> {
  const user = await launchUser(db, p);
  if (user.student_row_id !== null) {
    const row = await db.selectFrom('students').select('status').where('id', '=', user.student_row_id).executeTakeFirstOrThrow();
    return row.status === 'enrolled' ? user.student_row_id : undefined;
  }
  const studentId = `lti-${user.id}`;
  await addToRoster(db, { id: sectionId, courseId: p.courseId }, [{ studentId, ...(p.displayName ? { displayName: p.displayName } : {}) }], new Map(), staffId);
  const row = await db.selectFrom('students').select('id').where('course_id', '=', p.courseId).where('student_id', '=', studentId).executeTakeFirstOrThrow();
  await db.updateTable('lti_users').set({ student_row_id: row.id }).where('id', '=', user.id).execute();
  return row.id;
}

/**
 * The staff row of a launched instructor or TA: theirs from an earlier launch (its role set to the one
 * launched now), or a new one with the handle `lti-<n>`; a TA is assigned to the launched section.
 */
export async function launchedStaff(db: Kysely<Database>, p: LaunchedPerson, role: 'instructor' | 'ta', sectionId?: number): Promise<number> {
  const user = await launchUser(db, p);
  let staffId = user.staff_id;
  if (staffId === null) {
    staffId = (await createStaff(db, p.courseId, `lti-${user.id}`, role, [])).id;
    await db.updateTable('lti_users').set({ staff_id: staffId }).where('id', '=', user.id).execute();
  } else {
    await db.updateTable('staff').set({ role }).where('id', '=', staffId).execute();
  }
  if (role === 'ta' && sectionId !== undefined) {
    await db.insertInto('ta_sections').values({ staff_id: staffId, section_id: sectionId }).onConflict((oc) => oc.doNothing()).execute();
  }
  return staffId;
}
