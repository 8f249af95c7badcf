import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { call, openApi, seedCourse, submissionsFor, type Api, type Seed } from '../support/api-fixture.ts';

/**
 * The section table counts what a TA means by a student's errors: the likely causes that cost points,
 * one per cause, not every value a slip reaches. The expected counts are worked by hand from the case
 * below (common practice, no source: a slip is one mistake wherever it shows).
 */
describe('section results count causes', () => {
  let api: Api;
  let s: Seed;
  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
  }, 60_000);
  afterAll(async () => api?.close());

  it('one time-unit slip carried through all four runs counts as one error and one warning', async () => {
    const url = `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}`;
    const [slipped] = submissionsFor(['S-004'], 4);
    // The student fitted against seconds and wrote each k with the unit min^-1: every k is 60 times too
    // small, the same slip in four values. Written to more figures than the refit's error supports.
    for (const run of slipped.runs) run.reported!.k!.value = Number(run.reported!.k!.value) / 60;
    const id = (await call(api.app, 'POST', `${url}/submissions`, s.taAToken, [slipped], 201)).body.stored[0].submissionId;
    const findings = (await call(api.app, 'GET', `/v1/submissions/${id}`, s.taAToken, undefined, 200)).body.result.findings as Array<{ code: string; severity: string; pointsLost: number }>;
    // What the checker found: the slip at each of the four k values (charged once), and the figures at each.
    expect(findings.map((f) => [f.code, f.severity, f.pointsLost])).toEqual([
      ['time-unit', 'error', 2],
      ['time-unit', 'error', 0],
      ['time-unit', 'error', 0],
      ['time-unit', 'error', 0],
      ['sig-figs', 'warning', 0],
      ['sig-figs', 'warning', 0],
      ['sig-figs', 'warning', 0],
      ['sig-figs', 'warning', 0],
    ]);
    const rows = (await call(api.app, 'GET', `${url}/results`, s.taAToken, undefined, 200)).body as Array<{ studentId: string; errors: number; warnings: number; infos: number; codes: string[] }>;
    // By hand: one cause cost points (time-unit), one cause of warnings (sig-figs), no notes.
    expect(rows.find((r) => r.studentId === 'S-004')).toMatchObject({ errors: 1, warnings: 1, infos: 0, codes: ['time-unit', 'sig-figs'] });
  });
});
