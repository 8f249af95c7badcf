import { z } from 'zod';
import { defineRoute } from '../http/route-table.ts';
import { IdParam } from '../http/schemas.ts';
import { applyRoster, readRoster, type RosterRead } from '../lti/roster-pull.ts';
import { RosterPulled } from '../../schemas/api/lti.ts';

/**
 * A roster pull changes who is enrolled, as adding to or withdrawing from a roster does, so it is the
 * instructor's, as those are; a TA reads the roster but does not change it.
 */
export const ltiRosterRoutes = [
  defineRoute({
    method: 'POST',
    url: '/v1/sections/:sectionId/roster/pull',
    access: 'instructor',
    transactional: true,
    summary:
      "Pull a section's roster from the learning platform its resource link is placed from (LTI NRPS 2.0): active learners are enrolled, students the platform made here who are no longer listed are withdrawn (history kept); students added by hand are untouched. 502 platform-unavailable if the platform fails, with nothing changed",
    schema: { params: z.object({ sectionId: IdParam }), response: { 200: RosterPulled } },
    // The platform is asked before the transaction opens, so no connection is held while it answers.
    async prepare({ server, scope }): Promise<RosterRead> {
      return readRoster(server.store.db, scope.section.id);
    },
    async handler({ db, scope, caller, prepared }) {
      return applyRoster(db, scope.section, caller.kind === 'staff' ? caller.staffId : null, prepared);
    },
  }),
];
