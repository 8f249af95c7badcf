import { sql, type Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as studentIdCase from '../../migrations/2026-12-05T1100-student-id-case.ts';
import { openTestDatabase, type TestDatabase } from '../support/test-database.ts';

/**
 * The migration that makes student ids one student whatever their case: it refuses, changing nothing,
 * a database whose rosters already hold two ids differing only in case, and names them by row id only.
 */
describe('the student-id case migration', () => {
  let database: TestDatabase;
  let db: Kysely<unknown>;
  let rowIds: number[];

  beforeAll(async () => {
    database = await openTestDatabase('postgres');
    db = database.store.db as unknown as Kysely<unknown>;
    const course = (await sql<{ id: number }>`insert into courses (name) values ('Invented course') returning id`.execute(db)).rows[0].id;
    const section = (await sql<{ id: number }>`insert into sections (course_id, name) values (${course}, 'A') returning id`.execute(db)).rows[0].id;
    // Before the migration the store allowed both spellings; the test takes it back to that state.
    await studentIdCase.down(db);
    rowIds = (await sql<{ id: number }>`insert into students (course_id, section_id, student_id) values (${course}, ${section}, 'Q-01'), (${course}, ${section}, 'q-01'), (${course}, ${section}, 'Q-02') returning id`.execute(db)).rows.map((r) => r.id);
  }, 60_000);
  afterAll(async () => database?.close());

  it('stops with the clashing rows named by internal id, no student id, and no index made', async () => {
    const failure = await db.transaction().execute((trx) => studentIdCase.up(trx)).catch((error: Error) => error);
    expect(failure).toBeInstanceOf(Error);
    expect((failure as Error).message).toContain(`student rows ${rowIds[0]} and ${rowIds[1]}`);
    expect((failure as Error).message).not.toMatch(/q-0/i);
    const index = await sql`select 1 from pg_indexes where indexname = 'students_course_student_any_case'`.execute(db);
    expect(index.rows).toHaveLength(0);
  });

  it('applies once the clash is resolved, after which the other case cannot be stored', async () => {
    await sql`update students set student_id = 'Q-03' where id = ${rowIds[1]}`.execute(db);
    await studentIdCase.up(db);
    const again = await sql`insert into students (course_id, section_id, student_id) select course_id, section_id, 'q-02' from students where id = ${rowIds[2]}`.execute(db).catch((error: { code?: string }) => error);
    expect((again as { code?: string }).code).toBe('23505');
  });
});
