import { z } from 'zod';
import { ApiError } from '../errors.ts';
import { releasesDue, sectionPageRows } from '../grading/report-inputs.ts';
import { queuePassback, sendFailedAgain } from '../grading/service-jobs.ts';
import { staffIdOf } from '../http/access.ts';
import { defineRoute } from '../http/route-table.ts';
import { IdParam } from '../http/schemas.ts';
import { gradeSendsOfSection } from '../store/grade-sends.ts';
import { insertReleases } from '../store/releases.ts';
import { latestSubmissionHeads, versionAndLatest } from '../store/submissions.ts';
import { Released, ResultRow, SendsRetried } from '../../schemas/api/results.ts';

const params = z.object({ sectionId: IdParam, assignmentId: IdParam });

/** A roster student without a submission: nothing to count. */
const NOT_SUBMITTED = { submissionId: null, version: null, submittedAt: null, source: null, late: false, held: false, feedbackFirstReadAt: null, score: null, maxScore: null, errors: 0, warnings: 0, infos: 0, codes: [], released: false, releasedScore: null, releasedVersion: null, changedSinceRelease: false, gradeSent: null };

/** Where a student reads their feedback, on the origin the releasing TA used: the comment sent with each score names it. */
const feedbackUrl = (request: { protocol: string; host: string }) => `${request.protocol}://${request.host}/student`;

export const resultRoutes = [
  defineRoute({
    method: 'GET',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/results',
    access: 'section',
    summary: "A section's results: one row per roster student (latest version, or not submitted), with the likely causes that cost points, the warnings and the notes counted one per cause as the feedback sheet groups them, and the codes found",
    schema: { params, response: { 200: z.array(ResultRow) } },
    async handler({ db, scope }) {
      const [sectionId, assignmentId] = [scope.section.id, scope.assignment.id];
      // One list in student-id order (code-unit order, as before), submitted or not.
      const sends = await gradeSendsOfSection(db, assignmentId, sectionId);
      const rows = (await sectionPageRows(db, sectionId, assignmentId)).map((row) => {
        if (!('submission' in row)) {
          return { ...NOT_SUBMITTED, studentId: row.studentId, status: row.enrolment === 'withdrawn' ? 'withdrawn' : 'not-submitted', enrolment: row.enrolment };
        }
        const { submission, shows, released, changedSinceRelease, feedbackFirstReadAt } = row;
        return {
          studentId: submission.studentId,
          submissionId: submission.submissionId,
          version: submission.version,
          submittedAt: submission.submittedAt,
          source: submission.source,
          late: submission.late,
          held: submission.held,
          feedbackFirstReadAt,
          status: submission.enrolment === 'withdrawn' ? 'withdrawn' : row.status,
          enrolment: submission.enrolment,
          score: shows.score,
          maxScore: shows.maxScore,
          errors: shows.errors,
          warnings: shows.warnings,
          infos: shows.infos,
          codes: shows.codes,
          released: released !== undefined,
          releasedScore: released?.score ?? null,
          releasedVersion: released?.version ?? null,
          changedSinceRelease,
          gradeSent: sends.get(submission.studentId) ?? null,
        };
      });
      return rows.sort((a, b) => (a.studentId < b.studentId ? -1 : a.studentId > b.studentId ? 1 : 0));
    },
  }),
  defineRoute({
    method: 'POST',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/release',
    access: 'section',
    summary:
      "Release the section's latest results to students: those not yet released and those changed since their release (a regrade, an override, a new version). Nothing is released without this TA action; held late work waits until a TA accepts it (counted in `held`); a release queues the section's grade passback",
    schema: { params, response: { 200: Released } },
    transactional: true,
    async handler(request) {
      const { db, server, scope, caller } = request;
      const latest = await latestSubmissionHeads(db, scope.assignment.id, scope.section.id);
      // Held late work waits for a TA to accept it; its student keeps what was released before.
      const held = latest.filter((s) => s.held).length;
      const due = await releasesDue(db, latest.filter((s) => !s.held).map((s) => s.submissionId));
      await insertReleases(db, due, staffIdOf(caller));
      await queuePassback(server.jobs, db, { assignmentId: scope.assignment.id, sectionId: scope.section.id, feedbackUrl: feedbackUrl(request) }, due.map((r) => r.submissionId));
      return { released: due.length, held };
    },
  }),
  defineRoute({
    method: 'POST',
    url: '/v1/submissions/:submissionId/release',
    access: 'section',
    summary:
      "Release one student's latest result (this version's, overrides applied) to the student, when it is not yet released or changed since; only the student's latest version can be released (409 otherwise), and held late work only once accepted",
    schema: { params: z.object({ submissionId: IdParam }), response: { 200: Released } },
    transactional: true,
    async handler(request) {
      const { db, server, scope, caller } = request;
      const { submissionId, assignmentId, sectionId } = scope.submission;
      // A student sees their latest release: releasing an older version would take back a newer one.
      const versions = await versionAndLatest(db, submissionId);
      if (versions && versions.version < versions.latestVersion) {
        throw new ApiError('conflict', `only the student's latest version can be released: this is version ${versions.version}, the latest ${versions.latestVersion}`, [
          { path: 'params.submissionId', message: `version ${versions.version} of ${versions.latestVersion}` },
        ]);
      }
      if (scope.submission.held) return { released: 0, held: 1 };
      const due = await releasesDue(db, [submissionId]);
      await insertReleases(db, due, staffIdOf(caller));
      await queuePassback(server.jobs, db, { assignmentId, sectionId, feedbackUrl: feedbackUrl(request) }, due.map((r) => r.submissionId));
      return { released: due.length, held: 0 };
    },
  }),
  defineRoute({
    method: 'POST',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/passback',
    access: 'section',
    summary:
      "Send again the section's grades whose passback to the learning platform failed (refused, or given up after the platform stayed down): they wait and are sent by a job, as after a release. Answers how many wait",
    schema: { params, response: { 200: SendsRetried } },
    transactional: true,
    async handler(request) {
      const { db, server, scope } = request;
      return { waiting: await sendFailedAgain(server.jobs, db, { assignmentId: scope.assignment.id, sectionId: scope.section.id, feedbackUrl: feedbackUrl(request) }) };
    },
  }),
];
