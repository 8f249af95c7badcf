import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { registeredKinds } from '../../kinds/registry.ts';
import { call, openApi, seedCourse, type Api, type Seed } from '../support/api-fixture.ts';

/**
 * GET /v1/kinds sends each kind's finding codes in words, which the section page's finding filter
 * shows (the code kept as the option's value). Checked against the checkers' own lists of codes, and
 * two labels as written by hand beside the codes they name.
 */
describe('finding codes in words', () => {
  let api: Api;
  let s: Seed;
  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
  }, 60_000);
  afterAll(async () => api?.close());

  it('names every code each checker can report, in its order, each in words other than the code', async () => {
    const sent = (await call(api.app, 'GET', '/v1/kinds', s.taAToken, undefined, 200)).body as Array<{ kind: string; findings: Array<{ code: string; label: string }> }>;
    for (const checker of registeredKinds()) {
      const words = sent.find((k) => k.kind === checker.kind)!.findings;
      expect(words.map((w) => w.code), checker.kind).toEqual([...checker.findingCodes]);
      for (const w of words) expect(w.label.length, w.code).toBeGreaterThan(3);
      for (const w of words) expect(w.label, w.code).not.toBe(w.code);
    }
    const first = sent.find((k) => k.findings.some((f) => f.code === 'time-unit') && k.findings.some((f) => f.code === 'wrong-infinity'))!;
    const label = (code: string) => first.findings.find((f) => f.code === code)?.label;
    // Shared words and the kind's own words, as written in reports/labels.ts and the kind's description.
    expect(label('sign-flipped')).toBe('Sign reversed');
    expect(label('time-unit')).toBe('Time unit mixed up');
  });
});
