import { z } from 'zod';
import { ApiError } from '../errors.ts';
import { cardCounts } from '../../reports/feedback/finding-groups.ts';
import { releasesDue, sectionStandings } from '../grading/report-inputs.ts';
import { queuePassback } from '../grading/service-jobs.ts';
import { staffIdOf } from '../http/access.ts';
import { defineRoute } from '../http/route-table.ts';
import { IdParam } from '../http/schemas.ts';
import { insertReleases } from '../store/releases.ts';
import { latestSubmissionHeads, versionAndLatest } from '../store/submissions.ts';
import { Released, ResultRow } from '../../schemas/api/results.ts';

const params = z.object({ sectionId: IdParam, assignmentId: IdParam });

/** A roster student without a submission: nothing to count. */
const NOT_SUBMITTED = { submissionId: null, version: null, submittedAt: null, source: null, late: false, held: false, feedbackFirstReadAt: null, score: null, maxScore: null, errors: 0, warnings: 0, infos: 0, codes: [], released: false, releasedScore: null, releasedVersion: null, changedSinceRelease: false };

/**
 * Counted the way the feedback sheet groups findings: one per likely cause, so a slip repeated in four
 * values (charged once) counts once, and values that merely follow from the student's own numbers are notes.
 */
function causeCounts(findings: Parameters<typeof cardCounts>[0]) {
  const counts = cardCounts(findings);
  return { errors: counts.costPoints, warnings: counts.warnings, infos: counts.notes };
}

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
      const rows = (await sectionStandings(db, sectionId, assignmentId)).map((row) => {
        if (!row.submission) {
          return { ...NOT_SUBMITTED, studentId: row.studentId, status: row.enrolment === 'withdrawn' ? 'withdrawn' : 'not-submitted', enrolment: row.enrolment };
        }
        const { submission, result, released, releasedVersion, changedSinceRelease, feedbackFirstReadAt } = row;
        return {
          studentId: submission.studentId,
          submissionId: submission.submissionId,
          version: submission.version,
          submittedAt: submission.submittedAt,
          source: submission.source,
          late: submission.late,
          held: submission.held,
          feedbackFirstReadAt,
          status: submission.enrolment === 'withdrawn' ? 'withdrawn' : result.status,
          enrolment: submission.enrolment,
          score: result.score,
          maxScore: result.maxScore,
          ...causeCounts(result.findings),
          codes: [...new Set(result.findings.map((f) => f.code))],
          released: released !== undefined,
          releasedScore: released?.score ?? null,
          releasedVersion: releasedVersion ?? null,
          changedSinceRelease,
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
    async handler({ db, server, scope, caller }) {
      const latest = await latestSubmissionHeads(db, scope.assignment.id, scope.section.id);
      // Held late work waits for a TA to accept it; its student keeps what was released before.
      const held = latest.filter((s) => s.held).length;
      const due = await releasesDue(db, latest.filter((s) => !s.held).map((s) => s.submissionId));
      await insertReleases(db, due, staffIdOf(caller));
      if (due.length > 0) await queuePassback(server.jobs, db, { assignmentId: scope.assignment.id, sectionId: scope.section.id });
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
    async handler({ db, scope, caller }) {
      const { submissionId } = scope.submission;
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
      return { released: due.length, held: 0 };
    },
  }),
];
