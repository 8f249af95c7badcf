import { parse } from 'csv-parse/sync';
import { z } from 'zod';
import { StudentId, Text } from '../../schemas/common.ts';
import { ApiError } from '../errors.ts';
import { defineRoute } from '../http/route-table.ts';
import { IdParam } from '../http/schemas.ts';
import { revokeAccessCodes } from '../store/student-access.ts';
import { addToRoster, idKey, listRoster, rosterRows, setEnrolment, studentsElsewhere, type RosterEntry } from '../store/students.ts';
import { Enrolment, RosterAdded, RosterStudent } from '../../schemas/api/rosters.ts';

const Entry = z.object({ studentId: StudentId, displayName: Text(200).optional() });
const MAX_STUDENTS = 5000;
const RosterBody = z.union([z.object({ students: z.array(Entry).min(1, 'at least one student').max(MAX_STUDENTS, 'at most 5,000 students in one request') }), z.string()]);
/** A roster entry with where in the request its id was given, for messages. */
type Placed = RosterEntry & { at: string };

/** A roster CSV: a header with `student_id` and optionally `display_name`. */
function rosterFromCsv(text: string): Placed[] {
  let rows: Record<string, string>[];
  try {
    rows = parse(text, { columns: (h: string[]) => h.map((c) => c.trim().toLowerCase()), skip_empty_lines: true, trim: true, bom: true });
  } catch (error) {
    throw new ApiError('invalid-input', undefined, [{ path: 'body', message: `not a readable CSV: ${error instanceof Error ? error.message : String(error)}` }]);
  }
  if (rows.length === 0 || !('student_id' in rows[0])) {
    throw new ApiError('invalid-input', undefined, [{ path: 'body', message: 'a header row with a student_id column is required' }]);
  }
  return rows.map((r, i) => {
    const at = `line ${i + 2}.student_id`;
    const parsed = Entry.safeParse({ studentId: r.student_id, displayName: r.display_name || undefined });
    if (!parsed.success) throw new ApiError('invalid-input', undefined, [{ path: at, message: parsed.error.issues[0].message }]);
    return { ...parsed.data, at };
  });
}

/** Plain text, one id per line as typed in the workspace's roster box; blank lines are skipped, any other line must be one id. */
function rosterFromLines(text: string): Placed[] {
  const entries: Placed[] = [];
  const wrong: Array<{ path: string; message: string }> = [];
  text.split(/\r\n|\r|\n/).forEach((line, i) => {
    const id = line.trim();
    if (id === '') return;
    // Before text/plain meant lines, a CSV could come under it: its header must not become a student.
    if (id.toLowerCase() === 'student_id' && entries.length === 0 && wrong.length === 0) wrong.push({ path: `body line ${i + 1}`, message: 'a CSV header, not a student id: send a roster CSV as text/csv' });
    else if (StudentId.safeParse(id).success) entries.push({ studentId: id, at: `body line ${i + 1}` });
    else wrong.push({ path: `body line ${i + 1}`, message: `${JSON.stringify(id.length > 80 ? `${id.slice(0, 80)}…` : id)} is not one student id` });
  });
  if (wrong.length > 0) {
    const count = `${wrong.length} line${wrong.length === 1 ? ' is' : 's are'} not one student id`;
    throw new ApiError('invalid-input', `${count} (one id per line: letters, digits, dot, underscore or hyphen, at most 64); nothing was added`, wrong);
  }
  if (entries.length === 0) throw new ApiError('invalid-input', undefined, [{ path: 'body', message: 'at least one student id' }]);
  if (entries.length > MAX_STUDENTS) throw new ApiError('invalid-input', undefined, [{ path: 'body', message: 'at most 5,000 students in one request' }]);
  return entries;
}

function entriesOf(body: z.output<typeof RosterBody>, contentType: string | undefined): Placed[] {
  if (typeof body !== 'string') return body.students.map((e, i) => ({ ...e, at: `body.students[${i}].studentId` }));
  return contentType?.startsWith('text/plain') ? rosterFromLines(body) : rosterFromCsv(body);
}

const InSection = z.object({ sectionId: IdParam });

export const rosterRoutes = [
  defineRoute({
    method: 'POST',
    url: '/v1/sections/:sectionId/roster',
    access: 'instructor',
    summary:
      'Add students to a section roster: JSON, text/csv (a student_id column, display_name optional) or text/plain (one id per line). Ids are compared without regard to case; a student may be in one section per course. Answers how many were added, enrolled again and already enrolled',
    schema: { params: InSection, body: RosterBody, response: { 200: RosterAdded } },
    transactional: true,
    async handler({ db, scope, body, caller, headers }) {
      const { section } = scope;
      const entries = entriesOf(body, headers['content-type']);
      const firstAt = new Map<string, Placed>();
      for (const e of entries) {
        const first = firstAt.get(idKey(e.studentId));
        if (first) throw new ApiError('invalid-input', undefined, [{ path: e.at, message: `${e.studentId} is listed twice (as ${first.studentId} at ${first.at}; ids are compared without regard to case)` }]);
        firstAt.set(idKey(e.studentId), e);
      }
      const onRoster = await rosterRows(db, section.id, entries.map((e) => e.studentId));
      const otherCase = entries.flatMap((e) => {
        const stored = onRoster.get(e.studentId);
        return stored && stored.studentId !== e.studentId ? [{ path: e.at, message: `already on this roster as ${stored.studentId}` }] : [];
      });
      if (otherCase.length > 0) throw new ApiError('conflict', 'a student id differs only in case from one on the roster: the same student', otherCase);
      const elsewhere = await studentsElsewhere(db, section.courseId, section.id, entries.map((e) => e.studentId));
      if (elsewhere.length > 0) {
        throw new ApiError('conflict', 'a student may be in one section per course', elsewhere.map((s) => ({ path: s.studentId, message: `already on the roster of section ${s.sectionId}` })));
      }
      return addToRoster(db, section, entries, onRoster, caller.kind === 'staff' ? caller.staffId : null);
    },
  }),
  defineRoute({
    method: 'GET',
    url: '/v1/sections/:sectionId/roster',
    access: 'section',
    summary: "A section's roster",
    schema: { params: InSection, response: { 200: z.array(RosterStudent) } },
    async handler({ db, scope }) {
      return listRoster(db, scope.section.id);
    },
  }),
  defineRoute({
    method: 'PUT',
    url: '/v1/sections/:sectionId/roster/:studentId',
    access: 'instructor',
    summary: "Mark a roster student enrolled, withdrawn or removed: nothing is deleted, their work stays in their history, and the change is recorded. A student withdrawn or removed loses their access code and sessions",
    schema: { params: z.object({ sectionId: IdParam, studentId: StudentId }), body: z.object({ status: Enrolment }), response: { 200: RosterStudent } },
    transactional: true,
    async handler({ db, scope, params, body, caller }) {
      const row = await setEnrolment(db, scope.section.id, params.studentId, body.status, caller.kind === 'staff' ? caller.staffId : null);
      // Enrolled again, a student needs a code issued anew: the old one stays revoked.
      if (row && body.status !== 'enrolled') await revokeAccessCodes(db, [row.id]);
      const [student] = row ? await listRoster(db, scope.section.id, params.studentId) : [];
      if (!student) throw new ApiError('not-found', `${params.studentId} is not on this section's roster`);
      return student;
    },
  }),
];
