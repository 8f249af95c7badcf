import { z } from 'zod';
import { findSharedReadings, type SubmittedReadings } from '../signals/shared-readings.ts';
import { findSmoothRuns } from '../signals/smooth-readings.ts';
import { getAssignment } from '../store/assignments.ts';
import { latestSubmissions } from '../store/submissions.ts';
import type { RouteSpec } from './route-spec.ts';
import { IdParam } from './schemas.ts';

const RunMatch = z.object({ runs: z.tuple([z.number(), z.number()]), relation: z.enum(['identical', 'offset', 'scaled', 'edited']), matchingCells: z.number(), cells: z.number() });
const SectionSignals = z.object({
  /** Why nothing was compared, when nothing was: the class was handed one dataset, or the kind has no runs. */
  notCompared: z.string().optional(),
  /** Pairs of submissions whose readings look alike, and the students linked when more than two share. */
  pairs: z.array(z.object({ students: z.tuple([z.string(), z.string()]), runs: z.array(RunMatch), sameReportedK: z.array(z.tuple([z.number(), z.number()])) })),
  groups: z.array(z.array(z.string())),
  /** Runs whose readings scatter no more than rounding alone, where the section's scatter several times more. */
  smooth: z.array(z.object({ studentId: z.string(), run: z.number(), label: z.string(), residualSD: z.number(), step: z.number(), sectionMedianSD: z.number() })),
});

type Payload = { studentId: string; runs: Array<{ label: string; timeUnit: string; readings: Array<[number, number]>; reported?: { k?: { value: string | number } } }> };
const nothing = (why: string) => ({ status: 200, body: { notCompared: why, pairs: [], groups: [], smooth: [] } });

export const signalRoutes: RouteSpec[] = [
  {
    method: 'GET',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/signals',
    access: 'section',
    summary:
      "What the section's data say beyond the arithmetic: submissions whose readings look alike (the same, offset, rescaled, reordered or a few cells edited) or whose reported k are written alike, and runs smoother than the instrument reads. Prompts for a TA's review, never findings",
    schema: { params: z.object({ sectionId: IdParam, assignmentId: IdParam }), response: { 200: SectionSignals } },
    async handler({ db, scope, params }) {
      const assignment = (await getAssignment(db, Number(params.assignmentId)))!;
      const settings = assignment.settings as { kind: string; classDataset?: unknown };
      if (settings.kind !== 'first-order-catalysis') return nothing(`the kind ${settings.kind} has no runs of readings to compare`);
      if (settings.classDataset) return nothing('the class was handed one dataset, so shared and identical readings are expected');
      const rows = await latestSubmissions(db, assignment.id, scope.sectionId!);
      const payloads = rows.map((row) => ({ studentId: row.studentId, runs: (row.payload as Payload).runs }));
      const submissions: SubmittedReadings[] = payloads.map((p) => ({ ...p, reportedK: p.runs.map((r) => r.reported?.k?.value) }));
      return { status: 200, body: { ...findSharedReadings(submissions), smooth: findSmoothRuns(payloads) } };
    },
  },
];
