import { z } from 'zod';
import { listAssignments } from '../store/assignments.ts';
import { getStaff, listCourses, listSections } from '../store/courses.ts';
import type { Caller } from './access.ts';
import type { RouteSpec } from './route-spec.ts';
import { csrfTokenOf, readSessionCookie } from './session-cookie.ts';
import { Me } from '../../schemas/api/me.ts';

const CourseListing = z.object({ id: z.number(), name: z.string(), createdAt: z.date() });

const courseIdsOf = (caller: Caller) => (caller.kind === 'admin' ? undefined : [caller.courseId]);

export const meRoutes: RouteSpec[] = [
  {
    method: 'GET',
    url: '/v1/me',
    access: 'signed-in',
    summary: 'Who is calling, and the courses, sections and assignments they may open',
    schema: { response: { 200: Me } },
    async handler({ db, caller, request }) {
      const courses = await listCourses(db, courseIdsOf(caller));
      const listed = await Promise.all(
        courses.map(async (course) => {
          const sections = await listSections(db, course.id);
          return {
            id: course.id,
            name: course.name,
            // A TA sees the sections assigned to them; the admin works on courses, not sections.
            sections: (caller.kind === 'admin' ? [] : caller.role === 'ta' ? sections.filter((s) => caller.sectionIds.includes(s.id)) : sections).map(({ id, name }) => ({ id, name })),
            assignments: caller.kind === 'admin' ? [] : await listAssignments(db, course.id),
          };
        }),
      );
      const session = readSessionCookie(request);
      const who = caller.kind === 'admin' ? { role: 'admin' as const } : { role: caller.role, staffId: caller.staffId, handle: (await getStaff(db, caller.staffId))!.handle };
      return { status: 200, body: { ...who, courses: listed, ...(session && !request.headers.authorization ? { csrfToken: csrfTokenOf(session) } : {}) } };
    },
  },
  {
    method: 'GET',
    url: '/v1/courses',
    access: 'signed-in',
    summary: 'The courses the caller may open (every course, for the admin)',
    schema: { response: { 200: z.array(CourseListing) } },
    async handler({ db, caller }) {
      return { status: 200, body: await listCourses(db, courseIdsOf(caller)) };
    },
  },
];
