import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ADMIN_TOKEN, call, openApi, regradeAndWait, seedCourse, type Api, type Seed } from '../support/api-fixture.ts';

/**
 * A student's own door, end to end: signed in with an access code they submit their numbers (JSON
 * or CSV), see what the form holds and nothing graded, read their feedback once a TA releases it
 * (exactly what was released), and reach nothing of another student. Late work under each setting.
 * The submissions are the documented example's student B-01 (docs/examples), sent as each student's own.
 */

const example = (name: string) => readFileSync(new URL(`../../docs/examples/${name}`, import.meta.url), 'utf8');
const B01 = (JSON.parse(example('submissions.json')) as Array<Record<string, unknown>>)[0];
/** B-01's submission without a student id, as a student sends their own. */
const OWN = Object.fromEntries(Object.entries(B01).filter(([key]) => key !== 'studentId'));

/** B-01's rows of an example CSV file, with the student_id column left out (the first one in both files). */
function withoutStudentColumn(name: string): string {
  const [header, ...rows] = example(name).trim().split('\n');
  const drop = (line: string) => line.split(',').slice(1).join(',');
  return [drop(header), ...rows.filter((row) => row.startsWith('B-01,')).map(drop)].join('\n');
}

/**
 * What the form check says of B-01's submission, written by hand from the file: 4 runs of 16 readings,
 * each with its end value (infinity), its ln F column and a k with its standard error, and k_N and
 * k_A each with a standard error.
 */
const B01_LINES = [
  '4 runs read, 16 readings each',
  'end value x_inf given for every run',
  'ln F column reported for every run',
  'k reported for every run',
  'the standard error of k reported for every run',
  'k_N and k_A reported with standard errors',
];

const BOUNDARY = 'student-door-boundary';
function multipart(files: Record<string, string>): string {
  return Object.entries(files)
    .map(([name, text]) => `--${BOUNDARY}\r\nContent-Disposition: form-data; name="${name}"; filename="${name}.csv"\r\nContent-Type: text/csv\r\n\r\n${text}\r\n`)
    .join('') + `--${BOUNDARY}--\r\n`;
}

type Headers = { cookie: string; 'x-csrf-token': string };

describe("students' own door", () => {
  let api: Api;
  let s: Seed;
  const door: Record<string, Headers> = {};

  /** Issues a code to a student of section A and signs them in with it: their cookie and CSRF header. */
  async function signIn(studentId: string, sectionId = s.sectionA.id): Promise<Headers> {
    const code = (await call(api.app, 'POST', `/v1/sections/${sectionId}/access-codes`, s.instructorToken, { studentIds: [studentId] }, 201)).body.codes[0].code as string;
    const res = await api.app.inject({ method: 'POST', url: '/v1/student/session', payload: { code } });
    expect(res.statusCode, res.body).toBe(201);
    return { cookie: String(res.headers['set-cookie']).split(';')[0], 'x-csrf-token': res.json().csrfToken };
  }

  /** A request as a signed-in student. */
  async function as(studentId: string, method: 'GET' | 'POST', url: string, payload?: object | string, contentType?: string) {
    const headers = { ...door[studentId], ...(contentType ? { 'content-type': contentType } : {}) };
    const res = await api.app.inject({ method, url, headers, ...(payload === undefined ? {} : { payload }) });
    const json = String(res.headers['content-type'] ?? '').includes('json') ? res.json() : undefined;
    return { status: res.statusCode, body: json, raw: res.rawPayload };
  }

  const own = (assignmentId: number, rest = '') => `/v1/student/assignments/${assignmentId}${rest}`;
  const results = async (assignmentId: number) =>
    (await call(api.app, 'GET', `/v1/sections/${s.sectionA.id}/assignments/${assignmentId}/results`, s.taAToken, undefined, 200)).body as Array<Record<string, unknown>>;
  const rowOf = async (assignmentId: number, studentId: string) => (await results(assignmentId)).find((r) => r.studentId === studentId)!;
  /** A new assignment of the seeded course, its settings the seeded ones with a late-work setting. */
  async function assignmentWith(late: { policy: string; points: number }) {
    return (await call(api.app, 'POST', `/v1/courses/${s.course.id}/assignments`, s.instructorToken, { title: `Late work: ${late.policy}`, settings: { ...s.settings, late } }, 201)).body as { id: number };
  }
  const setDeadline = (assignmentId: number, dueAt: string | null) =>
    call(api.app, 'PUT', `/v1/sections/${s.sectionA.id}/assignments/${assignmentId}/deadline`, s.instructorToken, { dueAt }, 200);

  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
    for (const id of ['S-001', 'S-002', 'S-003', 'S-004']) door[id] = await signIn(id);
  }, 60_000);
  afterAll(async () => api?.close());

  it('a student submits JSON and sees what the form holds, never a score or a finding', async () => {
    const res = await as('S-001', 'POST', own(s.assignment.id, '/submissions'), OWN);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(Object.keys(res.body).sort()).toEqual(['form', 'held', 'late', 'submittedAt', 'version']);
    expect(res.body).toMatchObject({ version: 1, late: false, held: false, form: { lines: B01_LINES } });
    // Nothing graded leaks into the answer, at any depth (common practice, no source).
    expect(JSON.stringify(res.body)).not.toMatch(/score|finding|points/i);
    // Stored as the student's own, from their door.
    const row = await rowOf(s.assignment.id, 'S-001');
    expect(row).toMatchObject({ version: 1, source: 'student', late: false, held: false, released: false, feedbackFirstReadAt: null });
  });

  it('a student submits CSV without the student_id column: a new version, the same form lines as the same numbers in JSON', async () => {
    // Run 1's k written with its sign flipped (a slip made by hand): a finding a TA may override later.
    const reported = withoutStudentColumn('reported.csv').replace('0.05 M,k,0.02814,', '0.05 M,k,-0.02814,');
    expect(reported).toContain('-0.02814');
    const body = multipart({ readings: withoutStudentColumn('readings.csv'), reported });
    const res = await as('S-001', 'POST', own(s.assignment.id, '/submissions'), body, `multipart/form-data; boundary=${BOUNDARY}`);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body).toMatchObject({ version: 2, late: false, held: false, form: { lines: B01_LINES } });
  });

  it("a CSV naming another student, or JSON naming one, is refused naming the field; a bad value names its path; nothing is stored", async () => {
    const otherCsv = example('readings.csv').replace(/^B-01,/gm, 'S-002,');
    const csv = await as('S-001', 'POST', own(s.assignment.id, '/submissions'), multipart({ readings: otherCsv.split('\n').filter((l, i) => i === 0 || l.startsWith('S-002,')).join('\n') }), `multipart/form-data; boundary=${BOUNDARY}`);
    expect([csv.status, csv.body.error.details[0].path]).toEqual([400, 'student_id']);
    const json = await as('S-001', 'POST', own(s.assignment.id, '/submissions'), { ...OWN, studentId: 'S-002' });
    expect([json.status, json.body.error.details]).toEqual([400, [{ path: 'body.studentId', message: 'your own student id only (or leave it out)' }]]);
    const broken = structuredClone(OWN) as { runs: Array<{ readings: unknown[][] }> };
    broken.runs[0].readings[0][1] = 'twenty';
    const bad = await as('S-001', 'POST', own(s.assignment.id, '/submissions'), broken);
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path)).toContain('body.runs[0].readings[0][1]');
    // Still the two versions stored above.
    const me = await as('S-001', 'GET', '/v1/student/me');
    expect(me.body.assignments.find((a: { id: number }) => a.id === s.assignment.id).versions.map((v: { version: number }) => v.version)).toEqual([1, 2]);
  });

  it('before a release there is no feedback: 404 for the page and the sheet, and /me says none', async () => {
    expect((await as('S-001', 'GET', own(s.assignment.id, '/feedback'))).status).toBe(404);
    expect((await as('S-001', 'GET', own(s.assignment.id, '/feedback.pdf'))).status).toBe(404);
    const me = await as('S-001', 'GET', '/v1/student/me');
    expect(me.body).toMatchObject({ studentId: 'S-001', course: { id: s.course.id }, section: { id: s.sectionA.id } });
    expect(me.body.assignments.find((a: { id: number }) => a.id === s.assignment.id)).toMatchObject({ dueAt: null, late: { policy: 'grade', points: 0 }, feedback: null });
  });

  it('after a TA releases, the student reads exactly the released result, even after a later override; the first read is recorded once', async () => {
    const row = await rowOf(s.assignment.id, 'S-001');
    const submissionId = row.submissionId as number;
    await call(api.app, 'POST', `/v1/submissions/${submissionId}/release`, s.taAToken, undefined, 200);
    const staffView = (await call(api.app, 'GET', `/v1/submissions/${submissionId}/display`, s.taAToken, undefined, 200)).body;
    const released = (await call(api.app, 'GET', `/v1/submissions/${submissionId}`, s.taAToken, undefined, 200)).body;
    expect(released.source).toBe('student');

    const first = await as('S-001', 'GET', own(s.assignment.id, '/feedback'));
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    // The staff's page of the same released result, the score the staff's row shows as released.
    expect(first.body.display).toEqual(staffView);
    expect(first.body).toMatchObject({ version: 2, score: row.score, maxScore: row.maxScore });
    expect(first.body.score).toBe((await rowOf(s.assignment.id, 'S-001')).releasedScore);

    // A later override the TA has not released: the staff's page changes, the student's does not.
    const slip = (released.result.findings as Array<{ id: string; pointsLost: number }>).find((f) => f.id === 'sign-flipped@runs[0].reported.k')!;
    expect(slip.pointsLost).toBeGreaterThan(0);
    await call(api.app, 'POST', `/v1/submissions/${submissionId}/overrides`, s.taAToken, { findingId: slip.id, pointsLost: 0, reason: 'checked by hand' }, 201);
    expect((await rowOf(s.assignment.id, 'S-001')).score).toBe((row.score as number) + slip.pointsLost);
    const again = await as('S-001', 'GET', own(s.assignment.id, '/feedback'));
    expect(again.body.display).toEqual(staffView);
    expect(again.body.score).toBe(first.body.score);

    const pdf = await as('S-001', 'GET', own(s.assignment.id, '/feedback.pdf'));
    expect(pdf.status).toBe(200);
    expect(pdf.raw.subarray(0, 4).toString('latin1')).toBe('%PDF');

    // Read three times, recorded once: the staff's row shows the first time (ON CONFLICT DO NOTHING).
    const readAt = (await rowOf(s.assignment.id, 'S-001')).feedbackFirstReadAt as string;
    expect(readAt).not.toBeNull();
    const reads = await api.database.store.db.selectFrom('feedback_reads').selectAll().execute();
    expect(reads.length).toBe(1);
    expect(new Date(readAt).getTime()).toBe(reads[0].first_read_at.getTime());
    const me = await as('S-001', 'GET', '/v1/student/me');
    expect(me.body.assignments.find((a: { id: number }) => a.id === s.assignment.id).feedback).toMatchObject({ version: 2, firstReadAt: readAt });
  });

  it("another student reaches nothing of S-001's: every student route answers for their own work only, or 404", async () => {
    // S-002 has submitted nothing: no feedback, whatever S-001 was released.
    expect((await as('S-002', 'GET', own(s.assignment.id, '/feedback'))).status).toBe(404);
    expect((await as('S-002', 'GET', own(s.assignment.id, '/feedback.pdf'))).status).toBe(404);
    const me = await as('S-002', 'GET', '/v1/student/me');
    expect(me.body.studentId).toBe('S-002');
    expect(me.body.assignments.every((a: { versions: unknown[]; feedback: unknown }) => a.versions.length === 0 && a.feedback === null)).toBe(true);
    expect(JSON.stringify(me.body)).not.toContain('S-001');
    // Another course's assignment, and one that does not exist: as missing, for every student route.
    const course = (await call(api.app, 'POST', '/v1/courses', ADMIN_TOKEN, { name: 'Another course (invented)' }, 201)).body;
    const instructor = (await call(api.app, 'POST', `/v1/courses/${course.id}/staff`, ADMIN_TOKEN, { handle: 'other-instructor', role: 'instructor' }, 201)).body;
    const token = (await call(api.app, 'POST', `/v1/staff/${instructor.id}/tokens`, ADMIN_TOKEN, undefined, 201)).body.token;
    const elsewhere = (await call(api.app, 'POST', `/v1/courses/${course.id}/assignments`, token, { title: 'Elsewhere', settings: s.settings }, 201)).body;
    for (const id of [elsewhere.id, 999999]) {
      expect((await as('S-001', 'POST', own(id, '/submissions'), OWN)).status).toBe(404);
      expect((await as('S-001', 'GET', own(id, '/feedback'))).status).toBe(404);
      expect((await as('S-001', 'GET', own(id, '/feedback.pdf'))).status).toBe(404);
    }
    // Staff routes by id are closed to a student: S-001's own submission among them.
    const { submissionId } = await rowOf(s.assignment.id, 'S-001');
    expect((await as('S-002', 'GET', `/v1/submissions/${submissionId}`)).status).toBe(404);
    expect((await as('S-001', 'GET', `/v1/submissions/${submissionId}/display`)).status).toBe(404);
  });

  it('late under deduct: stored past the deadline, marked late, and the same numbers cost the setting\'s 2 points', async () => {
    const a = await assignmentWith({ policy: 'deduct', points: 2 });
    await setDeadline(a.id, '2099-01-01T00:00:00Z');
    const onTime = await as('S-003', 'POST', own(a.id, '/submissions'), OWN);
    expect(onTime.body).toMatchObject({ version: 1, late: false });
    const onTimeRow = await rowOf(a.id, 'S-003');
    const past = (await setDeadline(a.id, '2020-01-01T00:00:00Z')).body;
    expect(past).toMatchObject({ dueAt: '2020-01-01T00:00:00.000Z', setBy: 'instructor-1' });
    const late = await as('S-003', 'POST', own(a.id, '/submissions'), OWN);
    expect(late.body).toMatchObject({ version: 2, late: true, held: false, form: { lines: B01_LINES } });
    const lateRow = await rowOf(a.id, 'S-003');
    // Hand-worked: the same numbers, 2 points less, the maximum unchanged; one late-submission finding.
    expect(lateRow).toMatchObject({ version: 2, late: true, held: false, maxScore: onTimeRow.maxScore });
    expect(onTimeRow.score as number).toBeGreaterThanOrEqual(2);
    expect(lateRow.score).toBe((onTimeRow.score as number) - 2);
    expect(lateRow.codes).toContain('late-submission');
    expect(onTimeRow.codes).not.toContain('late-submission');
    // A regrade keeps the deduction: the late mark is the submission's.
    // The fixture's wait gives the job's timers a turn between polls (on the embedded engine a poll
    // without a pause never lets the regrade run).
    await regradeAndWait(api.app, s.instructorToken, a.id);
    expect((await rowOf(a.id, 'S-003')).score).toBe(lateRow.score);
    // The student's list says when and that it came late.
    const me = await as('S-003', 'GET', '/v1/student/me');
    const listed = me.body.assignments.find((x: { id: number }) => x.id === a.id);
    expect(listed).toMatchObject({ dueAt: '2020-01-01T00:00:00.000Z', late: { policy: 'deduct', points: 2 } });
    expect(listed.versions.map((v: { late: boolean }) => v.late)).toEqual([false, true]);
  });

  it('late under hold: kept out of every release until a TA accepts it, then released', async () => {
    const a = await assignmentWith({ policy: 'hold', points: 0 });
    await setDeadline(a.id, '2020-01-01T00:00:00Z');
    const held = await as('S-004', 'POST', own(a.id, '/submissions'), OWN);
    expect(held.body).toMatchObject({ version: 1, late: true, held: true });
    const row = await rowOf(a.id, 'S-004');
    expect(row).toMatchObject({ late: true, held: true, source: 'student' });
    const release = `/v1/sections/${s.sectionA.id}/assignments/${a.id}/release`;
    expect((await call(api.app, 'POST', release, s.taAToken, undefined, 200)).body).toEqual({ released: 0, held: 1 });
    expect((await call(api.app, 'POST', `/v1/submissions/${row.submissionId}/release`, s.taAToken, undefined, 200)).body).toEqual({ released: 0, held: 1 });
    expect((await as('S-004', 'GET', own(a.id, '/feedback'))).status).toBe(404);
    // The gradebook keeps the held student's row, marked as not final (docs/students.md "Late work").
    const gradebookStatus = async () => {
      const csv = (await call(api.app, 'GET', `/v1/sections/${s.sectionA.id}/assignments/${a.id}/gradebook.csv`, s.taAToken, undefined, 200)).body as string;
      const line = csv.split('\r\n').find((l) => l.startsWith('S-004,'))!;
      return line.split(',').slice(1, 4);
    };
    expect(await gradebookStatus()).toEqual([String(row.score), String(row.maxScore), 'held']);

    const accepted = (await call(api.app, 'POST', `/v1/submissions/${row.submissionId}/accept-late`, s.taAToken, undefined, 200)).body;
    expect(accepted).toMatchObject({ submissionId: row.submissionId, late: true, held: false, acceptedBy: 'ta-a' });
    expect(accepted.acceptedAt).not.toBeNull();
    // Accepting again changes nothing: the first acceptance stays recorded.
    expect((await call(api.app, 'POST', `/v1/submissions/${row.submissionId}/accept-late`, s.instructorToken, undefined, 200)).body).toEqual(accepted);
    expect((await call(api.app, 'POST', release, s.taAToken, undefined, 200)).body).toEqual({ released: 1, held: 0 });
    expect(await gradebookStatus()).toEqual([String(row.score), String(row.maxScore), 'checked']);
    // Held work is graded as usual once accepted: no late finding under hold.
    const feedback = await as('S-004', 'GET', own(a.id, '/feedback'));
    expect(feedback.status).toBe(200);
    expect(feedback.body.score).toBe(row.score);
    expect(row.codes).not.toContain('late-submission');
  });

  it('a body that is no submission is a 400 at body; a withdrawn student reaches nothing any more', async () => {
    for (const payload of [[OWN], 'not json at all']) {
      const res = await as('S-002', 'POST', own(s.assignment.id, '/submissions'), payload as object, typeof payload === 'string' ? 'text/plain' : undefined);
      expect([res.status, res.body.error.details[0].path]).toEqual([400, 'body']);
    }
    door['S-006'] = await signIn('S-006');
    expect((await as('S-006', 'GET', '/v1/student/me')).status).toBe(200);
    await call(api.app, 'PUT', `/v1/sections/${s.sectionA.id}/roster/S-006`, s.instructorToken, { status: 'withdrawn' }, 200);
    // Withdrawing ends the student's sessions: every student route is closed to the old cookie.
    for (const [method, url] of [['GET', '/v1/student/me'], ['POST', own(s.assignment.id, '/submissions')], ['GET', own(s.assignment.id, '/feedback')]] as const) {
      expect((await as('S-006', method, url, method === 'POST' ? OWN : undefined)).status).toBe(401);
    }
  });

  it('a deadline is the instructor\'s to set: a TA is refused, and a date without its time zone is a 400 naming dueAt', async () => {
    const url = `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/deadline`;
    expect((await call(api.app, 'PUT', url, s.taAToken, { dueAt: '2099-01-01T00:00:00Z' })).status).toBe(403);
    const bad = await call(api.app, 'PUT', url, s.instructorToken, { dueAt: '2099-01-01 17:00' });
    expect([bad.status, bad.body.error.details[0].path]).toEqual([400, 'body.dueAt']);
    expect((await call(api.app, 'GET', url, s.taAToken, undefined, 200)).body).toEqual({ dueAt: null, setBy: null, setAt: null });
    await setDeadline(s.assignment.id, '2099-01-01T00:00:00+01:00');
    expect((await call(api.app, 'GET', url, s.taAToken, undefined, 200)).body).toMatchObject({ dueAt: '2098-12-31T23:00:00.000Z', setBy: 'instructor-1' });
    expect((await setDeadline(s.assignment.id, null)).body).toEqual({ dueAt: null, setBy: null, setAt: null });
  });
});
