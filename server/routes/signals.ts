import { z } from 'zod';
import { findSharedReadings, type SubmittedReadings } from '../signals/shared-readings.ts';
import { getAssignment } from '../store/assignments.ts';
import { latestSubmissions } from '../store/submissions.ts';
import type { RouteSpec } from './route-spec.ts';
import { IdParam } from './schemas.ts';

const RunMatch = z.object({ runs: z.tuple([z.number(), z.number()]), relation: z.enum(['identical', 'offset', 'scaled', 'edited']), matchingCells: z.number(), cells: z.number() });
const SharedReadings = z.object({
  /** Why nothing was compared, when nothing was: the class was handed one dataset, or the kind has no runs. */
  notCompared: z.string().optional(),
  pairs: z.array(z.object({ students: z.tuple([z.string(), z.string()]), runs: z.array(RunMatch), sameReportedK: z.array(z.tuple([z.number(), z.number()])) })),
  groups: z.array(z.array(z.string())),
});

type Payload = { studentId: string; runs: Array<{ label: string; readings: Array<[number, number]>; reported?: { k?: { value: string | number } } }> };

export const signalRoutes: RouteSpec[] = [
  {
    method: 'GET',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/shared-readings',
    access: 'section',
    summary:
      "Submissions of the section whose readings look alike (the same, offset, rescaled, reordered or a few cells edited) or whose reported k are written alike: prompts for a TA's review, never findings",
    schema: { params: z.object({ sectionId: IdParam, assignmentId: IdParam }), response: { 200: SharedReadings } },
    async handler({ db, scope, params }) {
      const assignment = (await getAssignment(db, Number(params.assignmentId)))!;
      const settings = assignment.settings as { kind: string; classDataset?: unknown };
      if (settings.kind !== 'first-order-catalysis') return { status: 200, body: { notCompared: `the kind ${settings.kind} has no runs of readings to compare`, pairs: [], groups: [] } };
      if (settings.classDataset) return { status: 200, body: { notCompared: 'the class was handed one dataset, so shared readings are expected', pairs: [], groups: [] } };
      const rows = await latestSubmissions(db, assignment.id, scope.sectionId!);
      const submissions: SubmittedReadings[] = rows.map((row) => {
        const payload = row.payload as Payload;
        return { studentId: row.studentId, runs: payload.runs, reportedK: payload.runs.map((r) => r.reported?.k?.value) };
      });
      return { status: 200, body: findSharedReadings(submissions) };
    },
  },
];
