import { z } from 'zod';
import { isStorableText, StudentId, UNSTORABLE_TEXT } from '../../schemas/common.ts';
import { ApiError } from '../errors.ts';
import { assignmentOf } from '../grading/assignment-of.ts';
import { effectiveResult } from '../grading/effective-result.ts';
import { overrideLimit } from '../checks/rubric-books.ts';
import { submissionRelease } from '../grading/report-inputs.ts';
import { gradeBatch, screenBatch, storeBatch, type GradedBatch } from '../grading/submit-batch.ts';
import { getAssignment } from '../store/assignments.ts';
import { insertSignalChoice, signalChoicesOf } from '../store/signal-choices.ts';
import { getSubmission, insertOverride, latestResults, overridesOf, studentSubmissions } from '../store/submissions.ts';
import { signalCodes } from '../../schemas/result.ts';
import { jsonElementLines } from './json-element-lines.ts';
import { filesFromMultipart, isCsvUpload, submissionsFromCsv } from './multipart-csv.ts';
import { staffIdOf } from './access.ts';
import type { RouteSpec } from './route-spec.ts';
import { IdParam } from './schemas.ts';
import { BatchChecked, BatchStored, SubmissionVersion, SubmissionView } from '../../schemas/api/submissions.ts';

async function submissionView(db: Parameters<RouteSpec['handler']>[0]['db'], submissionId: number) {
  const s = (await getSubmission(db, submissionId))!;
  const [row] = await latestResults(db, [submissionId]);
  const overrides = await overridesOf(db, [submissionId]);
  const choices = await signalChoicesOf(db, [submissionId]);
  const { courseId: _, ...rest } = s;
  return {
    ...rest,
    result: row ? effectiveResult(row, overrides, choices) : null,
    overrides,
    signalChoices: choices.map(({ code, path, onSheet, by, at }) => ({ code, path, onSheet, by, at })),
    release: (await submissionRelease(db, submissionId)) ?? null,
  };
}

export const submissionRoutes: RouteSpec[] = [
  {
    method: 'POST',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/submissions',
    access: 'section',
    summary:
      'Submit a batch (a JSON array, or multipart CSV files `readings` and `reported`): every valid submission is stored as a new version and graded; each invalid one is listed and stored nowhere',
    schema: {
      params: z.object({ sectionId: IdParam, assignmentId: IdParam }),
      // Empty for a multipart upload, which the handler reads itself.
      body: z.array(z.unknown()).min(1, 'at least one submission').max(5000).nullish(),
      // A dry run checks the batch and lists what would be refused, storing nothing.
      querystring: z.object({ dryRun: z.enum(['true', 'false']).default('false') }),
      response: {
        201: BatchStored,
        200: BatchChecked,
      },
    },
    readBody: async (request) => (request.isMultipart() ? filesFromMultipart(request) : request.body),
    idempotent: true,
    transactional: true,
    async prepare({ db, grader, params, body, request }) {
      const assignment = (await getAssignment(db, Number(params.assignmentId)))!;
      // Stored settings that no longer validate are the server's problem, named before any checking.
      const { kind } = assignmentOf(assignment.settings, 'settings');
      const csv = isCsvUpload(body) ? await submissionsFromCsv(kind, body) : undefined;
      const submissions = csv ? csv.submissions : body;
      if (!Array.isArray(submissions)) throw new ApiError('invalid-input', undefined, [{ path: 'body', message: 'a JSON array of submissions, or multipart CSV files' }]);
      // Counted from 1, as a person reads a file, with the line where the submission starts.
      const lines = csv ? csv.lines.map((line) => `${csv.file} line ${line}`) : (jsonElementLines.get(request) ?? []).map((line) => `line ${line}`);
      return gradeBatch(grader, assignment, submissions.map((submission, i) => ({ at: `submission ${i + 1}${lines[i] ? `, ${lines[i]}` : ''}`, submission })));
    },
    async handler({ db, scope, caller, prepared, query }) {
      if (query.dryRun === 'true') {
        const { toStore, rejected } = await screenBatch(db, prepared as GradedBatch, scope.sectionId!);
        return { status: 200, body: { dryRun: true, valid: toStore.length, rejected } };
      }
      const outcome = await storeBatch(db, prepared as GradedBatch, { sectionId: scope.sectionId!, staffId: staffIdOf(caller) });
      if (outcome.stored.length === 0) {
        throw new ApiError('nothing-stored', undefined, outcome.rejected.map((r) => ({ path: `${r.at}: ${r.path}`, message: r.message })));
      }
      return { status: 201, body: outcome };
    },
  },
  {
    method: 'GET',
    url: '/v1/submissions/:submissionId',
    access: 'section',
    summary: 'A submission version with its latest result (overrides applied) and the override trail',
    schema: { params: z.object({ submissionId: IdParam }), response: { 200: SubmissionView } },
    async handler({ db, params }) {
      return { status: 200, body: await submissionView(db, Number(params.submissionId)) };
    },
  },
  {
    method: 'POST',
    url: '/v1/submissions/:submissionId/overrides',
    access: 'section',
    summary: "Override a finding's points with a written reason; kept as an audit trail and carried over to regrades",
    schema: {
      params: z.object({ submissionId: IdParam }),
      body: z.object({ findingId: z.string().min(1).max(300).refine(isStorableText, UNSTORABLE_TEXT), pointsLost: z.number().min(0).max(1000), reason: z.string().trim().min(3, 'say why, in a few words').max(2000).refine(isStorableText, UNSTORABLE_TEXT), showReason: z.boolean().default(false) }),
      response: { 201: SubmissionView },
    },
    transactional: true,
    async handler({ db, params, body, caller }) {
      const submissionId = Number(params.submissionId);
      const { findingId, pointsLost, reason, showReason } = body as { findingId: string; pointsLost: number; reason: string; showReason: boolean };
      const [row] = await latestResults(db, [submissionId]);
      const result = row && effectiveResult(row, await overridesOf(db, [submissionId]));
      const current = result?.findings.find((f) => f.id === findingId);
      if (!current) throw new ApiError('invalid-input', undefined, [{ path: 'body.findingId', message: 'no such finding in the latest result' }]);
      // Within what the finding's rubric item has left, so that the rows of every sheet add up to the score.
      const limit = overrideLimit(result.items, result.maxScore, result.findings, findingId)!;
      if (pointsLost > limit) {
        const item = current.itemKey ?? current.rubricItem ?? 'of this finding';
        throw new ApiError('beyond-rubric-item', undefined, [{ path: 'body.pointsLost', message: `points must be between 0 and ${limit}, what rubric item ${item} has left` }]);
      }
      await insertOverride(db, { submissionId, findingId, pointsBefore: current.pointsLost, pointsAfter: pointsLost, reason, reasonShown: showReason, staffId: staffIdOf(caller) });
      return { status: 201, body: await submissionView(db, submissionId) };
    },
  },
  {
    method: 'POST',
    url: '/v1/submissions/:submissionId/signals',
    access: 'section',
    summary: "Put a signal for review on the student's feedback sheet, or take it off; every choice is kept with who made it",
    schema: {
      params: z.object({ submissionId: IdParam }),
      body: z.object({ code: z.enum(signalCodes), path: z.string().min(1).max(300).refine(isStorableText, UNSTORABLE_TEXT), onSheet: z.boolean() }),
      response: { 201: SubmissionView },
    },
    transactional: true,
    async handler({ db, params, body, caller }) {
      const submissionId = Number(params.submissionId);
      const { code, path, onSheet } = body as { code: string; path: string; onSheet: boolean };
      const [row] = await latestResults(db, [submissionId]);
      const signals = row ? effectiveResult(row, []).signals : [];
      if (!signals.some((s) => s.code === code && s.path === path)) {
        throw new ApiError('invalid-input', undefined, [{ path: 'body.path', message: `the latest result raises no signal ${code} at ${path}` }]);
      }
      await insertSignalChoice(db, { submissionId, code, path, onSheet, staffId: staffIdOf(caller) });
      return { status: 201, body: await submissionView(db, submissionId) };
    },
  },
  {
    method: 'GET',
    url: '/v1/sections/:sectionId/students/:studentId/history',
    access: 'section',
    summary: "A student's submissions (every version) with each one's latest result",
    schema: {
      params: z.object({ sectionId: IdParam, studentId: StudentId }),
      querystring: z.object({ assignmentId: IdParam.optional() }),
      response: { 200: z.array(SubmissionVersion) },
    },
    async handler({ db, scope, params, query }) {
      const rows = await studentSubmissions(db, scope.sectionId!, params.studentId, query.assignmentId as number | undefined);
      if (rows.length === 0) throw new ApiError('not-found', 'no submissions for this student in this section');
      const ids = rows.map((r) => r.submissionId);
      const results = new Map((await latestResults(db, ids)).map((r) => [r.submissionId, r]));
      const overrides = await overridesOf(db, ids);
      return {
        status: 200,
        body: rows.map((r) => {
          const result = results.get(r.submissionId);
          return { submissionId: r.submissionId, assignmentId: r.assignmentId, version: r.version, submittedAt: r.submittedAt, result: result ? effectiveResult(result, overrides) : null };
        }),
      };
    },
  },
];
