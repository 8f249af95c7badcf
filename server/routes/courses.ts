import { z } from 'zod';
import { ApiError } from '../errors.ts';
import { mayManage } from '../http/access.ts';
import { defineRoute } from '../http/route-table.ts';
import { IdParam, Name } from '../http/schemas.ts';
import { createCourse, createSection, createStaff, listSections, listStaff } from '../store/courses.ts';
import { createToken, revokeTokens } from '../store/tokens.ts';
import { IssuedToken, RevokedTokens, Staff, StaffMember } from '../../schemas/api/courses.ts';

const Course = z.object({ id: z.number(), name: z.string(), createdAt: z.date() });
const Section = z.object({ id: z.number(), courseId: z.number(), name: z.string() });
const InCourse = z.object({ courseId: IdParam });
const OfStaff = z.object({ staffId: IdParam });

export const courseRoutes = [
  defineRoute({
    method: 'POST',
    url: '/v1/courses',
    access: 'admin',
    summary: 'Create a course',
    schema: { body: z.object({ name: Name }), response: { 201: Course } },
    transactional: true,
    async handler(request, reply) {
      return reply.code(201).send(await createCourse(request.db, request.body.name));
    },
  }),
  defineRoute({
    method: 'GET',
    url: '/v1/courses/:courseId',
    access: 'course',
    summary: 'A course',
    schema: { params: InCourse, response: { 200: Course } },
    async handler(request) {
      return request.scope.course;
    },
  }),
  defineRoute({
    method: 'POST',
    url: '/v1/courses/:courseId/sections',
    access: 'instructor',
    summary: 'Create a section',
    schema: { params: InCourse, body: z.object({ name: Name }), response: { 201: Section } },
    transactional: true,
    async handler(request, reply) {
      return reply.code(201).send(await createSection(request.db, request.scope.course.id, request.body.name));
    },
  }),
  defineRoute({
    method: 'GET',
    url: '/v1/courses/:courseId/sections',
    access: 'course',
    summary: "The course's sections (a TA sees the sections assigned to them)",
    schema: { params: InCourse, response: { 200: z.array(Section) } },
    async handler({ db, scope, caller }) {
      const sections = await listSections(db, scope.course.id);
      return caller.kind === 'staff' && caller.role === 'ta' ? sections.filter((s) => caller.sectionIds.includes(s.id)) : sections;
    },
  }),
  defineRoute({
    method: 'POST',
    url: '/v1/courses/:courseId/staff',
    access: 'instructor',
    summary: 'Add a TA (with the sections they teach), or, as the admin, an instructor',
    schema: {
      params: InCourse,
      body: z.object({
        handle: z.string().trim().regex(/^[A-Za-z0-9._-]{1,64}$/, 'letters, digits, dot, underscore or hyphen, at most 64'),
        role: z.enum(['instructor', 'ta']),
        sectionIds: z.array(z.number().int().positive()).max(100).default([]),
      }),
      response: { 201: Staff },
    },
    transactional: true,
    async handler({ db, scope, body, caller }, reply) {
      const { handle, role, sectionIds } = body;
      mayManage(caller, role);
      const own = new Set((await listSections(db, scope.course.id)).map((s) => s.id));
      const foreign = sectionIds.findIndex((id) => !own.has(id));
      if (foreign >= 0) throw new ApiError('invalid-input', undefined, [{ path: `body.sectionIds[${foreign}]`, message: 'no such section in this course' }]);
      return reply.code(201).send(await createStaff(db, scope.course.id, handle, role, role === 'ta' ? sectionIds : []));
    },
  }),
  defineRoute({
    method: 'GET',
    url: '/v1/courses/:courseId/staff',
    access: 'instructor',
    summary: "The course's staff: role, the sections each TA teaches, and how many live tokens each holds",
    schema: { params: InCourse, response: { 200: z.array(StaffMember) } },
    async handler({ db, scope }) {
      return listStaff(db, scope.course.id);
    },
  }),
  defineRoute({
    method: 'POST',
    url: '/v1/staff/:staffId/tokens',
    access: 'instructor',
    summary: "Issue an API token for a staff member (an instructor's only as the admin); it is shown once and stored only as a hash",
    schema: { params: OfStaff, response: { 201: IssuedToken } },
    transactional: true,
    async handler({ db, scope, caller }, reply) {
      mayManage(caller, scope.staff.role);
      return reply.code(201).send({ token: await createToken(db, scope.staff.id) });
    },
  }),
  defineRoute({
    method: 'POST',
    url: '/v1/staff/:staffId/tokens/revoke',
    access: 'instructor',
    summary: "Revoke every token of a staff member (an instructor's only as the admin); their requests answer 401 from then on",
    schema: { params: OfStaff, response: { 200: RevokedTokens } },
    transactional: true,
    async handler({ db, scope, caller }) {
      mayManage(caller, scope.staff.role);
      return { revoked: await revokeTokens(db, scope.staff.id) };
    },
  }),
];
