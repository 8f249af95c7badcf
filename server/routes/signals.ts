import { z } from 'zod';
import { defineRoute } from '../http/route-table.ts';
import { IdParam } from '../http/schemas.ts';
import { latestSubmissions } from '../store/submissions.ts';
import { SectionSignals } from '../../schemas/api/signals.ts';

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
