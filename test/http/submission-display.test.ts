import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SubmissionDisplay } from '../../schemas/display.ts';
import { call, openApi, seedCourse, submissionsFor, type Api, type Seed } from '../support/api-fixture.ts';

/**
 * GET /v1/submissions/:id/display, what the workspace's student page draws: made from the latest
 * result with the TAs' overrides, one card per cause with places in words; a refused submission's
 * problems in words. The slip is made by hand here: run 1's k written with its sign flipped.
 */
describe('the student page’s display payload', () => {
  let api: Api;
  let s: Seed;
  let id = 0;
  let label = '';

  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
    const [slipped] = submissionsFor(['S-001'], 99);
    slipped.runs[0].reported!.k!.value = -Number(slipped.runs[0].reported!.k!.value);
    label = slipped.runs[0].label;
    id = (await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, s.taAToken, [slipped], 201)).body.stored[0].submissionId;
  }, 60_000);
  afterAll(async () => {
    await api?.close();
  });

  const display = async () => (await call(api.app, 'GET', `/v1/submissions/${id}/display`, s.taAToken, undefined, 200)).body as SubmissionDisplay;

  it('names the flipped sign in words, and follows an override', async () => {
    const card = (d: SubmissionDisplay) => d.stages.flatMap((st) => st.cards).find((c) => c.codes.startsWith('sign-flipped'))!;
    const before = card(await display());
    expect(before.where).toBe(`Run “${label}”, k_{obs}`);
    expect(before.places.map((p) => p.path)).toEqual(['runs[0].reported.k']);
    expect(before.message).not.toMatch(/runs\[|reported\.[A-Za-z]/);
    expect(before.pointsLost).toBeGreaterThan(0);
    await call(api.app, 'POST', `/v1/submissions/${id}/overrides`, s.taAToken, { findingId: 'sign-flipped@runs[0].reported.k', pointsLost: 0, reason: 'checked by hand' }, 201);
    expect(card(await display()).pointsLost).toBe(0);
  });

  it('answers 404 for a submission that does not exist', async () => {
    await call(api.app, 'GET', '/v1/submissions/999999/display', s.taAToken, undefined, 404);
  });
});
