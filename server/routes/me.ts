import { z } from 'zod';
import type { StaffSideCaller } from '../http/access.ts';
import { defineRoute } from '../http/route-table.ts';
import { csrfTokenOf, readSessionCookie } from '../http/session-cookie.ts';
import { listAssignments } from '../store/assignments.ts';
import { getStaff, listCourses, listSections } from '../store/courses.ts';
import { Me } from '../../schemas/api/me.ts';

const CourseListing = z.object({ id: z.number(), name: z.string(), createdAt: z.date() });

const courseIdsOf = (caller: StaffSideCaller) => (caller.kind === 'admin' ? undefined : [caller.courseId]);

export const meRoutes = [
  defineRoute({
    method: 'GET',
    url: '/v1/me',
    access: 'signed-in',
    summary: 'Who is calling, and the courses, sections and assignments they may open',
    schema: { response: { 200: Me } },
    async handler(request) {
      const { db, caller } = request;
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
      const staff = caller.kind === 'staff' ? await getStaff(db, caller.staffId) : undefined;
      const who = caller.kind === 'staff' && staff ? { role: caller.role, staffId: caller.staffId, handle: staff.handle } : { role: 'admin' } as const;
      return { ...who, courses: listed, ...(session && !request.headers.authorization ? { csrfToken: csrfTokenOf(session) } : {}) };
    },
  }),
  defineRoute({
    method: 'GET',
    url: '/v1/courses',
    access: 'signed-in',
    summary: 'The courses the caller may open (every course, for the admin)',
    schema: { response: { 200: z.array(CourseListing) } },
    async handler({ db, caller }) {
      return listCourses(db, courseIdsOf(caller));
    },
  }),
];
