import { z } from 'zod';
import { SubmissionDisplay } from '../../schemas/display.ts';
import { submissionDisplay } from '../grading/submission-display.ts';
import { defineRoute } from '../http/route-table.ts';
import { IdParam } from '../http/schemas.ts';

export const submissionDisplayRoutes = [
  defineRoute({
    method: 'GET',
    url: '/v1/submissions/:submissionId/display',
    access: 'section',
    summary:
      "The workspace's student page as data, made by the feedback sheet's own formatting: the latest result's findings one card per cause with places in words, the values table and the plots' series",
    schema: { params: z.object({ submissionId: IdParam }), response: { 200: SubmissionDisplay } },
    async handler({ db, scope }) {
      return submissionDisplay(db, scope.submission);
    },
  }),
];
