import { parse } from 'csv-parse/sync';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bearer, call, openApi, seedCourse, submissionsFor, type Api, type Seed } from '../support/api-fixture.ts';

/**
 * What the gradebook and the results table say of a student who left and of a finding a TA forgave.
 * The expected rows are the TA's reading (common practice, no source): a withdrawn student is shown
 * as withdrawn whether or not they submitted, with the graded work kept beside it; a code is a main
 * code only while it costs points.
 */
describe('gradebook rows', () => {
  let api: Api;
  let s: Seed;
  const url = () => `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}`;
  const gradebook = async () => {
    const res = await api.app.inject({ method: 'GET', url: `${url()}/gradebook.csv`, headers: bearer(s.taAToken) });
    const [header, ...rows] = parse(res.body) as string[][];
    return rows.map((r) => Object.fromEntries(header.map((h, i) => [h, r[i]])));
  };

  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
  }, 60_000);
  afterAll(async () => api?.close());

  it('a withdrawn student who submitted shows withdrawn, with the score of the work they handed in', async () => {
    await call(api.app, 'POST', `${url()}/submissions`, s.taAToken, submissionsFor(['S-001', 'S-002']), 201);
    await call(api.app, 'PUT', `/v1/sections/${s.sectionA.id}/roster/S-002`, s.instructorToken, { status: 'withdrawn' }, 200);
    await call(api.app, 'PUT', `/v1/sections/${s.sectionA.id}/roster/S-003`, s.instructorToken, { status: 'withdrawn' }, 200);
    const table = (await call(api.app, 'GET', `${url()}/results`, s.taAToken, undefined, 200)).body as Array<{ studentId: string; status: string; enrolment: string; score: number | null; maxScore: number | null }>;
    const byId = new Map(table.map((r) => [r.studentId, r]));
    // Clean generated work scores full marks (the generator's clean submissions carry no slip).
    expect(byId.get('S-001')).toMatchObject({ status: 'checked', enrolment: 'enrolled', score: 22, maxScore: 22 });
    expect(byId.get('S-002')).toMatchObject({ status: 'withdrawn', enrolment: 'withdrawn', score: 22, maxScore: 22 });
    expect(byId.get('S-003')).toMatchObject({ status: 'withdrawn', enrolment: 'withdrawn', score: null });
    const rows = new Map((await gradebook()).map((r) => [r.student_id, r]));
    expect(rows.get('S-001')).toMatchObject({ status: 'checked', score: '22' });
    expect(rows.get('S-002')).toMatchObject({ status: 'withdrawn', score: '22', max_score: '22' });
    expect(rows.get('S-003')).toMatchObject({ status: 'withdrawn', score: '' });
  });

  it('a finding overridden to 0 points is no longer a main code, nor a cause costing points', async () => {
    const [slipped] = submissionsFor(['S-005'], 4);
    // A sign slip in one run's k: one error, `sign-flipped`, worth the k item's 2 points.
    slipped.runs[1].reported!.k!.value = -Number(slipped.runs[1].reported!.k!.value);
    const id = (await call(api.app, 'POST', `${url()}/submissions`, s.taAToken, [slipped], 201)).body.stored[0].submissionId;
    const view = await call(api.app, 'GET', `/v1/submissions/${id}`, s.taAToken, undefined, 200);
    const finding = view.body.result.findings.find((f: { code: string }) => f.code === 'sign-flipped');
    expect(finding).toMatchObject({ pointsLost: 2, severity: 'error' });
    expect((await gradebook()).find((r) => r.student_id === 'S-005')).toMatchObject({ score: '20', causes_costing_points: '1', main_codes: 'sign-flipped' });
    await call(api.app, 'POST', `/v1/submissions/${id}/overrides`, s.taAToken, { findingId: finding.id, pointsLost: 0, reason: 'a typing slip in the table only' }, 201);
    // Forgiven, it cost nothing: counted as the results page and the sheet count it (an error at no cost is in no column).
    expect((await gradebook()).find((r) => r.student_id === 'S-005')).toMatchObject({ score: '22', causes_costing_points: '0', main_codes: '' });
  });
});
