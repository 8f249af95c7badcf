import type { FastifyInstance, FastifyRequest } from 'fastify';
import fp from 'fastify-plugin';
import type { Kysely } from 'kysely';
import { ApiError } from '../errors.ts';
import { getAssignment } from '../store/assignments.ts';
import { getCourse, getSection, getStaff } from '../store/courses.ts';
import type { Database } from '../store/database.ts';
import { getSubmission } from '../store/submissions.ts';
import { authorize, type Place } from './access.ts';
import { parseId } from './schemas.ts';

type Row<T extends (...args: never[]) => Promise<unknown>> = NonNullable<Awaited<ReturnType<T>>>;

/** The rows a URL's ids name. */
export interface ScopeRows {
  course: Row<typeof getCourse>;
  section: Row<typeof getSection>;
  assignment: Row<typeof getAssignment>;
  submission: Row<typeof getSubmission>;
  staff: Row<typeof getStaff>;
}

/** Which row each id of a URL names. */
interface RowOfParam {
  courseId: 'course';
  sectionId: 'section';
  assignmentId: 'assignment';
  submissionId: 'submission';
  staffId: 'staff';
}

/**
 * What the URL's ids point to, each row read once (inside the request's transaction, where the route
 * has one) and checked to exist and to belong together: the course and section they lie in decide
 * who may call.
 */
export interface Scope extends Partial<ScopeRows>, Place {}

/** The scope a handler sees: the row of each id its URL carries, none of them optional. */
export type ScopeOf<Params> = { [K in keyof Params & keyof RowOfParam as RowOfParam[K]]: ScopeRows[RowOfParam[K]] };

declare module 'fastify' {
  interface FastifyRequest {
    scope: Scope;
  }
}

const notFound = () => new ApiError('not-found');

/** Places a row in the scope: one course, and at most one section, for all the URL's ids. */
function place(scope: Scope, courseId: number, sectionId?: number): void {
  if (scope.courseId !== undefined && scope.courseId !== courseId) throw notFound();
  if (sectionId !== undefined && scope.sectionId !== undefined && scope.sectionId !== sectionId) throw notFound();
  scope.courseId = courseId;
  if (sectionId !== undefined) scope.sectionId = sectionId;
}

/** The id of a URL parameter, if the URL has it; anything but an id is as missing as any other. */
function idOf(params: Record<string, unknown>, name: keyof RowOfParam): number | undefined {
  if (params[name] === undefined) return undefined;
  const id = parseId(params[name]);
  if (id === undefined) throw notFound();
  return id;
}

export async function loadScope(db: Kysely<Database>, params: Record<string, unknown>): Promise<Scope> {
  const scope: Scope = {};
  const load = async <T>(name: keyof RowOfParam, read: (db: Kysely<Database>, id: number) => Promise<T | undefined>): Promise<T | undefined> => {
    const id = idOf(params, name);
    if (id === undefined) return undefined;
    const row = await read(db, id);
    if (row === undefined) throw notFound();
    return row;
  };
  const course = await load('courseId', getCourse);
  if (course) place(scope, (scope.course = course).id);
  const section = await load('sectionId', getSection);
  if (section) place(scope, (scope.section = section).courseId, section.id);
  const assignment = await load('assignmentId', getAssignment);
  if (assignment) place(scope, (scope.assignment = assignment).courseId);
  const submission = await load('submissionId', getSubmission);
  if (submission) place(scope, (scope.submission = submission).courseId, submission.sectionId);
  const staff = await load('staffId', getStaff);
  if (staff) place(scope, (scope.staff = staff).courseId);
  return scope;
}

/** preValidation hook: the URL's rows, read with the request's database (its transaction), and whether the caller may reach them. */
export async function resolveScope(request: FastifyRequest): Promise<void> {
  request.scope = await loadScope(request.db, request.params && typeof request.params === 'object' ? { ...request.params } : {});
  authorize(request.caller, request.routeOptions.config.access ?? 'public', request.scope);
}

/** `request.scope`: empty until a route's hook reads it. */
export const scopePlugin = fp(async (app: FastifyInstance) => {
  app.decorateRequest<Scope | null>('scope', null);
}, { name: 'rateproof-scope' });
