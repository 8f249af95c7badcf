import { z } from 'zod';
import { getAssignment } from '../store/assignments.ts';
import { latestSubmissions } from '../store/submissions.ts';
import type { RouteSpec } from './route-spec.ts';
import { IdParam } from './schemas.ts';
import { SectionSignals } from '../../schemas/api/signals.ts';

export const signalRoutes: RouteSpec[] = [
  {
    method: 'GET',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/signals',
    access: 'section',
    summary:
      "What the section's data say beyond the arithmetic: submissions whose readings look alike (the same, offset, rescaled, reordered or a few cells edited) or whose reported k are written alike, and runs smoother than the instrument reads. Prompts for a TA's review, never findings",
    schema: { params: z.object({ sectionId: IdParam, assignmentId: IdParam }), response: { 200: SectionSignals } },
    async handler({ db, grader, scope, params }) {
      const assignment = (await getAssignment(db, Number(params.assignmentId)))!;
      const rows = await latestSubmissions(db, assignment.id, scope.sectionId!);
      return { status: 200, body: await grader.sectionSignals(assignment.settings as { kind: string }, rows.map((row) => row.payload)) };
    },
  },
];
