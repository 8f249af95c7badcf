import { parse } from 'csv-parse/sync';
import { z } from 'zod';
import { StudentId, Text } from '../../schemas/common.ts';
import { ApiError } from '../errors.ts';
import { addToRoster, listRoster, setEnrolment, studentsElsewhere, type RosterEntry } from '../store/students.ts';
import type { RouteSpec } from './route-spec.ts';
import { Enrolment, IdParam } from './schemas.ts';

const RosterStudent = z.object({
  studentId: z.string(),
  displayName: z.string().nullable(),
  status: Enrolment,
  /** Every change of enrolment: to what, by whom (null for the admin), when. */
  history: z.array(z.object({ status: Enrolment, by: z.string().nullable(), at: z.date() })),
});

const Entry = z.object({ studentId: StudentId, displayName: Text(200).optional() });
const RosterBody = z.union([z.object({ students: z.array(Entry).min(1, 'at least one student').max(5000, 'at most 5,000 students in one request') }), z.string()]);

/** A roster CSV: a header with `student_id` and optionally `display_name`. */
function rosterFromCsv(text: string): RosterEntry[] {
  let rows: Record<string, string>[];
  try {
    rows = parse(text, { columns: (h: string[]) => h.map((c) => c.trim().toLowerCase()), skip_empty_lines: true, trim: true, bom: true });
  } catch (error) {
    throw new ApiError('invalid-input', undefined, [{ path: 'body', message: `not a readable CSV: ${(error as Error).message}` }]);
  }
  if (rows.length === 0 || !('student_id' in rows[0])) {
    throw new ApiError('invalid-input', undefined, [{ path: 'body', message: 'a header row with a student_id column is required' }]);
  }
  return rows.map((r, i) => {
    const parsed = Entry.safeParse({ studentId: r.student_id, displayName: r.display_name || undefined });
    if (!parsed.success) throw new ApiError('invalid-input', undefined, [{ path: `line ${i + 2}.student_id`, message: parsed.error.issues[0].message }]);
    return parsed.data;
  });
}

export const rosterRoutes: RouteSpec[] = [
  {
    method: 'POST',
    url: '/v1/sections/:sectionId/roster',
    access: 'instructor',
    summary: 'Add students to a section roster (JSON or text/csv); a student may be in one section per course',
    schema: { params: z.object({ sectionId: IdParam }), body: RosterBody, response: { 200: z.object({ added: z.number() }) } },
    transactional: true,
    async handler({ db, scope, body, caller }) {
      const entries = typeof body === 'string' ? rosterFromCsv(body) : (body as { students: RosterEntry[] }).students;
      const firstAt = new Map<string, number>();
      entries.forEach((e, i) => firstAt.set(e.studentId, firstAt.get(e.studentId) ?? i));
      const repeated = entries.findIndex((e, i) => firstAt.get(e.studentId) !== i);
      if (repeated >= 0) throw new ApiError('invalid-input', undefined, [{ path: `body.students[${repeated}].studentId`, message: `${entries[repeated].studentId} is listed twice` }]);
      const elsewhere = await studentsElsewhere(db, scope.courseId!, scope.sectionId!, entries.map((e) => e.studentId));
      if (elsewhere.length > 0) {
        throw new ApiError('conflict', 'a student may be in one section per course', elsewhere.map((s) => ({ path: s.studentId, message: `already on the roster of section ${s.sectionId}` })));
      }
      return { status: 200, body: { added: await addToRoster(db, scope.courseId!, scope.sectionId!, entries, caller.kind === 'staff' ? caller.staffId : null) } };
    },
  },
  {
    method: 'GET',
    url: '/v1/sections/:sectionId/roster',
    access: 'section',
    summary: "A section's roster",
    schema: { params: z.object({ sectionId: IdParam }), response: { 200: z.array(RosterStudent) } },
    async handler({ db, scope }) {
      return { status: 200, body: await listRoster(db, scope.sectionId!) };
    },
  },
  {
    method: 'PUT',
    url: '/v1/sections/:sectionId/roster/:studentId',
    access: 'instructor',
    summary: "Mark a roster student enrolled, withdrawn or removed: nothing is deleted, their work stays in their history, and the change is recorded",
    schema: { params: z.object({ sectionId: IdParam, studentId: StudentId }), body: z.object({ status: Enrolment }), response: { 200: RosterStudent } },
    transactional: true,
    async handler({ db, scope, params, body, caller }) {
      const { status } = body as { status: z.infer<typeof Enrolment> };
      const row = await setEnrolment(db, scope.sectionId!, params.studentId, status, caller.kind === 'staff' ? caller.staffId : null);
      if (!row) throw new ApiError('not-found', `${params.studentId} is not on this section's roster`);
      return { status: 200, body: (await listRoster(db, scope.sectionId!, params.studentId))[0] };
    },
  },
];
