import type { Kysely } from 'kysely';
import { z } from 'zod';
import { ApiError } from '../errors.ts';
import { staffIdOf } from '../http/access.ts';
import { defineRoute } from '../http/route-table.ts';
import { IdParam } from '../http/schemas.ts';
import { codeHolders, issueAccessCodes, listAccessCodes, revokeAccessCodes } from '../store/student-access.ts';
import type { Database } from '../store/database.ts';
import { idKey } from '../store/students.ts';
import { AccessCodeState, IssueAccessCodes, IssuedAccessCodes, RevokeAccessCodes, RevokedAccessCodes } from '../../schemas/api/students.ts';

const InSection = z.object({ sectionId: IdParam });

/**
 * The roster rows of the ids named, each as given; an id not on the section's roster (or, where
 * `enrolledOnly`, not enrolled) is a 400 naming it, and nothing is changed.
 */
async function namedStudents(db: Kysely<Database>, sectionId: number, studentIds: string[], enrolledOnly: boolean) {
  const rows = await codeHolders(db, sectionId, studentIds);
  const byKey = new Map(rows.map((r) => [idKey(r.studentId), r]));
  const wrong = studentIds.flatMap((id, i) => {
    const row = byKey.get(idKey(id));
    const why = !row ? `${id} is not on this section's roster` : enrolledOnly && row.status !== 'enrolled' ? `${row.studentId} is ${row.status}: a code is issued to enrolled students only` : undefined;
    return why ? [{ path: `body.studentIds[${i}]`, message: why }] : [];
  });
  if (wrong.length > 0) throw new ApiError('invalid-input', undefined, wrong);
  return rows;
}

/** Access codes, by which a roster student signs in to their own pages: issued and revoked by an instructor, listed for the section's staff. */
export const accessCodeRoutes = [
  defineRoute({
    method: 'GET',
    url: '/v1/sections/:sectionId/access-codes',
    access: 'section',
    summary: "The section's enrolled students and when each one's live access code was issued (null: none). Never a code: a code is shown once, when issued",
    schema: { params: InSection, response: { 200: z.array(AccessCodeState) } },
    async handler({ db, scope }) {
      return listAccessCodes(db, scope.section.id);
    },
  }),
  defineRoute({
    method: 'POST',
    url: '/v1/sections/:sectionId/access-codes',
    access: 'instructor',
    summary:
      'Issue access codes to the students named, or to every enrolled student of the section when none are. A student who had a code gets a new one and the old stops working. The codes are in this answer only; the service keeps their hashes',
    schema: { params: InSection, body: IssueAccessCodes, response: { 201: IssuedAccessCodes } },
    transactional: true,
    async handler({ db, scope, body, caller }, reply) {
      const staffId = staffIdOf(caller);
      const students = body.studentIds === undefined ? await codeHolders(db, scope.section.id) : await namedStudents(db, scope.section.id, body.studentIds, true);
      const codes = await issueAccessCodes(db, students.map((s) => s.id), staffId);
      return reply.code(201).send({ codes: students.map((s) => ({ studentId: s.studentId, displayName: s.displayName, code: codes.get(s.id)! })) });
    },
  }),
  defineRoute({
    method: 'POST',
    url: '/v1/sections/:sectionId/access-codes/revoke',
    access: 'instructor',
    summary: "Revoke the access codes of the students named and end their sessions: they sign in again only with a code issued anew. Answers how many live codes were revoked",
    schema: { params: InSection, body: RevokeAccessCodes, response: { 200: RevokedAccessCodes } },
    transactional: true,
    async handler({ db, scope, body }) {
      const students = await namedStudents(db, scope.section.id, body.studentIds, false);
      return { revoked: await revokeAccessCodes(db, students.map((s) => s.id)) };
    },
  }),
];
