import { sql, type Kysely } from 'kysely';
import type { Database, EnrolmentStatus } from './database.ts';
import type { ReleaseRow } from './releases.ts';
import type { SignalChoiceRow } from './signal-choices.ts';
import type { OverrideRow, ResultRow } from './submissions.ts';

/** Overrides and signal choices as JSON carries them: times as text. */
type OverrideJson = Omit<OverrideRow, 'at'> & { at: string };
type ChoiceJson = Omit<SignalChoiceRow, 'at'> & { at: string };

/** One roster student of a section as its results page shows them, from `sectionLatestResults`. */
export interface StudentLatest {
  studentId: string;
  enrolment: EnrolmentStatus;
  /** The latest version and its latest result; absent when the student submitted nothing. */
  latest?: {
    submission: {
      submissionId: number;
      version: number;
      submittedAt: Date;
      assignmentId: number;
      studentId: string;
      sectionId: number;
      courseId: number;
      enrolment: EnrolmentStatus;
      source: 'staff' | 'student';
      late: boolean;
      held: boolean;
    };
    result: ResultRow;
    /** The student's latest release (of this version or an earlier one) and the result it named. */
    release?: ReleaseRow;
    releasedRow?: ResultRow;
    /** When the student first opened that release; null while they have not. */
    feedbackFirstReadAt: Date | null;
    /** The student's overrides and signal choices of this assignment, every version's, oldest first. */
    overrides: OverrideRow[];
    choices: SignalChoiceRow[];
  };
}

/**
 * Every roster student of a section (removed ones left out), in student-id order, with their latest
 * version of an assignment (how it came in, whether late or held), its latest result (without refit
 * and settings: a table needs neither), their latest release, when they first opened it, and the
 * overrides and choices both need: one query, by key through
 * `latest_results` and the students' section index.
 */
export async function sectionLatestResults(db: Kysely<Database>, sectionId: number, assignmentId: number): Promise<StudentLatest[]> {
  const rows = await db
    .selectFrom('students')
    .leftJoin('latest_results as latest', (join) => join.onRef('latest.student_row_id', '=', 'students.id').on('latest.assignment_id', '=', assignmentId))
    .leftJoin('submissions', 'submissions.id', 'latest.submission_id')
    .leftJoin('results', 'results.id', 'latest.result_id')
    // The section's latest release per student, and its overrides and choices per student (of every
    // version: the code that applies them picks each version's own), each read in one pass.
    .leftJoin(
      (eb) =>
        eb
          .selectFrom('releases')
          .innerJoin('submissions as shown', 'shown.id', 'releases.submission_id')
          .innerJoin('students as releasedTo', 'releasedTo.id', 'shown.student_row_id')
          .where('releasedTo.section_id', '=', sectionId)
          .where('shown.assignment_id', '=', assignmentId)
          .distinctOn('shown.student_row_id')
          .select(['shown.student_row_id', 'releases.id', 'releases.submission_id', 'shown.version', 'releases.result_id', 'releases.overrides_through', 'releases.choices_through', 'releases.released_at'])
          .orderBy('shown.student_row_id')
          .orderBy('releases.id', 'desc')
          .as('release'),
      (join) => join.onRef('release.student_row_id', '=', 'students.id'),
    )
    .leftJoin(
      (eb) =>
        eb
          .selectFrom('overrides')
          .innerJoin('staff', 'staff.id', 'overrides.staff_id')
          .innerJoin('submissions as overridden', 'overridden.id', 'overrides.submission_id')
          .innerJoin('students as overriddenFor', 'overriddenFor.id', 'overridden.student_row_id')
          .where('overriddenFor.section_id', '=', sectionId)
          .where('overridden.assignment_id', '=', assignmentId)
          .groupBy('overridden.student_row_id')
          .select([
            'overridden.student_row_id',
            sql<OverrideJson[]>`json_agg(json_build_object('id', overrides.id, 'submissionId', overrides.submission_id, 'findingId', overrides.finding_id,
              'pointsBefore', overrides.points_before, 'pointsAfter', overrides.points_after, 'reason', overrides.reason,
              'reasonShown', overrides.reason_shown, 'by', staff.handle, 'at', overrides.created_at) order by overrides.id)`.as('list'),
          ])
          .as('overrideList'),
      (join) => join.onRef('overrideList.student_row_id', '=', 'students.id'),
    )
    .leftJoin(
      (eb) =>
        eb
          .selectFrom('signal_choices')
          .innerJoin('staff', 'staff.id', 'signal_choices.staff_id')
          .innerJoin('submissions as chosenFor', 'chosenFor.id', 'signal_choices.submission_id')
          .innerJoin('students as chosenStudent', 'chosenStudent.id', 'chosenFor.student_row_id')
          .where('chosenStudent.section_id', '=', sectionId)
          .where('chosenFor.assignment_id', '=', assignmentId)
          .groupBy('chosenFor.student_row_id')
          .select([
            'chosenFor.student_row_id',
            sql<ChoiceJson[]>`json_agg(json_build_object('id', signal_choices.id, 'submissionId', signal_choices.submission_id, 'code', signal_choices.code,
              'path', signal_choices.path, 'onSheet', signal_choices.on_sheet, 'by', staff.handle, 'at', signal_choices.created_at) order by signal_choices.id)`.as('list'),
          ])
          .as('choiceList'),
      (join) => join.onRef('choiceList.student_row_id', '=', 'students.id'),
    )
    // Whether the student has opened that release, by its key.
    .leftJoin('feedback_reads', 'feedback_reads.release_id', 'release.id')
    // The released result, read again only when it is not the latest.
    .leftJoin('results as shownResult', (join) => join.on(sql<boolean>`"shownResult".id = nullif(release.result_id, latest.result_id)`))
    .select([
      'students.id as studentRowId',
      'students.student_id as studentId',
      'students.status as enrolment',
      'students.section_id as sectionId',
      'students.course_id as courseId',
      'submissions.id as submissionId',
      'submissions.version as version',
      'submissions.created_at as submittedAt',
      'submissions.source as source',
      'submissions.late as late',
      'submissions.held as held',
      'results.id as resultId',
      'results.engine_version as engineVersion',
      'results.settings_version as settingsVersion',
      'results.status as status',
      'results.score as score',
      'results.max_score as maxScore',
      'results.findings as findings',
      'results.released_at as releasedAt',
      'results.created_at as gradedAt',
      'release.id as releaseId',
      'release.submission_id as releasedSubmissionId',
      'release.version as releasedVersion',
      'release.result_id as releasedResultId',
      'release.overrides_through as overridesThrough',
      'release.choices_through as choicesThrough',
      'release.released_at as releasedOn',
      'feedback_reads.first_read_at as feedbackFirstReadAt',
      'shownResult.id as shownResultId',
      'shownResult.submission_id as shownSubmissionId',
      'shownResult.engine_version as shownEngineVersion',
      'shownResult.settings_version as shownSettingsVersion',
      'shownResult.status as shownStatus',
      'shownResult.score as shownScore',
      'shownResult.max_score as shownMaxScore',
      'shownResult.findings as shownFindings',
      'shownResult.released_at as shownReleasedAt',
      'shownResult.created_at as shownGradedAt',
      'overrideList.list as overrides',
      'choiceList.list as choices',
    ])
    .where('students.section_id', '=', sectionId)
    .where('students.status', '!=', 'removed')
    .orderBy('students.student_id')
    .execute();
  return rows.map((r): StudentLatest => {
    const base = { studentId: r.studentId, enrolment: r.enrolment };
    if (r.submissionId === null || r.resultId === null) return base;
    const result: ResultRow = {
      resultId: r.resultId,
      submissionId: r.submissionId,
      engineVersion: r.engineVersion!,
      settingsVersion: r.settingsVersion!,
      status: r.status!,
      score: r.score,
      maxScore: r.maxScore!,
      findings: r.findings,
      releasedAt: r.releasedAt,
      gradedAt: r.gradedAt!,
      settings: null,
      refit: null,
    };
    const release: ReleaseRow | undefined =
      r.releaseId === null
        ? undefined
        : {
            forSubmissionId: r.submissionId,
            id: r.releaseId,
            submissionId: r.releasedSubmissionId!,
            version: r.releasedVersion!,
            resultId: r.releasedResultId!,
            overridesThrough: r.overridesThrough!,
            choicesThrough: r.choicesThrough!,
            releasedAt: r.releasedOn!,
          };
    const releasedRow: ResultRow | undefined =
      r.shownResultId === null
        ? release?.resultId === result.resultId
          ? result
          : undefined
        : {
            resultId: r.shownResultId,
            submissionId: r.shownSubmissionId!,
            engineVersion: r.shownEngineVersion!,
            settingsVersion: r.shownSettingsVersion!,
            status: r.shownStatus!,
            score: r.shownScore,
            maxScore: r.shownMaxScore!,
            findings: r.shownFindings,
            releasedAt: r.shownReleasedAt,
            gradedAt: r.shownGradedAt!,
            settings: null,
            refit: null,
          };
    // JSON carries times as text.
    const overrides = (r.overrides ?? []).map((o) => ({ ...o, at: new Date(o.at) }));
    const choices = (r.choices ?? []).map((c) => ({ ...c, at: new Date(c.at) }));
    const submission = {
      submissionId: r.submissionId,
      version: r.version!,
      submittedAt: r.submittedAt!,
      assignmentId,
      studentId: r.studentId,
      sectionId: r.sectionId,
      courseId: r.courseId,
      enrolment: r.enrolment,
      source: r.source!,
      late: r.late!,
      held: r.held!,
    };
    return { ...base, latest: { submission, result, release, releasedRow, feedbackFirstReadAt: r.feedbackFirstReadAt, overrides, choices } };
  });
}
