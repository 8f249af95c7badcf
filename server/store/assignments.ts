import type { Kysely } from 'kysely';
import type { Database } from './database.ts';

const columns = ['id', 'course_id as courseId', 'title', 'kind', 'settings', 'settings_version as settingsVersion', 'created_at as createdAt'] as const;

export async function createAssignment(db: Kysely<Database>, courseId: number, title: string, kind: string, settings: unknown) {
  return db
    .insertInto('assignments')
    .values({ course_id: courseId, title, kind, settings: JSON.stringify(settings) })
    .returning(columns)
    .executeTakeFirstOrThrow();
}

export async function getAssignment(db: Kysely<Database>, id: number) {
  return db.selectFrom('assignments').select(columns).where('id', '=', id).executeTakeFirst();
}

export async function replaceSettings(db: Kysely<Database>, id: number, settings: unknown) {
  return db
    .updateTable('assignments')
    .set((eb) => ({ settings: JSON.stringify(settings), settings_version: eb('settings_version', '+', 1) }))
    .where('id', '=', id)
    .returning(columns)
    .executeTakeFirstOrThrow();
}

export type AssignmentRow = NonNullable<Awaited<ReturnType<typeof getAssignment>>>;

/** A course's assignments, without their settings. */
export async function listAssignments(db: Kysely<Database>, courseId: number) {
  return db.selectFrom('assignments').select(['id', 'title', 'kind']).where('course_id', '=', courseId).orderBy('id').execute();
}
