import { sql, type Kysely } from 'kysely';
import { inParts } from './in-parts.ts';
import type { Database } from './database.ts';
import { idKey } from './students.ts';

/** Submissions are immutable versions; results are appended (a regrade adds one); overrides are an audit trail. */

export interface NewSubmission {
  studentRowId: number;
  /** The submission as JSON text. */
  payloadJson: string;
}

/**
 * How submissions came in: a staff upload for the section, or a student through their own door, then
 * marked late when stored past the section's deadline and held when the late-work setting holds it.
 */
export interface Arrival {
  source: 'staff' | 'student';
  late: boolean;
  held: boolean;
}

/** A staff upload is on time by definition: staff collect work on the students' behalf, whenever they send it. */
export const STAFF_UPLOAD: Arrival = { source: 'staff', late: false, held: false };

/** A result as stored: its figures, and its refit and findings as JSON text. */
export interface StoredResult {
  engineVersion: string;
  status: string;
  score: number | null;
  maxScore: number;
  refitJson: string | null;
  findingsJson: string;
}

/** The settings every result of one grading used (stored beside each, so a later change leaves it as graded). */
export interface GradedWith {
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
  submittedBy: number | null,
  gradedWith: GradedWith,
  items: Array<NewSubmission & { result: StoredResult }>,
  arrival: Arrival = STAFF_UPLOAD,
): Promise<Array<{ submissionId: number; version: number; submittedAt: Date }>> {
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
    return { assignment_id: assignmentId, student_row_id: item.studentRowId, version, payload: item.payloadJson, submitted_by: submittedBy, ...arrival };
  });
  const stored: Array<{ id: number; version: number; created_at: Date }> = [];
  for (const chunk of inParts(values, ROWS_PER_INSERT)) stored.push(...(await db.insertInto('submissions').values(chunk).returning(['id', 'version', 'created_at']).execute()));
  await insertResults(db, gradedWith, items.map((item, i) => ({ result: item.result, submissionId: stored[i].id })));
  return stored.map((s) => ({ submissionId: s.id, version: s.version, submittedAt: s.created_at }));
}

// PostgreSQL takes at most 65,535 parameters in one statement: rows go in 1,000 at a time (at most 9 columns each).
const ROWS_PER_INSERT = 1000;

export async function insertResults(db: Kysely<Database>, gradedWith: GradedWith, items: Array<{ submissionId: number; result: StoredResult }>): Promise<void> {
  const settings = JSON.stringify(gradedWith.settings);
  for (const chunk of inParts(items, ROWS_PER_INSERT)) {
    const stored = await db
      .insertInto('results')
      .values(
        chunk.map(({ submissionId, result }) => ({
          submission_id: submissionId,
          engine_version: result.engineVersion,
          settings_version: gradedWith.settingsVersion,
          settings,
          status: result.status,
          score: result.score,
          max_score: result.maxScore,
          refit: result.refitJson,
          findings: result.findingsJson,
        })),
      )
      .returning('id')
      .execute();
    await recordLatestResults(db, stored.map((r) => r.id));
  }
}

/**
 * Records new results in `latest_results` where they are their student's latest (a later version, or a
 * regrade of the latest), in the transaction that stored them: the results page reads a section through
 * it by key (latest-results.ts) rather than searching every version and result.
 */
async function recordLatestResults(db: Kysely<Database>, resultIds: number[]): Promise<void> {
  if (resultIds.length === 0) return;
  await db
    .insertInto('latest_results')
    .columns(['assignment_id', 'student_row_id', 'submission_id', 'version', 'result_id'])
    .expression((eb) =>
      eb
        .selectFrom('results')
        .innerJoin('submissions', 'submissions.id', 'results.submission_id')
        // One row per student: two versions of one student in one batch would otherwise update a row twice.
        .distinctOn(['submissions.assignment_id', 'submissions.student_row_id'])
        .select(['submissions.assignment_id', 'submissions.student_row_id', 'submissions.id', 'submissions.version', 'results.id as result_id'])
        .where('results.id', 'in', resultIds)
        .orderBy('submissions.assignment_id')
        .orderBy('submissions.student_row_id')
        .orderBy('submissions.version', 'desc')
        .orderBy('results.id', 'desc'),
    )
    .onConflict((oc) =>
      oc
        .columns(['assignment_id', 'student_row_id'])
        .doUpdateSet({ submission_id: sql.ref('excluded.submission_id'), version: sql.ref('excluded.version'), result_id: sql.ref('excluded.result_id') })
        // A regrade of an earlier version, committed after a newer version was stored, leaves the newer one.
        .where(sql<boolean>`(excluded.version, excluded.result_id) > (latest_results.version, latest_results.result_id)`),
    )
    .execute();
}

/** A submission version without its payload: what a table of a section's results needs. */
const submissionHeadColumns = [
  'submissions.id as submissionId',
  'submissions.version as version',
  'submissions.created_at as submittedAt',
  'submissions.assignment_id as assignmentId',
  'students.student_id as studentId',
  'students.section_id as sectionId',
  'students.course_id as courseId',
  'students.status as enrolment',
  'submissions.source as source',
  'submissions.late as late',
  'submissions.held as held',
] as const;

const submissionColumns = [...submissionHeadColumns, 'submissions.payload as payload'] as const;

/** Submissions by their ids, in no particular order. */
export async function submissionsByIds(db: Kysely<Database>, ids: number[]) {
  if (ids.length === 0) return [];
  return db.selectFrom('submissions').innerJoin('students', 'students.id', 'submissions.student_row_id').select(submissionColumns).where('submissions.id', 'in', ids).execute();
}

/** A submission's version beside the latest version its student submitted to the same assignment. */
export async function versionAndLatest(db: Kysely<Database>, id: number) {
  return db
    .selectFrom('submissions as asked')
    .innerJoin('submissions as other', (join) => join.onRef('other.student_row_id', '=', 'asked.student_row_id').onRef('other.assignment_id', '=', 'asked.assignment_id'))
    .select((eb) => ['asked.version as version', eb.fn.max('other.version').as('latestVersion')])
    .where('asked.id', '=', id)
    .groupBy('asked.version')
    .executeTakeFirst();
}

export async function getSubmission(db: Kysely<Database>, id: number) {
  return (await submissionsByIds(db, [id])).at(0);
}

export type SubmissionRow = NonNullable<Awaited<ReturnType<typeof getSubmission>>>;

/** A student's latest version of an assignment, by their row (a student's own pages), or undefined. */
export async function latestSubmissionOf(db: Kysely<Database>, studentRowId: number, assignmentId: number): Promise<SubmissionRow | undefined> {
  return db
    .selectFrom('submissions')
    .innerJoin('students', 'students.id', 'submissions.student_row_id')
    .select(submissionColumns)
    .where('submissions.student_row_id', '=', studentRowId)
    .where('submissions.assignment_id', '=', assignmentId)
    .orderBy('submissions.version', 'desc')
    .limit(1)
    .executeTakeFirst();
}

/** A result without its refit and settings: what a table of a section's results needs. */
const resultSummaryColumns = [
  'results.id as resultId',
  'results.submission_id as submissionId',
  'results.engine_version as engineVersion',
  'results.settings_version as settingsVersion',
  'results.status as status',
  'results.score as score',
  'results.max_score as maxScore',
  'results.findings as findings',
  'results.released_at as releasedAt',
  'results.created_at as gradedAt',
] as const;

const resultColumns = [...resultSummaryColumns, 'results.settings as settings', 'results.refit as refit'] as const;

function latestResultQuery(db: Kysely<Database>, submissionIds: number[]) {
  return db
    .selectFrom('results')
    .where('results.id', 'in', (eb) =>
      eb.selectFrom('results as r').select((e) => e.fn.max('r.id').as('id')).where('r.submission_id', 'in', submissionIds).groupBy('r.submission_id'),
    );
}

/** The latest result of each of the given submissions. */
export async function latestResults(db: Kysely<Database>, submissionIds: number[]) {
  if (submissionIds.length === 0) return [];
  return latestResultQuery(db, submissionIds).select(resultColumns).execute();
}

export type ResultRow = Awaited<ReturnType<typeof latestResults>>[number];

/** The same without refit and settings (null), for tables: a section's refits are megabytes. */
export async function latestResultSummaries(db: Kysely<Database>, submissionIds: number[]): Promise<ResultRow[]> {
  if (submissionIds.length === 0) return [];
  const rows = await latestResultQuery(db, submissionIds).select(resultSummaryColumns).execute();
  return rows.map((r) => ({ ...r, settings: null, refit: null }));
}

function latestQuery(db: Kysely<Database>, assignmentId: number, sectionId?: number) {
  let query = db
    .selectFrom('submissions')
    .innerJoin('students', 'students.id', 'submissions.student_row_id')
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
  // A student removed from the roster leaves the section's tables, gradebook and regrades; their
  // versions stay readable in their history.
  return query.where('students.status', '!=', 'removed').orderBy('students.student_id');
}

/** The latest version of each student's submission to an assignment, in one section or all. */
export async function latestSubmissions(db: Kysely<Database>, assignmentId: number, sectionId?: number) {
  return latestQuery(db, assignmentId, sectionId).select(submissionColumns).execute();
}

/** The ids of the same, in the same order (what a regrade covers). */
export async function latestSubmissionIds(db: Kysely<Database>, assignmentId: number, sectionId?: number): Promise<number[]> {
  return (await latestQuery(db, assignmentId, sectionId).select('submissions.id').execute()).map((r) => r.id);
}

/** The same without payloads, for tables. */
export async function latestSubmissionHeads(db: Kysely<Database>, assignmentId: number, sectionId?: number) {
  return latestQuery(db, assignmentId, sectionId).select(submissionHeadColumns).execute();
}

/** Every version a student submitted, to any assignment or one. */
export async function studentSubmissions(db: Kysely<Database>, sectionId: number, studentId: string, assignmentId?: number) {
  let query = db
    .selectFrom('submissions')
    .innerJoin('students', 'students.id', 'submissions.student_row_id')
    .select(submissionColumns)
    .where('students.section_id', '=', sectionId)
    .where(sql`lower(students.student_id)`, '=', idKey(studentId));
  if (assignmentId !== undefined) query = query.where('submissions.assignment_id', '=', assignmentId);
  return query.orderBy('submissions.assignment_id').orderBy('submissions.version').execute();
}

/** Results by their ids (those a release names), as `latestResults` reads them; `summaries` leaves out refits and settings (null). */
export async function resultsByIds(db: Kysely<Database>, resultIds: number[], summaries = false): Promise<ResultRow[]> {
  if (resultIds.length === 0) return [];
  const query = db.selectFrom('results').where('results.id', 'in', resultIds);
  if (!summaries) return query.select(resultColumns).execute();
  return (await query.select(resultSummaryColumns).execute()).map((r) => ({ ...r, settings: null, refit: null }));
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
      'overrides.reason_shown as reasonShown',
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
  o: { submissionId: number; findingId: string; pointsBefore: number; pointsAfter: number; reason: string; reasonShown: boolean; staffId: number },
) {
  return db
    .insertInto('overrides')
    .values({ submission_id: o.submissionId, finding_id: o.findingId, points_before: o.pointsBefore, points_after: o.pointsAfter, reason: o.reason, reason_shown: o.reasonShown, staff_id: o.staffId })
    .returning('id')
    .executeTakeFirstOrThrow();
}
