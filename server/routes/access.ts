import type { Kysely } from 'kysely';
import { ApiError } from '../errors.ts';
import { getAssignment } from '../store/assignments.ts';
import { getCourse, getSection, getStaff } from '../store/courses.ts';
import type { Database } from '../store/database.ts';
import { getSubmission } from '../store/submissions.ts';
import type { StaffCaller } from '../store/tokens.ts';

/**
 * Who may call a route:
 * - `admin`: the configured admin token (creating courses);
 * - `instructor`: an instructor of the course the URL points into (or the admin);
 * - `course`: any staff of that course;
 * - `section`: an instructor of the course, or a TA assigned to the section the URL points into;
 * - `signed-in`: anyone with a valid token or session (the route itself shows only what they may see).
 * Anything outside the caller's reach answers 404, exactly as a missing resource does.
 */
export type Access = 'admin' | 'instructor' | 'course' | 'section' | 'signed-in';

export type Caller = StaffCaller | { kind: 'admin' };

/** What the URL's ids point to, each checked to exist and to belong together. */
export interface Scope {
  courseId?: number;
  sectionId?: number;
}

const notFound = () => new ApiError('not-found');

function merge(scope: Scope, courseId: number, sectionId?: number): void {
  if (scope.courseId !== undefined && scope.courseId !== courseId) throw notFound();
  if (sectionId !== undefined && scope.sectionId !== undefined && scope.sectionId !== sectionId) throw notFound();
  scope.courseId = courseId;
  if (sectionId !== undefined) scope.sectionId = sectionId;
}

type Place = { courseId: number; sectionId?: number } | undefined;

/** For each id a URL may carry: where the thing it names lives. */
const lookups: Array<[string, (db: Kysely<Database>, id: number) => Promise<Place>]> = [
  ['courseId', async (db, id) => ((await getCourse(db, id)) ? { courseId: id } : undefined)],
  ['sectionId', async (db, id) => {
    const s = await getSection(db, id);
    return s && { courseId: s.courseId, sectionId: s.id };
  }],
  ['assignmentId', async (db, id) => {
    const a = await getAssignment(db, id);
    return a && { courseId: a.courseId };
  }],
  ['submissionId', async (db, id) => {
    const s = await getSubmission(db, id);
    return s && { courseId: s.courseId, sectionId: s.sectionId };
  }],
  ['staffId', async (db, id) => {
    const s = await getStaff(db, id);
    return s && { courseId: s.courseId };
  }],
];

export async function resolveScope(db: Kysely<Database>, params: Record<string, unknown>): Promise<Scope> {
  const scope: Scope = {};
  for (const [name, lookup] of lookups) {
    if (params[name] === undefined) continue;
    const id = Number(params[name]);
    // Not an id at all: as missing as any other.
    if (!Number.isSafeInteger(id) || id <= 0 || id > 2147483647) throw notFound();
    const place = await lookup(db, id);
    if (!place) throw notFound();
    merge(scope, place.courseId, place.sectionId);
  }
  return scope;
}

export function authorize(caller: Caller, access: Access, scope: Scope): void {
  if (access === 'signed-in') return;
  if (caller.kind === 'admin') {
    if (access === 'admin' || access === 'instructor') return;
    throw new ApiError('forbidden', 'the admin token creates courses and their staff; use a staff token for course work');
  }
  if (access === 'admin') throw new ApiError('forbidden');
  if (scope.courseId !== caller.courseId) throw notFound();
  if (access === 'course') return;
  if (access === 'instructor') {
    if (caller.role !== 'instructor') throw new ApiError('forbidden', 'only an instructor of the course may do this');
    return;
  }
  if (caller.role === 'instructor') return;
  if (scope.sectionId === undefined || !caller.sectionIds.includes(scope.sectionId)) throw notFound();
}

/** The staff member behind a request on a section route (the admin token never reaches one). */
export function staffIdOf(caller: Caller): number {
  if (caller.kind !== 'staff') throw new ApiError('forbidden', 'this action is recorded against a staff member; use a staff token');
  return caller.staffId;
}

/**
 * Instructors are managed by the admin alone (adding one, issuing or revoking their tokens): an
 * instructor manages the TAs of the course, never a fellow instructor.
 */
export function mayManage(caller: Caller, role: 'instructor' | 'ta'): void {
  if (role === 'instructor' && caller.kind !== 'admin') throw new ApiError('forbidden', 'only the admin adds instructors or manages their tokens');
}
