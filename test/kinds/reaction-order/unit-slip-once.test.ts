import { describe, expect, it } from 'vitest';
import { seededRandom } from '../../../server/demo/seeded-random.ts';
import { checkReactionOrder } from '../../../kinds/reaction-order/checks/check-submission.ts';
import { reactionOrderDemo } from '../../../kinds/reaction-order/demo/demo-assignment.ts';
import { orderSubmission } from '../../../kinds/reaction-order/demo/submission-generator.ts';
import { Settings } from '../../../kinds/reaction-order/schemas.ts';

/**
 * A slip of units scales k and its standard error by the same factor (per second for per minute:
 * the numbers per minute written as per second, so both read 60 times too large; [A] in mM: both 1/1000 for order
 * 2), so the SE follows from the k the student has: the slip is charged once, at k, and the SE is
 * carried forward (the house rule: a carried-forward error is never charged twice). The generator
 * only makes the work; the verdict is the rule's.
 */
const settings = Settings.parse(reactionOrderDemo.settings);

describe('a unit slip on k is charged once, not again on its standard error', () => {
  it.each(['time-unit', 'concentration-unit'] as const)('%s: k charged, its SE carried forward', (slip) => {
    for (let seed = 1; seed <= 12; seed++) {
      const result = checkReactionOrder(settings, orderSubmission(seededRandom(seed), settings, `S-${seed}`, { order: 2 }, slip));
      const charged = result.findings.filter((f) => f.pointsLost > 0);
      expect(charged.map((f) => [f.code, f.path, f.pointsLost]), `seed ${seed}`).toEqual([[slip, 'reported.k', settings.rubric.k]]);
      expect(result.findings.find((f) => f.path === 'reported.k.uncertainty'), `seed ${seed}`).toMatchObject({ code: 'carried-forward', pointsLost: 0 });
    }
  });
});
