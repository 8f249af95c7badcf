import type { Kysely } from 'kysely';
import { z } from 'zod';
import { isStorableText, StudentId, UNSTORABLE_TEXT } from '../../schemas/common.ts';
import { Code } from '../../schemas/result.ts';
import { OFF_THE_SCORE, overrideLimit } from '../checks/rubric-books.ts';
import { ApiError } from '../errors.ts';
import { assignmentOf } from '../grading/assignment-of.ts';
import { signalCodesOf } from '../../kinds/registry.ts';
import { effectiveResult } from '../grading/effective-result.ts';
import { submissionStanding } from '../grading/report-inputs.ts';
import { gradeBatch, screenBatch, storeBatch } from '../grading/submit-batch.ts';
import { staffIdOf } from '../http/access.ts';
import { submissionsFromCsv } from '../http/multipart-csv.ts';
import { defineRoute } from '../http/route-table.ts';
import { IdParam } from '../http/schemas.ts';
import type { Database } from '../store/database.ts';
import { insertSignalChoice } from '../store/signal-choices.ts';
import { insertOverride, latestResults, overridesOf, studentSubmissions, type SubmissionRow } from '../store/submissions.ts';
import { BatchChecked, BatchStored, ResultView, SubmissionVersion, SubmissionView } from '../../schemas/api/submissions.ts';

/** A submission as a TA reviews it, from its row as the request read it; its results, overrides, choices and release each read once. */
async function submissionView(db: Kysely<Database>, submission: SubmissionRow) {
  const { current, overrides, choices, release } = await submissionStanding(db, submission.submissionId);
  const { courseId: _, ...rest } = submission;
  return {
    ...rest,
    result: current ?? null,
    overrides,
    signalChoices: choices.map(({ code, path, onSheet, by, at }) => ({ code, path, onSheet, by, at })),
    release: release ?? null,
  };
}

const OfSubmission = z.object({ submissionId: IdParam });

export const submissionRoutes = [
  defineRoute({
    method: 'POST',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/submissions',
    access: 'section',
    summary:
      'Submit a batch (a JSON array, or multipart CSV files `readings` and `reported`): every valid submission is stored as a new version and graded; each invalid one is listed and stored nowhere',
    schema: {
      params: z.object({ sectionId: IdParam, assignmentId: IdParam }),
      // Empty for a multipart upload, which is read into request.upload.
      body: z.array(z.unknown()).min(1, 'at least one submission').max(5000).nullish(),
      // A dry run checks the batch and lists what would be refused, storing nothing.
      querystring: z.object({ dryRun: z.enum(['true', 'false']).default('false') }),
      response: {
        201: BatchStored,
        200: BatchChecked,
      },
    },
    upload: true,
    idempotent: true,
    transactional: true,
    async prepare({ scope, server, body, upload, jsonElementLines }) {
      // Stored settings that no longer validate are the server's problem, named before any checking.
      const { kind } = assignmentOf(scope.assignment.settings, 'settings');
      const csv = upload ? await submissionsFromCsv(kind, upload) : undefined;
      const submissions = csv ? csv.submissions : body;
      if (!submissions) throw new ApiError('invalid-input', undefined, [{ path: 'body', message: 'a JSON array of submissions, or multipart CSV files' }]);
      // Counted from 1, as a person reads a file, with the line where the submission starts.
      const lines = csv ? csv.lines.map((line) => `${csv.file} line ${line}`) : (jsonElementLines ?? []).map((line) => `line ${line}`);
      return gradeBatch(server.grader, scope.assignment, submissions.map((submission, i) => ({ at: `submission ${i + 1}${lines[i] ? `, ${lines[i]}` : ''}`, submission })));
    },
    async handler({ db, scope, caller, prepared, query }, reply) {
      if (query.dryRun === 'true') {
        const { toStore, rejected } = await screenBatch(db, prepared, scope.section.id);
        return reply.send({ dryRun: true, valid: toStore.length, rejected });
      }
      const outcome = await storeBatch(db, prepared, { sectionId: scope.section.id, staffId: staffIdOf(caller) });
      if (outcome.stored.length === 0) {
        throw new ApiError('nothing-stored', undefined, outcome.rejected.map((r) => ({ path: `${r.at}: ${r.path}`, message: r.message })));
      }
      return reply.code(201).send(outcome);
    },
  }),
  defineRoute({
    method: 'GET',
    url: '/v1/submissions/:submissionId',
    access: 'section',
    summary: 'A submission version with its latest result (overrides applied) and the override trail',
    schema: { params: OfSubmission, response: { 200: SubmissionView } },
    async handler({ db, scope }) {
      return submissionView(db, scope.submission);
    },
  }),
  defineRoute({
    method: 'POST',
    url: '/v1/submissions/:submissionId/overrides',
    access: 'section',
    summary: "Override a finding's points with a written reason; kept as an audit trail and carried over to regrades",
    schema: {
      params: OfSubmission,
      body: z.object({ findingId: z.string().min(1).max(300).refine(isStorableText, UNSTORABLE_TEXT), pointsLost: z.number().min(0).max(1000), reason: z.string().trim().min(3, 'say why, in a few words').max(2000).refine(isStorableText, UNSTORABLE_TEXT), showReason: z.boolean().default(false) }),
      response: { 201: SubmissionView },
    },
    transactional: true,
    async handler({ db, scope, body, caller }, reply) {
      const { submissionId } = scope.submission;
      const { findingId, pointsLost, reason, showReason } = body;
      const [row] = await latestResults(db, [submissionId]);
      const result = row && effectiveResult(row, await overridesOf(db, [submissionId]));
      const current = result?.findings.find((f) => f.id === findingId);
      // Within what the finding's rubric item has left, so that the rows of every sheet add up to the score.
      const limit = result && overrideLimit(result.items, result.maxScore, result.findings, findingId);
      if (!current || limit === undefined) throw new ApiError('invalid-input', undefined, [{ path: 'body.findingId', message: 'no such finding in the latest result' }]);
      if (pointsLost > limit) {
        const item = current.itemKey ?? current.rubricItem ?? 'of this finding';
        const left = current.rubricItem === OFF_THE_SCORE ? 'what the score has left' : `what rubric item ${item} has left`;
        throw new ApiError('beyond-rubric-item', undefined, [{ path: 'body.pointsLost', message: `points must be between 0 and ${limit}, ${left}` }]);
      }
      await insertOverride(db, { submissionId, findingId, pointsBefore: current.pointsLost, pointsAfter: pointsLost, reason, reasonShown: showReason, staffId: staffIdOf(caller) });
      return reply.code(201).send(await submissionView(db, scope.submission));
    },
  }),
  defineRoute({
    method: 'POST',
    url: '/v1/submissions/:submissionId/signals',
    access: 'section',
    summary: "Put a signal for review on the student's feedback sheet, or take it off; every choice is kept with who made it",
    schema: {
      params: OfSubmission,
      body: z.object({ code: Code.max(60), path: z.string().min(1).max(300).refine(isStorableText, UNSTORABLE_TEXT), onSheet: z.boolean() }),
      response: { 201: SubmissionView },
    },
    transactional: true,
    async handler({ db, scope, body, caller }, reply) {
      const { submissionId } = scope.submission;
      const { code, path, onSheet } = body;
      const [row] = await latestResults(db, [submissionId]);
      // The codes are the kind's own: checked here, against the registry, not by a list in the schema.
      const codes = row ? signalCodesOf((row.settings as { kind: string }).kind) : [];
      if (!codes.includes(code)) {
        throw new ApiError('invalid-input', undefined, [{ path: 'body.code', message: `${code} is not a signal of this assignment's kind${codes.length ? `: one of ${codes.join(', ')}` : ', which raises none'}` }]);
      }
      const signals = row ? effectiveResult(row, []).signals : [];
      if (!signals.some((s) => s.code === code && s.path === path)) {
        throw new ApiError('invalid-input', undefined, [{ path: 'body.path', message: `the latest result raises no signal ${code} at ${path}` }]);
      }
      await insertSignalChoice(db, { submissionId, code, path, onSheet, staffId: staffIdOf(caller) });
      return reply.code(201).send(await submissionView(db, scope.submission));
    },
  }),
  defineRoute({
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
      const rows = await studentSubmissions(db, scope.section.id, params.studentId, query.assignmentId);
      if (rows.length === 0) throw new ApiError('not-found', 'no submissions for this student in this section');
      const ids = rows.map((r) => r.submissionId);
      const results = new Map((await latestResults(db, ids)).map((r) => [r.submissionId, r]));
      const overrides = await overridesOf(db, ids);
      return rows.map((r) => {
        const result = results.get(r.submissionId);
        return { submissionId: r.submissionId, assignmentId: r.assignmentId, version: r.version, submittedAt: r.submittedAt, result: result ? effectiveResult(result, overrides) : null };
      });
    },
  }),
];
