import { z } from 'zod';
import { SubmissionDisplay } from '../../schemas/display.ts';
import { submissionDisplay } from '../grading/submission-display.ts';
import type { RouteSpec } from './route-spec.ts';
import { IdParam } from './schemas.ts';

export const submissionDisplayRoutes: RouteSpec[] = [
  {
    method: 'GET',
    url: '/v1/submissions/:submissionId/display',
    access: 'section',
    summary:
      "The workspace's student page as data, made by the feedback sheet's own formatting: the latest result's findings one card per cause with places in words, the values table and the plots' series",
    schema: { params: z.object({ submissionId: IdParam }), response: { 200: SubmissionDisplay } },
    async handler({ db, params }) {
      return { status: 200, body: await submissionDisplay(db, Number(params.submissionId)) };
    },
  },
];
