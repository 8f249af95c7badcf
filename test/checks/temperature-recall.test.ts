import { describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { slipPlace, temperatureSlips, temperatureSubmission } from '../../kinds/temperature-dependence/demo/submission-generator.ts';

/** Recall on generated temperature-dependence work (invented): each slip named at its place, clean work left alone. */
const assignment = parseAssignment({ kind: 'temperature-dependence' });
const N = 100;

describe('temperature dependence: recall on generated submissions', () => {
  it(`finds no error in ${N} clean submissions`, () => {
    const flagged = Array.from({ length: N }, (_, s) => checkSubmission(assignment, temperatureSubmission(seededRandom(s), 'T-01'))).filter((r) => r.findings.some((f) => f.severity === 'error'));
    expect(flagged).toEqual([]);
  });

  it(`finds no rounding to warn about in ${N} clean submissions (E_a rounded to its SE's last place)`, () => {
    const warned = Array.from({ length: N }, (_, s) => checkSubmission(assignment, temperatureSubmission(seededRandom(s), 'T-01'))).flatMap((r) => r.findings.filter((f) => f.code === 'sig-figs').map((f) => f.path));
    expect(warned).toEqual([]);
  });

  it.each(temperatureSlips)(`names %s at its place in at least 97 of ${N}`, (slip) => {
    let named = 0;
    for (let s = 0; s < N; s++) {
      const result = checkSubmission(assignment, temperatureSubmission(seededRandom(5000 + s), 'T-01', slip));
      const at = result.findings.find((f) => f.path === slipPlace[slip]);
      if (at && (at.code === slip || at.alsoCodes?.includes(slip))) named++;
      // The slip is not named under another cause at another value (the SE of E_a, written to two
      // figures, can land as near a scaling of ours as the slip's: there either cause may be named).
      expect(result.findings.filter((f) => f.severity === 'error' && f.code !== slip && !f.path.endsWith('.uncertainty')).map((f) => f.id)).toEqual([]);
    }
    console.log(`${slip}: ${named} of ${N}`);
    expect(named).toBeGreaterThanOrEqual(97);
  });
});
