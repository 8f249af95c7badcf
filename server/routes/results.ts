import { z } from 'zod';
import { severityCounts } from '../../reports/result-summary.ts';
import { latestWithResults } from '../grading/report-inputs.ts';
import { releaseResults } from '../store/submissions.ts';
import { staffIdOf } from './access.ts';
import type { RouteSpec } from './route-spec.ts';
import { IdParam } from './schemas.ts';

const Row = z.object({
  studentId: z.string(),
  submissionId: z.number(),
  version: z.number(),
  status: z.string().nullable(),
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
    summary: "A section's results: one row per student (latest version), with counts by severity and the codes found",
    schema: { params, response: { 200: z.array(Row) } },
    async handler({ db, scope, params: p }) {
      const rows = await latestWithResults(db, scope.sectionId!, Number(p.assignmentId));
      return {
        status: 200,
        body: rows.map(({ submission, result }) => {
          return {
            studentId: submission.studentId,
            submissionId: submission.submissionId,
            version: submission.version,
            status: result?.status ?? null,
            score: result?.score ?? null,
            maxScore: result?.maxScore ?? null,
            ...severityCounts(result?.findings ?? []),
            codes: [...new Set(result?.findings.map((f) => f.code) ?? [])],
            released: result?.releasedAt != null,
          };
        }),
      };
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
];
