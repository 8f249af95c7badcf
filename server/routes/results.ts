import { z } from 'zod';
import { severityCounts } from '../../reports/result-summary.ts';
import { latestWithResults } from '../grading/report-inputs.ts';
import { studentsWithoutSubmission } from '../store/students.ts';
import { latestResults, releaseResults } from '../store/submissions.ts';
import { staffIdOf } from './access.ts';
import type { RouteSpec } from './route-spec.ts';
import { Enrolment, IdParam } from './schemas.ts';

const Row = z.object({
  studentId: z.string(),
  /** Null for a roster student who has not submitted. */
  submissionId: z.number().nullable(),
  version: z.number().nullable(),
  /** `checked`, `rejected`, `not-submitted`, or `withdrawn` (score kept when they submitted); null while a result is missing. */
  status: z.string().nullable(),
  /** On the roster: `enrolled` or `withdrawn` (removed students are left out). */
  enrolment: Enrolment,
  score: z.number().nullable(),
  maxScore: z.number().nullable(),
  errors: z.number(),
  warnings: z.number(),
  infos: z.number(),
  codes: z.array(z.string()),
  released: z.boolean(),
});

const params = z.object({ sectionId: IdParam, assignmentId: IdParam });

export const resultRoutes: RouteSpec[] = [
  {
    method: 'GET',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/results',
    access: 'section',
    summary: "A section's results: one row per roster student (latest version, or not submitted), with counts by severity and the codes found",
    schema: { params, response: { 200: z.array(Row) } },
    async handler({ db, scope, params: p }) {
      const [sectionId, assignmentId] = [scope.sectionId!, Number(p.assignmentId)];
      const rows = await latestWithResults(db, sectionId, assignmentId);
      const missing = (await studentsWithoutSubmission(db, sectionId, assignmentId)).map(({ studentId, status }) => ({
        studentId,
        submissionId: null,
        version: null,
        status: status === 'withdrawn' ? 'withdrawn' : 'not-submitted',
        enrolment: status,
        score: null,
        maxScore: null,
        errors: 0,
        warnings: 0,
        infos: 0,
        codes: [],
        released: false,
      }));
      const submitted = rows.map(({ submission, result }) => ({
        studentId: submission.studentId,
        submissionId: submission.submissionId,
        version: submission.version,
        status: submission.enrolment === 'withdrawn' ? 'withdrawn' : (result?.status ?? null),
        enrolment: submission.enrolment,
        score: result?.score ?? null,
        maxScore: result?.maxScore ?? null,
        ...severityCounts(result?.findings ?? []),
        codes: [...new Set(result?.findings.map((f) => f.code) ?? [])],
        released: result?.releasedAt != null,
      }));
      // One list in student-id order, submitted or not.
      const body = [...submitted, ...missing].sort((a, b) => (a.studentId < b.studentId ? -1 : a.studentId > b.studentId ? 1 : 0));
      return { status: 200, body };
    },
  },
  {
    method: 'POST',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/release',
    access: 'section',
    summary: "Release the section's latest results to students: nothing is released without this TA action",
    schema: { params, response: { 200: z.object({ released: z.number() }) } },
    transactional: true,
    async handler({ db, scope, params: p, caller }) {
      const rows = await latestWithResults(db, scope.sectionId!, Number(p.assignmentId));
      const ids = rows.flatMap((r) => (r.result ? [r.result.resultId] : []));
      return { status: 200, body: { released: await releaseResults(db, ids, staffIdOf(caller)) } };
    },
  },
  {
    method: 'POST',
    url: '/v1/submissions/:submissionId/release',
    access: 'section',
    summary: "Release one student's latest result (this version's) to the student",
    schema: { params: z.object({ submissionId: IdParam }), response: { 200: z.object({ released: z.number() }) } },
    transactional: true,
    async handler({ db, params, caller }) {
      const [row] = await latestResults(db, [Number(params.submissionId)]);
      return { status: 200, body: { released: row ? await releaseResults(db, [row.resultId], staffIdOf(caller)) : 0 } };
    },
  },
];
