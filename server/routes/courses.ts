import { z } from 'zod';
import { ApiError } from '../errors.ts';
import { createCourse, createSection, createStaff, getCourse, getStaff, listSections, listStaff } from '../store/courses.ts';
import { createToken, revokeTokens } from '../store/tokens.ts';
import { mayManage } from './access.ts';
import type { RouteSpec } from './route-spec.ts';
import { IdParam, Name } from './schemas.ts';
import { IssuedToken, RevokedTokens, Staff, StaffMember } from '../../schemas/api/courses.ts';

const Course = z.object({ id: z.number(), name: z.string(), createdAt: z.date() });
const Section = z.object({ id: z.number(), courseId: z.number(), name: z.string() });

export const courseRoutes: RouteSpec[] = [
  {
    method: 'POST',
    url: '/v1/courses',
    access: 'admin',
    summary: 'Create a course',
    schema: { body: z.object({ name: Name }), response: { 201: Course } },
    transactional: true,
    async handler({ db, body }) {
      return { status: 201, body: await createCourse(db, (body as { name: string }).name) };
    },
  },
  {
    method: 'GET',
    url: '/v1/courses/:courseId',
    access: 'course',
    summary: 'A course',
    schema: { params: z.object({ courseId: IdParam }), response: { 200: Course } },
    async handler({ db, scope }) {
      return { status: 200, body: await getCourse(db, scope.courseId!) };
    },
  },
  {
    method: 'POST',
    url: '/v1/courses/:courseId/sections',
    access: 'instructor',
    summary: 'Create a section',
    schema: { params: z.object({ courseId: IdParam }), body: z.object({ name: Name }), response: { 201: Section } },
    transactional: true,
    async handler({ db, scope, body }) {
      return { status: 201, body: await createSection(db, scope.courseId!, (body as { name: string }).name) };
    },
  },
  {
    method: 'GET',
    url: '/v1/courses/:courseId/sections',
    access: 'course',
    summary: "The course's sections (a TA sees the sections assigned to them)",
    schema: { params: z.object({ courseId: IdParam }), response: { 200: z.array(Section) } },
    async handler({ db, scope, caller }) {
      const sections = await listSections(db, scope.courseId!);
      const visible = caller.kind === 'staff' && caller.role === 'ta' ? sections.filter((s) => caller.sectionIds.includes(s.id)) : sections;
      return { status: 200, body: visible };
    },
  },
  {
    method: 'POST',
    url: '/v1/courses/:courseId/staff',
    access: 'instructor',
    summary: 'Add a TA (with the sections they teach), or, as the admin, an instructor',
    schema: {
      params: z.object({ courseId: IdParam }),
      body: z.object({
        handle: z.string().trim().regex(/^[A-Za-z0-9._-]{1,64}$/, 'letters, digits, dot, underscore or hyphen, at most 64'),
        role: z.enum(['instructor', 'ta']),
        sectionIds: z.array(z.number().int().positive()).max(100).default([]),
      }),
      response: { 201: Staff },
    },
    transactional: true,
    async handler({ db, scope, body, caller }) {
      const { handle, role, sectionIds } = body as { handle: string; role: 'instructor' | 'ta'; sectionIds: number[] };
      mayManage(caller, role);
      const own = new Set((await listSections(db, scope.courseId!)).map((s) => s.id));
      const foreign = sectionIds.findIndex((id) => !own.has(id));
      if (foreign >= 0) throw new ApiError('invalid-input', undefined, [{ path: `body.sectionIds[${foreign}]`, message: 'no such section in this course' }]);
      return { status: 201, body: await createStaff(db, scope.courseId!, handle, role, role === 'ta' ? sectionIds : []) };
    },
  },
  {
    method: 'GET',
    url: '/v1/courses/:courseId/staff',
    access: 'instructor',
    summary: "The course's staff: role, the sections each TA teaches, and how many live tokens each holds",
    schema: { params: z.object({ courseId: IdParam }), response: { 200: z.array(StaffMember) } },
    async handler({ db, scope }) {
      return { status: 200, body: await listStaff(db, scope.courseId!) };
    },
  },
  {
    method: 'POST',
    url: '/v1/staff/:staffId/tokens',
    access: 'instructor',
    summary: "Issue an API token for a staff member (an instructor's only as the admin); it is shown once and stored only as a hash",
    schema: { params: z.object({ staffId: IdParam }), response: { 201: IssuedToken } },
    transactional: true,
    async handler({ db, params, caller }) {
      mayManage(caller, (await getStaff(db, Number(params.staffId)))!.role);
      return { status: 201, body: { token: await createToken(db, Number(params.staffId)) } };
    },
  },
  {
    method: 'POST',
    url: '/v1/staff/:staffId/tokens/revoke',
    access: 'instructor',
    summary: "Revoke every token of a staff member (an instructor's only as the admin); their requests answer 401 from then on",
    schema: { params: z.object({ staffId: IdParam }), response: { 200: RevokedTokens } },
    transactional: true,
    async handler({ db, params, caller }) {
      mayManage(caller, (await getStaff(db, Number(params.staffId)))!.role);
      return { status: 200, body: { revoked: await revokeTokens(db, Number(params.staffId)) } };
    },
  },
];
