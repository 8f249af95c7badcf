import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bearer, call, openApi, seedCourse, submissionsFor, type Api, type Seed } from '../support/api-fixture.ts';

/**
 * Adding to a roster as the workspace's box does (one id per line) and as scripts do (JSON): what is
 * refused, what is counted, and what is kept. Expected outcomes are the TA's reading of the box's
 * promise, "one per line" (common practice, no source).
 */
describe('roster additions', () => {
  let api: Api;
  let s: Seed;
  const rosterUrl = () => `/v1/sections/${s.sectionA.id}/roster`;
  const addLines = (text: string, section = s.sectionA.id) =>
    api.app.inject({ method: 'POST', url: `/v1/sections/${section}/roster`, headers: { ...bearer(s.instructorToken), 'content-type': 'text/plain' }, payload: text });
  const roster = async () => (await call(api.app, 'GET', rosterUrl(), s.instructorToken, undefined, 200)).body as Array<{ studentId: string; displayName: string | null; status: string }>;
  const studentRows = async () => Number((await sql<{ n: string }>`select count(*) as n from students`.execute(api.database.store.db)).rows[0].n);

  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
  }, 60_000);
  afterAll(async () => api?.close());

  it('a line that is not one id is refused with its line number, and nothing is added', async () => {
    const before = await studentRows();
    const res = await addLines('S-201\nB 26 bad\n\nS-202, S-203\nS-204\n');
    expect(res.statusCode, res.body).toBe(400);
    expect(res.json().error).toMatchObject({ code: 'invalid-input', message: expect.stringMatching(/^2 lines are not one student id \(one id per line: .*\); nothing was added$/) });
    expect(res.json().error.details).toEqual([
      { path: 'body line 2', message: '"B 26 bad" is not one student id' },
      { path: 'body line 4', message: '"S-202, S-203" is not one student id' },
    ]);
    // A one-column CSV sent as plain text: its header is named, not enrolled.
    const csvAsText = await addLines('student_id\nS-209\n');
    expect(csvAsText.statusCode, csvAsText.body).toBe(400);
    expect(csvAsText.json().error.details).toEqual([{ path: 'body line 1', message: expect.stringContaining('send a roster CSV as text/csv') }]);
    expect(await studentRows()).toBe(before);
  });

  it('counts the students added apart from those already enrolled and those enrolled again', async () => {
    // S-001 and S-002 are on the seeded roster; S-205 is new; blank lines and spaces around an id are nothing.
    const first = await addLines('S-001\r\n  S-205  \n\nS-002\n');
    expect(first.statusCode, first.body).toBe(200);
    expect(first.json()).toEqual({ added: 1, reenrolled: 0, alreadyEnrolled: 2 });
    await call(api.app, 'PUT', `${rosterUrl()}/S-205`, s.instructorToken, { status: 'withdrawn' }, 200);
    expect((await addLines('S-205\nS-206')).json()).toEqual({ added: 1, reenrolled: 1, alreadyEnrolled: 0 });
    expect((await roster()).find((r) => r.studentId === 'S-205')?.status).toBe('enrolled');
  });

  it('re-adding a removed student keeps their display name; a name given replaces it', async () => {
    await call(api.app, 'POST', rosterUrl(), s.instructorToken, { students: [{ studentId: 'S-207', displayName: 'Robin (invented)' }] }, 200);
    await call(api.app, 'PUT', `${rosterUrl()}/S-207`, s.instructorToken, { status: 'removed' }, 200);
    expect((await addLines('S-207')).json()).toEqual({ added: 0, reenrolled: 1, alreadyEnrolled: 0 });
    expect((await roster()).find((r) => r.studentId === 'S-207')).toMatchObject({ displayName: 'Robin (invented)', status: 'enrolled' });
    await call(api.app, 'POST', rosterUrl(), s.instructorToken, { students: [{ studentId: 'S-207' }] }, 200);
    expect((await roster()).find((r) => r.studentId === 'S-207')?.displayName).toBe('Robin (invented)');
    await call(api.app, 'POST', rosterUrl(), s.instructorToken, { students: [{ studentId: 'S-207', displayName: 'Robin K. (invented)' }] }, 200);
    expect((await roster()).find((r) => r.studentId === 'S-207')?.displayName).toBe('Robin K. (invented)');
  });

  it('an id differing only in case from one on the roster is the same student: refused as a duplicate', async () => {
    const before = await studentRows();
    const res = await addLines('S-208\ns-001');
    expect(res.statusCode, res.body).toBe(409);
    expect(res.json().error.details).toEqual([{ path: 'body line 2', message: 'already on this roster as S-001' }]);
    const twice = await api.app.inject({ method: 'POST', url: rosterUrl(), headers: bearer(s.instructorToken), payload: { students: [{ studentId: 'A-01' }, { studentId: 'a-01' }] } });
    expect(twice.statusCode, twice.body).toBe(400);
    expect(twice.json().error.details).toEqual([{ path: 'body.students[1].studentId', message: expect.stringContaining('a-01 is listed twice (as A-01 at body.students[0].studentId') }]);
    // In another section of the course: the one-section-per-course rule sees the case too.
    const elsewhere = await addLines('s-002', s.sectionB.id);
    expect(elsewhere.statusCode, elsewhere.body).toBe(409);
    expect(await studentRows()).toBe(before);
  });

  it('work and enrolment changes naming a roster id in another case reach that student', async () => {
    const res = await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, s.taAToken, submissionsFor(['s-003']), 201);
    expect(res.body.rejected).toEqual([]);
    const history = await call(api.app, 'GET', `/v1/sections/${s.sectionA.id}/students/S-003/history`, s.taAToken, undefined, 200);
    expect(history.body).toHaveLength(1);
    expect((await call(api.app, 'GET', `/v1/sections/${s.sectionA.id}/students/s-003/history`, s.taAToken, undefined, 200)).body).toEqual(history.body);
    const changed = await call(api.app, 'PUT', `${rosterUrl()}/s-004`, s.instructorToken, { status: 'withdrawn' }, 200);
    expect(changed.body).toMatchObject({ studentId: 'S-004', status: 'withdrawn' });
  });
});
