import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { call, openApi, seedCourse, type Api, type Seed } from '../support/api-fixture.ts';

/**
 * Changing an assignment's settings: PUT replaces them whole and must state every setting the
 * assignment has; PATCH merges as JSON Merge Patch does (RFC 7396: objects merge key by key, null
 * removes, anything else replaces). The expected settings below are worked out by hand from those rules.
 */
describe('assignment settings: PUT and PATCH', () => {
  let api: Api;
  let s: Seed;
  let id: number;
  const url = () => `/v1/assignments/${id}/settings`;
  const stored = async () => (await call(api.app, 'GET', `/v1/assignments/${id}`, s.instructorToken, undefined, 200)).body as { settings: Record<string, any>; settingsVersion: number };
  // Bands an instructor set (invented figures for the test).
  const reference = { kN: { min: 0.005, max: 0.05, unit: 'min^-1' }, kA: { min: 0.1, max: 0.4, unit: 'M^-1 min^-1' } };

  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
    const created = await call(api.app, 'POST', `/v1/courses/${s.course.id}/assignments`, s.instructorToken, { title: 'With bands (invented)', settings: { kind: 'first-order-catalysis', fitModel: 'origin', reference, tolerances: { kN: { relative: 0.05 } } } }, 201);
    id = created.body.id;
  }, 60_000);
  afterAll(async () => api?.close());

  it('a PUT that leaves out a setting is a 422 naming each one left out, and changes nothing', async () => {
    const before = await stored();
    const res = await call(api.app, 'PUT', url(), s.instructorToken, { settings: { kind: 'first-order-catalysis', fitModel: 'intercept' } });
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('missing-settings');
    const paths = res.body.error.details.map((d: { path: string }) => d.path);
    // The stored settings have these (the given ones, and every setting with a default); the PUT stated two.
    for (const key of ['reference', 'tolerances', 'rubric', 'units', 'rateLawFit', 'weightedErrors', 'displayStep', 'temperature']) expect(paths).toContain(`body.settings.${key}`);
    expect(paths).not.toContain('body.settings.fitModel');
    expect(paths).not.toContain('body.settings.classDataset');
    expect(res.body.error.details[0].message).toMatch(/null to clear it/);
    expect(await stored()).toEqual(before);
  });

  it('a PUT of every setting replaces them; null clears an optional one', async () => {
    const before = await stored();
    const whole = { ...before.settings, fitModel: 'intercept' };
    const replaced = await call(api.app, 'PUT', url(), s.instructorToken, { settings: whole }, 200);
    expect(replaced.body.settings).toEqual(whole);
    expect(replaced.body.settingsVersion).toBe(before.settingsVersion + 1);
    const cleared = await call(api.app, 'PUT', url(), s.instructorToken, { settings: { ...whole, reference: null } }, 200);
    expect(cleared.body.settings).not.toHaveProperty('reference');
    // Put the bands back for the PATCH tests below.
    await call(api.app, 'PUT', url(), s.instructorToken, { settings: { ...whole, reference } }, 200);
  });

  it('a PATCH merges into the current settings at every depth; null removes one key', async () => {
    const before = await stored();
    const res = await call(api.app, 'PATCH', url(), s.instructorToken, { settings: { tolerances: { kN: { absolute: 0.0002 } }, rubric: { k: 3 }, reference: { kA: null } } }, 200);
    const after = res.body.settings;
    expect(after.tolerances.kN).toEqual({ relative: 0.05, absolute: 0.0002 });
    expect(after.tolerances.kA).toEqual(before.settings.tolerances.kA);
    expect(after.rubric).toEqual({ ...before.settings.rubric, k: 3 });
    expect(after.reference).toEqual({ kN: reference.kN });
    expect(after.fitModel).toBe('intercept');
    expect(after.units).toEqual(before.settings.units);
    expect(res.body.settingsVersion).toBe(before.settingsVersion + 1);
  });

  it('a PATCH is validated whole after merging: a bad value or a tolerance emptied is a 400 naming it, and nothing changes', async () => {
    const before = await stored();
    const bad = await call(api.app, 'PATCH', url(), s.instructorToken, { settings: { rubric: { k: -1 } } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path)).toEqual(['body.settings.rubric.k']);
    // Both parts of the kN tolerance removed: the merged tolerance is empty, which the schema refuses.
    const emptied = await call(api.app, 'PATCH', url(), s.instructorToken, { settings: { tolerances: { kN: { relative: null, absolute: null } } } });
    expect(emptied.status).toBe(400);
    expect(emptied.body.error.details[0]).toMatchObject({ path: 'body.settings.tolerances.kN', message: expect.stringMatching(/give relative, absolute or both/) });
    const kind = await call(api.app, 'PATCH', url(), s.instructorToken, { settings: { kind: 'temperature-dependence' } });
    expect(kind.status).toBe(400);
    expect(kind.body.error.details).toEqual([{ path: 'body.settings.kind', message: "the assignment's kind is first-order-catalysis" }]);
    expect(await stored()).toEqual(before);
  });

  it('the late policy: deduct without points is a 400 naming settings.late.points; with points it is stored', async () => {
    const before = await stored();
    // Created without a late policy: the default, graded as usual.
    expect(before.settings.late).toEqual({ policy: 'grade', points: 0 });
    const noPoints = await call(api.app, 'PATCH', url(), s.instructorToken, { settings: { late: { policy: 'deduct' } } });
    expect(noPoints.status).toBe(400);
    expect(noPoints.body.error.details.map((d: { path: string }) => d.path)).toEqual(['body.settings.late.points']);
    expect(await stored()).toEqual(before);
    const deduct = await call(api.app, 'PATCH', url(), s.instructorToken, { settings: { late: { policy: 'deduct', points: 2 } } }, 200);
    expect(deduct.body.settings.late).toEqual({ policy: 'deduct', points: 2 });
    await call(api.app, 'PATCH', url(), s.instructorToken, { settings: { late: { policy: 'grade', points: 0 } } }, 200);
  });

  it('the OpenAPI document has both, and says a PUT may answer 422', async () => {
    const doc = (await call(api.app, 'GET', '/openapi.json', undefined, undefined, 200)).body;
    const path = doc.paths['/v1/assignments/{assignmentId}/settings'];
    expect(path.patch.summary).toMatch(/Merge Patch/);
    expect(path.put.summary).toMatch(/every setting the assignment has must be stated/);
    expect(path.put.responses).toHaveProperty('422');
  });
});
