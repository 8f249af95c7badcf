import { z } from 'zod';
import { staffIdOf } from '../http/access.ts';
import { defineRoute } from '../http/route-table.ts';
import { IdParam } from '../http/schemas.ts';
import { deadlineOf, setDeadline } from '../store/deadlines.ts';
import { acceptLate, lateStanding } from '../store/late-acceptance.ts';
import { DeadlineChange, DeadlineView, LateAccepted } from '../../schemas/api/deadlines.ts';

const params = z.object({ sectionId: IdParam, assignmentId: IdParam });
const NO_DEADLINE = { dueAt: null, setBy: null, setAt: null };

export const deadlineRoutes = [
  defineRoute({
    method: 'GET',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/deadline',
    access: 'section',
    summary: "The section's deadline for an assignment (null when none is set), with who set it",
    schema: { params, response: { 200: DeadlineView } },
    async handler({ db, scope }) {
      return (await deadlineOf(db, scope.assignment.id, scope.section.id)) ?? NO_DEADLINE;
    },
  }),
  defineRoute({
    method: 'PUT',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/deadline',
    access: 'instructor',
    summary:
      "Set the section's deadline for an assignment (null clears it): a student's submission stored after it is marked late, and the assignment's late-work setting says what that costs; marks already given stay",
    schema: { params, body: DeadlineChange, response: { 200: DeadlineView } },
    transactional: true,
    async handler({ db, scope, body, caller }) {
      await setDeadline(db, scope.assignment.id, scope.section.id, body.dueAt, staffIdOf(caller));
      return (await deadlineOf(db, scope.assignment.id, scope.section.id)) ?? NO_DEADLINE;
    },
  }),
  defineRoute({
    method: 'POST',
    url: '/v1/submissions/:submissionId/accept-late',
    access: 'section',
    summary:
      'Accept a late submission held under the hold policy: recorded with who and when, it takes part in the next release; accepting one that is not held (on time, accepted already, or late under another policy) changes nothing',
    schema: { params: z.object({ submissionId: IdParam }), response: { 200: LateAccepted } },
    transactional: true,
    async handler({ db, scope, caller }) {
      const { submissionId } = scope.submission;
      await acceptLate(db, submissionId, staffIdOf(caller));
      return lateStanding(db, submissionId);
    },
  }),
];
