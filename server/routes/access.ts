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
 * - `section`: an instructor of the course, or a TA assigned to the section the URL points into.
 * Anything outside the caller's reach answers 404, exactly as a missing resource does.
 */
export type Access = 'admin' | 'instructor' | 'course' | 'section';

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

export async function resolveScope(db: Kysely<Database>, params: Record<string, unknown>): Promise<Scope> {
  const scope: Scope = {};
  const id = (name: string) => {
    if (params[name] === undefined) return undefined;
    const n = Number(params[name]);
    // Not an id at all: as missing as any other.
    if (!Number.isSafeInteger(n) || n <= 0 || n > 2147483647) throw notFound();
    return n;
  };
  const courseId = id('courseId');
  if (courseId !== undefined) {
    if (!(await getCourse(db, courseId))) throw notFound();
    merge(scope, courseId);
  }
  const sectionId = id('sectionId');
  if (sectionId !== undefined) {
    const section = await getSection(db, sectionId);
    if (!section) throw notFound();
    merge(scope, section.courseId, section.id);
  }
  const assignmentId = id('assignmentId');
  if (assignmentId !== undefined) {
    const assignment = await getAssignment(db, assignmentId);
    if (!assignment) throw notFound();
    merge(scope, assignment.courseId);
  }
  const submissionId = id('submissionId');
  if (submissionId !== undefined) {
    const submission = await getSubmission(db, submissionId);
    if (!submission) throw notFound();
    merge(scope, submission.courseId, submission.sectionId);
  }
  const staffId = id('staffId');
  if (staffId !== undefined) {
    const staff = await getStaff(db, staffId);
    if (!staff) throw notFound();
    merge(scope, staff.courseId);
  }
  return scope;
}

export function authorize(caller: Caller, access: Access, scope: Scope): void {
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
