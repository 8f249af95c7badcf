import { z } from 'zod';
import { defineRoute } from '../http/route-table.ts';
import { IdParam } from '../http/schemas.ts';
import { latestSubmissions } from '../store/submissions.ts';

const RunMatch = z.object({ runs: z.tuple([z.number(), z.number()]), relation: z.enum(['identical', 'offset', 'scaled', 'edited']), matchingCells: z.number(), cells: z.number() });
const SectionSignals = z.object({
  /** Why nothing was compared, when nothing was: the class was handed one dataset, or the kind has no runs. */
  notCompared: z.string().optional(),
  /** Pairs of submissions whose readings look alike, and the students linked when more than two share. */
  pairs: z.array(z.object({ students: z.tuple([z.string(), z.string()]), runs: z.array(RunMatch), sameReportedK: z.array(z.tuple([z.number(), z.number()])) })),
  groups: z.array(z.array(z.string())),
  /** Runs whose readings scatter no more than rounding alone, where the section's scatter several times more. */
  smooth: z.array(z.object({ studentId: z.string(), run: z.number(), label: z.string(), residualSD: z.number(), step: z.number(), sectionMedianSD: z.number(), instrumentNoise: z.number().optional() })),
});

/** Stored settings name their kind, which says how a section's data are compared. */
const StoredSettings = z.looseObject({ kind: z.string() });

export const signalRoutes = [
  defineRoute({
    method: 'GET',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/signals',
    access: 'section',
    summary:
      "What the section's data say beyond the arithmetic: submissions whose readings look alike (the same, offset, rescaled, reordered or a few cells edited) or whose reported k are written alike, and runs smoother than the instrument reads. Prompts for a TA's review, never findings",
    schema: { params: z.object({ sectionId: IdParam, assignmentId: IdParam }), response: { 200: SectionSignals } },
    async handler({ db, server, scope }) {
      const rows = await latestSubmissions(db, scope.assignment.id, scope.section.id);
      return server.grader.sectionSignals(StoredSettings.parse(scope.assignment.settings), rows.map((row) => row.payload));
    },
  }),
];
