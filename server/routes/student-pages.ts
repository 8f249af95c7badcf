import type { Kysely } from 'kysely';
import { z } from 'zod';
import { documentName } from '../../reports/file-names.ts';
import type { ExperimentKind } from '../checks/experiment-kind.ts';
import { ApiError } from '../errors.ts';
import { assignmentOf } from '../grading/assignment-of.ts';
import { latePolicyOf } from '../grading/late-work.ts';
import { ownFeedback, releasedToStudent } from '../grading/own-feedback.ts';
import { placeOf } from '../grading/section-documents.ts';
import { gradeBatch, storeOwnSubmission } from '../grading/submit-batch.ts';
import { attachment } from '../http/download-header.ts';
import { submissionsFromCsv } from '../http/multipart-csv.ts';
import { defineRoute } from '../http/route-table.ts';
import { IdParam } from '../http/schemas.ts';
import { csrfTokenOf, readSessionCookie } from '../http/session-cookie.ts';
import { withStudentColumn } from '../input/own-student-column.ts';
import type { Database } from '../store/database.ts';
import type { StudentCaller } from '../store/student-access.ts';
import { assignmentsWithDeadlines, enrolledStudent, ownReleases, ownVersions, recordFeedbackRead } from '../store/student-pages.ts';
import { idKey } from '../store/students.ts';
import { latestSubmissionOf } from '../store/submissions.ts';
import { OwnFeedback, OwnSubmissionStored, StudentMe } from '../../schemas/api/student-pages.ts';

const OfAssignment = z.object({ assignmentId: IdParam });
const file = z.any().describe('a file');
const notFound = (message: string) => new ApiError('not-found', message);

/** The student's own id where their submission names one: another student's is refused, naming where it stood. */
function ownId(caller: StudentCaller, named: unknown, path: string): void {
  if (named !== undefined && named !== '' && (typeof named !== 'string' || idKey(named) !== idKey(caller.studentId))) {
    throw new ApiError('invalid-input', undefined, [{ path, message: 'your own student id only (or leave it out)' }]);
  }
}

/** The submission a student sent: the JSON body, or the one submission their CSV files hold (student_id filled in where left out). */
async function ownSubmission(caller: StudentCaller, kind: ExperimentKind, body: Record<string, unknown> | null | undefined, upload: { csvFiles: Record<string, string> } | null) {
  if (upload) {
    const csvFiles = Object.fromEntries(Object.entries(upload.csvFiles).map(([name, text]) => [name, withStudentColumn(text, caller.studentId)]));
    const { submissions } = await submissionsFromCsv(kind, { csvFiles });
    const ids = submissions.map((s) => (s as { studentId?: unknown }).studentId);
    for (const id of ids) ownId(caller, id, 'student_id');
    if (submissions.length !== 1) throw new ApiError('invalid-input', undefined, [{ path: 'student_id', message: 'the files must hold exactly one submission, your own' }]);
    return { ...(submissions[0] as object), studentId: caller.studentId };
  }
  if (!body) throw new ApiError('invalid-input', undefined, [{ path: 'body', message: "your submission as a JSON object, or the assignment's CSV files" }]);
  ownId(caller, body.studentId, 'body.studentId');
  return { ...body, studentId: caller.studentId };
}

/** A student's latest version of the URL's assignment, and what was released of it; 404 until something was. */
async function releasedOf(db: Kysely<Database>, caller: StudentCaller, assignmentId: number) {
  const latest = await latestSubmissionOf(db, caller.studentRowId, assignmentId);
  const released = latest && (await releasedToStudent(db, latest));
  if (!released) throw notFound('no feedback has been released to you for this assignment yet');
  // The first opening of a release is kept for the staff's page; later ones change nothing.
  await recordFeedbackRead(db, released.release.id, caller.studentRowId);
  return released;
}

/**
 * The students' own routes: each reads the signed-in student's own rows (no URL names a student),
 * within their course (the URL's assignment must be one of it, else 404).
 */
export const studentPageRoutes = [
  defineRoute({
    method: 'GET',
    url: '/v1/student/me',
    access: 'student',
    summary:
      "The signed-in student: their course and section, the page's CSRF token, and each assignment with its deadline, what late work meets, their versions (when, late, held) and the feedback released to them (and when they first opened it)",
    schema: { response: { 200: StudentMe } },
    async handler(request) {
      const { db, caller } = request;
      const student = await enrolledStudent(db, caller.studentRowId);
      if (!student) throw notFound('you are no longer enrolled in this section');
      const [assignments, versions, releases] = [
        await assignmentsWithDeadlines(db, student.courseId, student.sectionId),
        await ownVersions(db, caller.studentRowId),
        await ownReleases(db, caller.studentRowId),
      ];
      const released = new Map(releases.map((r) => [r.assignmentId, r]));
      return {
        studentId: student.studentId,
        displayName: student.displayName,
        course: { id: student.courseId, name: student.courseName },
        section: { id: student.sectionId, name: student.sectionName },
        csrfToken: csrfTokenOf(readSessionCookie(request) ?? ''),
        assignments: assignments.map((a) => {
          const { policy, points } = latePolicyOf(a.settings);
          const feedback = released.get(a.id);
          return {
            id: a.id,
            title: a.title,
            kind: a.kind,
            dueAt: a.dueAt,
            late: { policy, points },
            versions: versions.filter((v) => v.assignmentId === a.id).map(({ version, submittedAt, late, held }) => ({ version, submittedAt, late, held })),
            feedback: feedback ? { version: feedback.version, releasedAt: feedback.releasedAt, firstReadAt: feedback.firstReadAt } : null,
          };
        }),
      };
    },
  }),
  defineRoute({
    method: 'POST',
    url: '/v1/student/assignments/:assignmentId/submissions',
    access: 'student',
    summary:
      "A student submits their own work: a JSON object in the kind's submission shape (studentId may be left out), or multipart CSV files in the kind's layout (the student_id column may be left out); stored as a new version, marked late past the deadline. The answer says what the form holds, in plain lines, and never a score or a finding; a submission the kind cannot read is a 400 naming each field, and nothing is stored",
    schema: {
      params: OfAssignment,
      // Empty for a multipart upload, which is read into request.upload.
      body: z.record(z.string(), z.unknown()).nullish(),
      response: { 201: OwnSubmissionStored },
    },
    upload: true,
    transactional: true,
    async prepare({ scope, server, body, upload, caller }) {
      const { kind } = assignmentOf(scope.assignment.settings, 'settings');
      const submission = await ownSubmission(caller, kind, body, upload);
      const batch = await gradeBatch(server.grader, scope.assignment, [{ at: 'submission', submission }]);
      const [graded] = batch.graded;
      if (graded.status === 'rejected' || graded.payloadJson === undefined) {
        const prefix = upload ? '' : 'body.';
        throw new ApiError('invalid-input', 'the submission cannot be read; nothing was stored', graded.rejected.map((r) => ({ path: `${prefix}${r.path}`, message: r.message })));
      }
      return { batch, lines: kind.formSummary(kind.submissionSchema.parse(JSON.parse(graded.payloadJson))) };
    },
    async handler({ db, caller, prepared }, reply) {
      const stored = await storeOwnSubmission(db, prepared.batch, { studentRowId: caller.studentRowId, sectionId: caller.sectionId });
      return reply.code(201).send({ version: stored.version, submittedAt: stored.submittedAt, late: stored.late, held: stored.held, form: { lines: prepared.lines } });
    },
  }),
  defineRoute({
    method: 'GET',
    url: '/v1/student/assignments/:assignmentId/feedback',
    access: 'student',
    summary:
      "The feedback released to the student, as the staff's page of the submission draws it: findings in words, their values against the checker's, the plots' series and the released score, of the version released (404 before a release). The first opening of a release is recorded",
    schema: { params: OfAssignment, response: { 200: OwnFeedback } },
    async handler({ db, scope, caller }) {
      return ownFeedback(db, await releasedOf(db, caller, scope.assignment.id));
    },
  }),
  defineRoute({
    method: 'GET',
    url: '/v1/student/assignments/:assignmentId/feedback.pdf',
    access: 'student',
    summary: 'The feedback sheet released to the student (PDF), as released; 404 before a release. The first opening of a release is recorded',
    schema: { params: OfAssignment, response: { 200: file } },
    async handler({ db, server, scope, caller }, reply) {
      const { input } = await releasedOf(db, caller, scope.assignment.id);
      if (!input) throw notFound('the released result could not be checked, so it has no sheet');
      const pdf = await server.grader.renderSheet(input);
      return reply.type('application/pdf').headers(attachment(documentName([...placeOf(input.header), input.header.studentId, `v${input.header.version}`], 'feedback', '.pdf'))).send(pdf);
    },
  }),
];
