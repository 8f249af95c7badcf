import { z } from 'zod';
import { ApiError } from '../errors.ts';
import { newSettings, patchedSettings, replacedSettings } from '../grading/settings-update.ts';
import { stagesOf } from '../../kinds/registry.ts';
import { createAssignment, getAssignment, replaceSettings } from '../store/assignments.ts';
import { getSection } from '../store/courses.ts';
import type { RouteSpec } from './route-spec.ts';
import { IdParam, Name } from './schemas.ts';
import { Assignment, RegradeProgressView } from '../../schemas/api/assignments.ts';

/** A stored assignment with what its kind says about how findings are grouped. */
const withStages = <T extends { kind: string }>(assignment: T) => ({ ...assignment, stages: stagesOf(assignment.kind) });
const Settings = z.record(z.string(), z.unknown());
export const assignmentRoutes: RouteSpec[] = [
  {
    method: 'POST',
    url: '/v1/courses/:courseId/assignments',
    access: 'instructor',
    summary: 'Create an assignment: a kind and its settings, validated for that kind',
    schema: { params: z.object({ courseId: IdParam }), body: z.object({ title: Name, settings: Settings }), response: { 201: Assignment } },
    transactional: true,
    async handler({ db, scope, body }) {
      const { title, settings } = body as { title: string; settings: unknown };
      const checker = newSettings(settings);
      return { status: 201, body: withStages(await createAssignment(db, scope.courseId!, title, checker.kind.kind, checker.settings)) };
    },
  },
  {
    method: 'GET',
    url: '/v1/assignments/:assignmentId',
    access: 'course',
    summary: 'An assignment with its settings',
    schema: { params: z.object({ assignmentId: IdParam }), response: { 200: Assignment } },
    async handler({ db, params }) {
      return { status: 200, body: withStages((await getAssignment(db, Number(params.assignmentId)))!) };
    },
  },
  {
    method: 'PUT',
    url: '/v1/assignments/:assignmentId/settings',
    access: 'instructor',
    summary:
      'Replace the settings whole: every setting the assignment has must be stated (null clears an optional one; one left out is a 422 naming it). Stored results keep the settings they used; regrade to apply',
    schema: { params: z.object({ assignmentId: IdParam }), body: z.object({ settings: Settings }), response: { 200: Assignment } },
    transactional: true,
    async handler({ db, params, body }) {
      const id = Number(params.assignmentId);
      const checker = replacedSettings((await getAssignment(db, id))!, (body as { settings: Record<string, unknown> }).settings);
      return { status: 200, body: withStages(await replaceSettings(db, id, checker.settings)) };
    },
  },
  {
    method: 'PATCH',
    url: '/v1/assignments/:assignmentId/settings',
    access: 'instructor',
    summary:
      'Change some settings: a JSON Merge Patch (RFC 7396) of the current ones (objects such as tolerances, rubric, units and reference merge key by key, null removes a key, anything else replaces), validated whole after merging. Regrade to apply',
    schema: { params: z.object({ assignmentId: IdParam }), body: z.object({ settings: Settings }), response: { 200: Assignment } },
    transactional: true,
    async handler({ db, params, body }) {
      const id = Number(params.assignmentId);
      const checker = patchedSettings((await getAssignment(db, id))!, (body as { settings: Record<string, unknown> }).settings);
      return { status: 200, body: withStages(await replaceSettings(db, id, checker.settings)) };
    },
  },
  {
    method: 'POST',
    url: '/v1/assignments/:assignmentId/regrade',
    access: 'instructor',
    summary: "Start regrading the latest submissions under the current settings (one section or all), in the background; earlier results stay. Follow it at the regrade's URL",
    schema: {
      params: z.object({ assignmentId: IdParam }),
      body: z.object({ sectionId: z.number().int().positive().optional() }).optional(),
      response: { 202: RegradeProgressView },
    },
    async handler({ db, regrades, params, body, scope }) {
      const sectionId = (body as { sectionId?: number } | undefined)?.sectionId;
      if (sectionId !== undefined && (await getSection(db, sectionId))?.courseId !== scope.courseId) {
        throw new ApiError('invalid-input', undefined, [{ path: 'body.sectionId', message: 'no such section in this course' }]);
      }
      const assignment = (await getAssignment(db, Number(params.assignmentId)))!;
      const progress = await regrades.start(db, assignment, sectionId);
      return { status: 202, body: progress, headers: { location: `/v1/assignments/${assignment.id}/regrades/${progress.regradeId}` } };
    },
  },
  {
    method: 'GET',
    url: '/v1/assignments/:assignmentId/regrades/:regradeId',
    access: 'instructor',
    summary: 'How far a regrade is: submissions done of the total, running, finished or failed',
    schema: { params: z.object({ assignmentId: IdParam, regradeId: z.string().uuid() }), response: { 200: RegradeProgressView } },
    async handler({ regrades, params }) {
      const progress = regrades.get(params.regradeId);
      if (!progress || progress.assignmentId !== Number(params.assignmentId)) throw new ApiError('not-found', 'no such regrade (a regrade is kept until the service restarts)');
      return { status: 200, body: progress };
    },
  },
];
