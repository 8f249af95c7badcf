import { sql, type Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as latestResultsMigration from '../../migrations/2026-12-05T1400-latest-results.ts';
import type { Database } from '../../server/store/database.ts';
import { sectionLatestResults } from '../../server/store/latest-results.ts';
import { insertReleases } from '../../server/store/releases.ts';
import { recordFeedbackRead } from '../../server/store/student-pages.ts';
import { setEnrolment } from '../../server/store/students.ts';
import { insertOverride, insertResults, storeGraded, type StoredResult } from '../../server/store/submissions.ts';
import { openTestDatabase, type TestDatabase } from '../support/test-database.ts';

/**
 * The section read the results page is made from, kept by the store as results are stored: each
 * expectation below is written by hand from the steps taken (which version is the latest, which result
 * a regrade added, which release and override were made), not computed by the store's code.
 */
const graded = (score: number): StoredResult => ({ engineVersion: 'test', status: 'checked', score, maxScore: 10, refitJson: null, findingsJson: JSON.stringify({ findings: [], rejected: [] }) });
const gradedWith = { settings: {}, settingsVersion: 1 };

describe('latest results of a section', () => {
  let database: TestDatabase;
  let db: Kysely<Database>;
  let section: number;
  let assignment: number;
  let staff: number;
  const row: Record<string, number> = {};

  beforeAll(async () => {
    database = await openTestDatabase('postgres');
    db = database.store.db;
    const one = async <T,>(q: ReturnType<typeof sql<T>>) => (await q.execute(db)).rows[0];
    const course = (await one(sql<{ id: number }>`insert into courses (name) values ('Invented course') returning id`)).id;
    section = (await one(sql<{ id: number }>`insert into sections (course_id, name) values (${course}, 'A') returning id`)).id;
    staff = (await one(sql<{ id: number }>`insert into staff (course_id, handle, role) values (${course}, 'ta-1', 'ta') returning id`)).id;
    assignment = (await one(sql<{ id: number }>`insert into assignments (course_id, title, kind, settings) values (${course}, 'Invented', 'test', '{}') returning id`)).id;
    for (const id of ['Q-01', 'Q-02', 'Q-03', 'Q-04']) {
      row[id] = (await one(sql<{ id: number }>`insert into students (course_id, section_id, student_id) values (${course}, ${section}, ${id}) returning id`)).id;
    }
  }, 60_000);
  afterAll(async () => database?.close());

  const store = (items: Array<[string, number]>) =>
    db.transaction().execute((trx) => storeGraded(trx, assignment, staff, gradedWith, items.map(([id, score]) => ({ studentRowId: row[id], payloadJson: '{}', result: graded(score) }))));
  const page = async () => new Map((await sectionLatestResults(db, section, assignment)).map((s) => [s.studentId, s]));

  it('shows each student the latest version (two in one batch included) and nothing for one who submitted nothing', async () => {
    await store([['Q-01', 4], ['Q-01', 7], ['Q-02', 5], ['Q-04', 9]]);
    const rows = await page();
    expect([...rows.keys()]).toEqual(['Q-01', 'Q-02', 'Q-03', 'Q-04']);
    expect(rows.get('Q-01')!.latest!.submission.version).toBe(2);
    expect(rows.get('Q-01')!.latest!.result.score).toBe(7);
    expect(rows.get('Q-02')!.latest!.result.score).toBe(5);
    expect(rows.get('Q-03')!.latest).toBeUndefined();
  });

  it('a regrade of the latest version shows at once; a regrade of an earlier one changes nothing', async () => {
    const versions = await sql<{ id: number; version: number }>`select id, version from submissions where student_row_id = ${row['Q-01']} order by version`.execute(db);
    const [first, second] = versions.rows;
    await db.transaction().execute((trx) => insertResults(trx, gradedWith, [{ submissionId: second.id, result: graded(8) }]));
    await db.transaction().execute((trx) => insertResults(trx, gradedWith, [{ submissionId: first.id, result: graded(1) }]));
    const q01 = (await page()).get('Q-01')!.latest!;
    expect(q01.submission.version).toBe(2);
    expect(q01.result.score).toBe(8);
  });

  it('a release, then an override, then a new version: each is on the page right after', async () => {
    const q02 = (await page()).get('Q-02')!.latest!;
    await insertReleases(db, [{ submissionId: q02.submission.submissionId, resultId: q02.result.resultId, overridesThrough: 0, choicesThrough: 0 }], staff);
    const released = (await page()).get('Q-02')!.latest!;
    expect(released.release?.resultId).toBe(q02.result.resultId);
    expect(released.releasedRow?.score).toBe(5);

    await insertOverride(db, { submissionId: q02.submission.submissionId, findingId: 'f@x', pointsBefore: 1, pointsAfter: 0, reason: 'checked by hand', reasonShown: false, staffId: staff });
    const overridden = (await page()).get('Q-02')!.latest!;
    expect(overridden.overrides.map((o) => [o.findingId, o.pointsAfter, o.by])).toEqual([['f@x', 0, 'ta-1']]);
    expect(overridden.overrides[0].at).toBeInstanceOf(Date);

    await store([['Q-02', 6]]);
    const newer = (await page()).get('Q-02')!.latest!;
    expect(newer.submission.version).toBe(2);
    expect(newer.result.score).toBe(6);
    // The release of version 1 stays what the student sees, with the result it named and its override.
    expect(newer.release?.version).toBe(1);
    expect(newer.releasedRow?.score).toBe(5);
    expect(newer.overrides.map((o) => o.submissionId)).toEqual([q02.submission.submissionId]);
  });

  it('a withdrawal shows at once; a student removed from the roster leaves the page', async () => {
    await setEnrolment(db, section, 'Q-04', 'withdrawn', staff);
    expect((await page()).get('Q-04')!.enrolment).toBe('withdrawn');
    expect((await page()).get('Q-04')!.latest!.result.score).toBe(9);
    await setEnrolment(db, section, 'Q-03', 'removed', staff);
    expect((await page()).has('Q-03')).toBe(false);
  });

  it('the migration fills the table from the versions and results stored before it', async () => {
    const before = await sql<{ student_row_id: number; version: number; result_id: number }>`select student_row_id, version, result_id from latest_results order by student_row_id`.execute(db);
    await latestResultsMigration.down(db as unknown as Kysely<unknown>);
    await latestResultsMigration.up(db as unknown as Kysely<unknown>);
    const after = await sql<{ student_row_id: number; version: number; result_id: number }>`select student_row_id, version, result_id from latest_results order by student_row_id`.execute(db);
    // Q-01 (version 2, its regrade), Q-02 (version 2), Q-04 (version 1): three rows, as kept.
    expect(after.rows.map((r) => r.version)).toEqual([2, 2, 1]);
    expect(after.rows).toEqual(before.rows);
  });

  it("how a version came in, and the student's first read of the release they are shown, are on the row in the same read", async () => {
    const q01 = (await page()).get('Q-01')!.latest!;
    expect(q01.submission).toMatchObject({ source: 'staff', late: false, held: false });
    expect(q01.feedbackFirstReadAt).toBeNull();
    await insertReleases(db, [{ submissionId: q01.submission.submissionId, resultId: q01.result.resultId, overridesThrough: 0, choicesThrough: 0 }], staff);
    const releaseId = (await page()).get('Q-01')!.latest!.release!.id;
    await recordFeedbackRead(db, releaseId, row['Q-01']);
    const firstRead = (await page()).get('Q-01')!.latest!.feedbackFirstReadAt;
    expect(firstRead).toBeInstanceOf(Date);
    // Opened again: the first time stays.
    await recordFeedbackRead(db, releaseId, row['Q-01']);
    expect((await page()).get('Q-01')!.latest!.feedbackFirstReadAt).toEqual(firstRead);

    // A late version from the student's own door, held: the release they read is still the one shown.
    await db.transaction().execute((trx) =>
      storeGraded(trx, assignment, null, gradedWith, [{ studentRowId: row['Q-01'], payloadJson: '{}', result: graded(3) }], { source: 'student', late: true, held: true }),
    );
    const held = (await page()).get('Q-01')!.latest!;
    expect(held.submission).toMatchObject({ version: 3, source: 'student', late: true, held: true });
    expect([held.release?.id, held.feedbackFirstReadAt]).toEqual([releaseId, firstRead]);

    // Released anew: the new release has not been read.
    await insertReleases(db, [{ submissionId: held.submission.submissionId, resultId: held.result.resultId, overridesThrough: 0, choicesThrough: 0 }], staff);
    expect((await page()).get('Q-01')!.latest!.feedbackFirstReadAt).toBeNull();
  });
});
