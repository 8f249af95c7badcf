import { ApiError } from '../errors.ts';
import type { StudentCaller } from '../store/student-access.ts';
import type { StaffCaller } from '../store/tokens.ts';

/**
 * Who may call a route:
 * - `admin`: the configured admin token (creating courses);
 * - `instructor`: an instructor of the course the URL points into (or the admin);
 * - `course`: any staff of that course;
 * - `section`: an instructor of the course, or a TA assigned to the section the URL points into;
 * - `signed-in`: staff or the admin, with a valid token or session (the route itself shows only what they may see);
 * - `student`: a student signed in with their access code, within their own course and section;
 * - `public`: anyone, signed in or not (signing in and out).
 * Anything outside the caller's reach answers 404, exactly as a missing resource does. A student
 * reaches `student` and `public` routes only: to them the staff API is as if absent, and to staff
 * the student routes are.
 */
export type Access = 'admin' | 'instructor' | 'course' | 'section' | 'signed-in' | 'student' | 'public';

/** The callers of the staff side: course staff and the admin token. */
export type StaffSideCaller = StaffCaller | { kind: 'admin' };

export type Caller = StaffSideCaller | StudentCaller;

/** The caller a handler of a route at this access level sees, once `authorize` has let it through. */
export type CallerAt<A extends Access> = A extends 'student' ? StudentCaller : A extends 'public' ? Caller : StaffSideCaller;

const notFound = () => new ApiError('not-found');

/** Where the URL's ids lie: the course, and the section where one of them names it. */
export interface Place {
  courseId?: number;
  sectionId?: number;
}

export function authorize(caller: Caller, access: Access, scope: Place): void {
  if (access === 'public') return;
  if (caller.kind === 'student' || access === 'student') return authorizeStudent(caller, access, scope);
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

/**
 * A student passes only on student routes, and only into their own course and section; no one else
 * passes there. Within the section the route itself keeps to the student's own rows (by `studentRowId`).
 */
function authorizeStudent(caller: Caller, access: Access, scope: Place): void {
  if (caller.kind !== 'student' || access !== 'student') throw notFound();
  if (scope.courseId !== undefined && scope.courseId !== caller.courseId) throw notFound();
  if (scope.sectionId !== undefined && scope.sectionId !== caller.sectionId) throw notFound();
}

/** The staff member behind a request on a section route (the admin token never reaches one). */
export function staffIdOf(caller: StaffSideCaller): number {
  if (caller.kind !== 'staff') throw new ApiError('forbidden', 'this action is recorded against a staff member; use a staff token');
  return caller.staffId;
}

/**
 * Instructors are managed by the admin alone (adding one, issuing or revoking their tokens): an
 * instructor manages the TAs of the course, never a fellow instructor.
 */
export function mayManage(caller: StaffSideCaller, role: 'instructor' | 'ta'): void {
  if (role === 'instructor' && caller.kind !== 'admin') throw new ApiError('forbidden', 'only the admin adds instructors or manages their tokens');
}
