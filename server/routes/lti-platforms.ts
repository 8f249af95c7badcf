import type { Kysely } from 'kysely';
import { z } from 'zod';
import { ApiError } from '../errors.ts';
import { defineRoute } from '../http/route-table.ts';
import { IdParam } from '../http/schemas.ts';
import { ensureSigningKey, rotateSigningKey } from '../lti/tool-keys.ts';
import { getCourse } from '../store/courses.ts';
import type { Database } from '../store/database.ts';
import { createPlatform, getPlatform, hasPlacements, listPlatforms, placeResourceLink, registeredAs, updatePlatform } from '../store/lti-platforms.ts';
import { KeyRotated, Placement, PlacementChange, Platform, PlatformList, PlatformRegistration } from '../../schemas/api/lti.ts';

const OfSectionAssignment = z.object({ sectionId: IdParam, assignmentId: IdParam });
const OfPlatform = z.object({ platformId: IdParam });

/** A registration's course must exist, and its issuer and client id be no other platform's. */
async function checkRegistration(db: Kysely<Database>, body: PlatformRegistration, exceptId?: number): Promise<void> {
  if (!(await getCourse(db, body.courseId))) throw new ApiError('invalid-input', undefined, [{ path: 'body.courseId', message: 'no such course' }]);
  if (await registeredAs(db, body.issuer, body.clientId, exceptId)) throw new ApiError('conflict', 'a platform with this issuer and client id is registered already', [{ path: 'body.clientId', message: 'registered already' }]);
}

/**
 * The admin registers learning platforms (each bound to one course) and rotates our signing key; an
 * instructor places a platform's resource link on an assignment and section.
 */
export const ltiPlatformRoutes = [
  defineRoute({
    method: 'POST',
    url: '/v1/lti/platforms',
    access: 'admin',
    transactional: true,
    summary: "Register a learning platform for a course (LTI 1.3): issuer, client id, deployment ids, and the platform's login, token and key set URLs",
    schema: { body: PlatformRegistration, response: { 201: Platform } },
    async handler({ db, body }, reply) {
      await checkRegistration(db, body);
      await ensureSigningKey(db);
      return reply.code(201).send(await createPlatform(db, body));
    },
  }),
  defineRoute({
    method: 'GET',
    url: '/v1/lti/platforms',
    access: 'admin',
    summary: 'The registered learning platforms',
    schema: { response: { 200: PlatformList } },
    async handler({ db }) {
      return { platforms: await listPlatforms(db) };
    },
  }),
  defineRoute({
    method: 'PUT',
    url: '/v1/lti/platforms/:platformId',
    access: 'admin',
    transactional: true,
    summary: "Replace a platform's registration whole (its deployment ids with it)",
    schema: { params: OfPlatform, body: PlatformRegistration, response: { 200: Platform } },
    async handler({ db, params, body }) {
      const before = await getPlatform(db, params.platformId);
      if (!before) throw new ApiError('not-found');
      await checkRegistration(db, body, params.platformId);
      // Its placements name sections and assignments of the course it was bound to.
      if (body.courseId !== before.courseId && (await hasPlacements(db, before.id))) {
        throw new ApiError('conflict', "the platform's resource links are placed in its course; it cannot move to another", [{ path: 'body.courseId', message: 'resource links are placed in the current course' }]);
      }
      return (await updatePlatform(db, params.platformId, body))!;
    },
  }),
  defineRoute({
    method: 'POST',
    url: '/v1/lti/keys/rotate',
    access: 'admin',
    transactional: true,
    summary: 'A new signing key signs from now on; the one it replaces stays in the key set until the tokens it signed have expired',
    schema: { response: { 201: KeyRotated } },
    async handler({ db }, reply) {
      return reply.code(201).send(await rotateSigningKey(db));
    },
  }),
  defineRoute({
    method: 'PUT',
    url: '/v1/sections/:sectionId/assignments/:assignmentId/lti-placement',
    access: 'instructor',
    transactional: true,
    summary: "Place a platform's resource link (its context id and resource link id) on this assignment and section: a learner's launch from it lands here",
    schema: { params: OfSectionAssignment, body: PlacementChange, response: { 200: Placement } },
    async handler({ db, scope, body, caller }) {
      const platform = await getPlatform(db, body.platformId);
      if (!platform || platform.courseId !== scope.section.courseId) throw new ApiError('invalid-input', undefined, [{ path: 'body.platformId', message: 'no platform registered for this course' }]);
      const placement = { ...body, assignmentId: scope.assignment.id, sectionId: scope.section.id };
      await placeResourceLink(db, { ...placement, staffId: caller.kind === 'staff' ? caller.staffId : null });
      return placement;
    },
  }),
];
