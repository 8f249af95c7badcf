import { sql, type Kysely } from 'kysely';
import type { CheckResult } from '../../schemas/result.ts';
import type { Database } from './database.ts';

/** Submissions are immutable versions; results are appended (a regrade adds one); overrides are an audit trail. */

export interface NewSubmission {
  studentRowId: number;
  payload: unknown;
}

export interface ResultRecord {
  result: CheckResult;
  settings: unknown;
  settingsVersion: number;
}

/** The next version number of each student's submission to an assignment. */
async function nextVersions(db: Kysely<Database>, assignmentId: number, studentRowIds: number[]): Promise<Map<number, number>> {
  const rows = await db
    .selectFrom('submissions')
    .select(['student_row_id', (eb) => eb.fn.max('version').as('last')])
    .where('assignment_id', '=', assignmentId)
    .where('student_row_id', 'in', studentRowIds)
    .groupBy('student_row_id')
    .execute();
  const last = new Map(rows.map((r) => [r.student_row_id, Number(r.last)]));
  return new Map(studentRowIds.map((id) => [id, (last.get(id) ?? 0) + 1]));
}

/** Stores new versions and their results, in the caller's transaction; returns ids and versions in order. */
export async function storeGraded(
  db: Kysely<Database>,
  assignmentId: number,
  submittedBy: number,
  items: Array<NewSubmission & ResultRecord>,
): Promise<Array<{ submissionId: number; version: number }>> {
  if (items.length === 0) return [];
  const students = [...new Set(items.map((i) => i.studentRowId))].sort((a, b) => a - b);
  // Two batches for the same students at once (two TAs, or a retry from another tool): each waits for
  // the other's students to be free, in id order so that neither waits for the other forever, and then
  // counts versions that include the other's. Needs the caller's transaction.
  await db.selectFrom('students').select('id').where('id', 'in', students).orderBy('id').forUpdate().execute();
  const versions = await nextVersions(db, assignmentId, students);
  // Two submissions for one student in one request become consecutive versions.
  const values = items.map((item) => {
    const version = versions.get(item.studentRowId)!;
    versions.set(item.studentRowId, version + 1);
    return { assignment_id: assignmentId, student_row_id: item.studentRowId, version, payload: JSON.stringify(item.payload), submitted_by: submittedBy };
  });
  const stored: Array<{ id: number; version: number }> = [];
  for (const chunk of chunks(values)) stored.push(...(await db.insertInto('submissions').values(chunk).returning(['id', 'version']).execute()));
  await insertResults(db, items.map((item, i) => ({ ...item, submissionId: stored[i].id })));
  return stored.map((s) => ({ submissionId: s.id, version: s.version }));
}

// PostgreSQL takes at most 65,535 parameters in one statement: rows go in 1,000 at a time (9 columns each).
const ROWS_PER_INSERT = 1000;

function chunks<T>(items: T[]): T[][] {
  return Array.from({ length: Math.ceil(items.length / ROWS_PER_INSERT) }, (_, i) => items.slice(i * ROWS_PER_INSERT, (i + 1) * ROWS_PER_INSERT));
}

export async function insertResults(db: Kysely<Database>, items: Array<ResultRecord & { submissionId: number }>): Promise<void> {
  for (const chunk of chunks(items)) await insertResultRows(db, chunk);
}

async function insertResultRows(db: Kysely<Database>, items: Array<ResultRecord & { submissionId: number }>): Promise<void> {
  await db
    .insertInto('results')
    .values(
      items.map(({ submissionId, result, settings, settingsVersion }) => ({
        submission_id: submissionId,
        engine_version: result.engineVersion,
        settings_version: settingsVersion,
        settings: JSON.stringify(settings),
        status: result.status,
        score: result.score,
        max_score: result.maxScore,
        refit: result.refit === null ? null : JSON.stringify(result.refit),
        findings: JSON.stringify({ findings: result.findings, rejected: result.rejected ?? [] }),
      })),
    )
    .execute();
}

const submissionColumns = [
  'submissions.id as submissionId',
  'submissions.version as version',
  'submissions.payload as payload',
  'submissions.created_at as submittedAt',
  'submissions.assignment_id as assignmentId',
  'students.student_id as studentId',
  'students.section_id as sectionId',
  'students.course_id as courseId',
] as const;

export async function getSubmission(db: Kysely<Database>, id: number) {
  return db
    .selectFrom('submissions')
    .innerJoin('students', 'students.id', 'submissions.student_row_id')
    .select(submissionColumns)
    .where('submissions.id', '=', id)
    .executeTakeFirst();
}

export type SubmissionRow = NonNullable<Awaited<ReturnType<typeof getSubmission>>>;

const resultColumns = [
  'results.id as resultId',
  'results.submission_id as submissionId',
  'results.engine_version as engineVersion',
  'results.settings_version as settingsVersion',
  'results.settings as settings',
  'results.status as status',
  'results.score as score',
  'results.max_score as maxScore',
  'results.refit as refit',
  'results.findings as findings',
  'results.released_at as releasedAt',
  'results.created_at as gradedAt',
] as const;

/** The latest result of each of the given submissions. */
export async function latestResults(db: Kysely<Database>, submissionIds: number[]) {
  if (submissionIds.length === 0) return [];
  return db
    .selectFrom('results')
    .select(resultColumns)
    .where('results.id', 'in', (eb) =>
      eb.selectFrom('results as r').select((e) => e.fn.max('r.id').as('id')).where('r.submission_id', 'in', submissionIds).groupBy('r.submission_id'),
    )
    .execute();
}

export type ResultRow = Awaited<ReturnType<typeof latestResults>>[number];

/** The latest version of each student's submission to an assignment, in one section or all. */
export async function latestSubmissions(db: Kysely<Database>, assignmentId: number, sectionId?: number) {
  let query = db
    .selectFrom('submissions')
    .innerJoin('students', 'students.id', 'submissions.student_row_id')
    .select(submissionColumns)
    .where('submissions.assignment_id', '=', assignmentId)
    .where(({ not, exists, selectFrom }) =>
      not(
        exists(
          selectFrom('submissions as later')
            .select(sql`1`.as('one'))
            .whereRef('later.student_row_id', '=', 'submissions.student_row_id')
            .whereRef('later.assignment_id', '=', 'submissions.assignment_id')
            .whereRef('later.version', '>', 'submissions.version'),
        ),
      ),
    );
  if (sectionId !== undefined) query = query.where('students.section_id', '=', sectionId);
  return query.orderBy('students.student_id').execute();
}

/** Every version a student submitted, to any assignment or one. */
export async function studentSubmissions(db: Kysely<Database>, sectionId: number, studentId: string, assignmentId?: number) {
  let query = db
    .selectFrom('submissions')
    .innerJoin('students', 'students.id', 'submissions.student_row_id')
    .select(submissionColumns)
    .where('students.section_id', '=', sectionId)
    .where('students.student_id', '=', studentId);
  if (assignmentId !== undefined) query = query.where('submissions.assignment_id', '=', assignmentId);
  return query.orderBy('submissions.assignment_id').orderBy('submissions.version').execute();
}

export async function releaseResults(db: Kysely<Database>, resultIds: number[], staffId: number): Promise<number> {
  if (resultIds.length === 0) return 0;
  const rows = await db
    .updateTable('results')
    .set({ released_at: sql<Date>`now()`, released_by: staffId })
    .where('id', 'in', resultIds)
    .where('released_at', 'is', null)
    .returning('id')
    .execute();
  return rows.length;
}

export async function overridesOf(db: Kysely<Database>, submissionIds: number[]) {
  if (submissionIds.length === 0) return [];
  return db
    .selectFrom('overrides')
    .innerJoin('staff', 'staff.id', 'overrides.staff_id')
    .select([
      'overrides.id as id',
      'overrides.submission_id as submissionId',
      'overrides.finding_id as findingId',
      'overrides.points_before as pointsBefore',
      'overrides.points_after as pointsAfter',
      'overrides.reason as reason',
      'staff.handle as by',
      'overrides.created_at as at',
    ])
    .where('overrides.submission_id', 'in', submissionIds)
    .orderBy('overrides.id')
    .execute();
}

export type OverrideRow = Awaited<ReturnType<typeof overridesOf>>[number];

export async function insertOverride(
  db: Kysely<Database>,
  o: { submissionId: number; findingId: string; pointsBefore: number; pointsAfter: number; reason: string; staffId: number },
) {
  return db
    .insertInto('overrides')
    .values({ submission_id: o.submissionId, finding_id: o.findingId, points_before: o.pointsBefore, points_after: o.pointsAfter, reason: o.reason, staff_id: o.staffId })
    .returning('id')
    .executeTakeFirstOrThrow();
}
