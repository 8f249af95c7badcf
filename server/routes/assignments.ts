import { z } from 'zod';
import { ApiError } from '../errors.ts';
import { newSettings, patchedSettings, replacedSettings } from '../grading/settings-update.ts';
import { stagesOf } from '../../kinds/registry.ts';
import { defineRoute } from '../http/route-table.ts';
import { IdParam, Name } from '../http/schemas.ts';
import { createAssignment, replaceSettings } from '../store/assignments.ts';
import { getSection } from '../store/courses.ts';
import { Assignment, LatestRegradeView, RegradeProgressView } from '../../schemas/api/assignments.ts';

/** A stored assignment with what its kind says about how findings are grouped. */
const withStages = <T extends { kind: string }>(assignment: T) => ({ ...assignment, stages: [...stagesOf(assignment.kind)] });
const Settings = z.record(z.string(), z.unknown());

const OfAssignment = z.object({ assignmentId: IdParam });

export const assignmentRoutes = [
  defineRoute({
    method: 'POST',
    url: '/v1/courses/:courseId/assignments',
    access: 'instructor',
    summary: 'Create an assignment: a kind and its settings, validated for that kind',
    schema: { params: z.object({ courseId: IdParam }), body: z.object({ title: Name, settings: Settings }), response: { 201: Assignment } },
    transactional: true,
    async handler({ db, scope, body }, reply) {
      const checker = newSettings(body.settings);
      return reply.code(201).send(withStages(await createAssignment(db, scope.course.id, body.title, checker.kind.kind, checker.settings)));
    },
  }),
  defineRoute({
    method: 'GET',
    url: '/v1/assignments/:assignmentId',
    access: 'course',
    summary: 'An assignment with its settings',
    schema: { params: OfAssignment, response: { 200: Assignment } },
    async handler({ scope }) {
      return withStages(scope.assignment);
    },
  }),
  defineRoute({
    method: 'PUT',
    url: '/v1/assignments/:assignmentId/settings',
    access: 'instructor',
    summary:
      'Replace the settings whole: every setting the assignment has must be stated (null clears an optional one; one left out is a 422 naming it). Stored results keep the settings they used; regrade to apply',
    schema: { params: OfAssignment, body: z.object({ settings: Settings }), response: { 200: Assignment } },
    transactional: true,
    async handler({ db, scope, body }) {
      const checker = replacedSettings(scope.assignment, body.settings);
      return withStages(await replaceSettings(db, scope.assignment.id, checker.settings));
    },
  }),
  defineRoute({
    method: 'PATCH',
    url: '/v1/assignments/:assignmentId/settings',
    access: 'instructor',
    summary:
      'Change some settings: a JSON Merge Patch (RFC 7396) of the current ones (objects such as tolerances, rubric, units and reference merge key by key, null removes a key, anything else replaces), validated whole after merging. Regrade to apply',
    schema: { params: OfAssignment, body: z.object({ settings: Settings }), response: { 200: Assignment } },
    transactional: true,
    async handler({ db, scope, body }) {
      const checker = patchedSettings(scope.assignment, body.settings);
      return withStages(await replaceSettings(db, scope.assignment.id, checker.settings));
    },
  }),
  defineRoute({
    method: 'POST',
    url: '/v1/assignments/:assignmentId/regrade',
    access: 'instructor',
    summary:
      "Start regrading the latest submissions under the current settings (one section or all), as background jobs any service process may work, part by part; earlier results and what was released stay. Follow it at the regrade's URL, on any process",
    schema: {
      params: OfAssignment,
      body: z.object({ sectionId: z.number().int().positive().optional() }).optional(),
      response: { 202: RegradeProgressView },
    },
    // The regrade and its jobs are stored with the request, or not at all.
    transactional: true,
    async handler({ db, server, body, scope }, reply) {
      const sectionId = body?.sectionId;
      if (sectionId !== undefined && (await getSection(db, sectionId))?.courseId !== scope.assignment.courseId) {
        throw new ApiError('invalid-input', undefined, [{ path: 'body.sectionId', message: 'no such section in this course' }]);
      }
      const progress = await server.regrades.start(db, scope.assignment, sectionId);
      return reply.code(202).header('location', `/v1/assignments/${scope.assignment.id}/regrades/${progress.regradeId}`).send(progress);
    },
  }),
  defineRoute({
    method: 'GET',
    url: '/v1/assignments/:assignmentId/regrades/latest',
    access: 'instructor',
    summary: "The assignment's regrade started last (of one section or all) and how far it is, or null when there has been none: a page opened later follows it",
    schema: { params: OfAssignment, response: { 200: LatestRegradeView } },
    async handler({ db, server, scope }) {
      return { regrade: (await server.regrades.latest(db, scope.assignment.id)) ?? null };
    },
  }),
  defineRoute({
    method: 'GET',
    url: '/v1/assignments/:assignmentId/regrades/:regradeId',
    access: 'instructor',
    summary: 'How far a regrade is: submissions done of the total, running, finished or failed',
    schema: { params: z.object({ assignmentId: IdParam, regradeId: z.string().uuid() }), response: { 200: RegradeProgressView } },
    async handler({ db, server, params, scope }) {
      const progress = await server.regrades.get(db, params.regradeId);
      if (!progress || progress.assignmentId !== scope.assignment.id) throw new ApiError('not-found', 'no such regrade of this assignment');
      return progress;
    },
  }),
];
