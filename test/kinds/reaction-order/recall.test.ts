import { describe, expect, it } from 'vitest';
import { reactionOrder } from '../../../kinds/reaction-order/checks/kind.ts';
import type { Refit } from '../../../kinds/reaction-order/schemas.ts';
import { checkSubmission } from '../../../server/checks/check.ts';
import { CHARGED_SLIPS, generateWork, ordersFor, slipNamed, type Order } from '../../support/reaction-order-work.ts';

/**
 * Held-out recall: work generated with one known slip (test/support/reaction-order-work.ts, which
 * computes the student's numbers by its own spreadsheet steps, apart from the checker), on seeds from
 * 5001 up; the checker's thresholds were set on seeds 1 to 200. A slip counts as recalled when a
 * finding that costs points names it; a slip that moves no reported number by more than 3 % cannot
 * be seen in the numbers and is left out (the generator says which). Correct work is never charged,
 * and the stoichiometric k/2 is named in a note, never charged.
 */
const SEEDS = 150;
const FIRST_SEED = 5001;

const check = (settings: Record<string, unknown>, submission: unknown) => checkSubmission({ kind: reactionOrder, settings: reactionOrder.settingsSchema.parse(settings) }, submission);

describe('held-out recall of each slip on generated work (runs over two half-lives, noise 1 % of the first reading)', () => {
  for (const slip of CHARGED_SLIPS) {
    it(`${slip}: named and charged in at least 97 %`, () => {
      let seen = 0;
      let named = 0;
      for (let seed = FIRST_SEED; seed < FIRST_SEED + SEEDS; seed++) {
        const orders = ordersFor(slip);
        const work = generateWork({ order: orders[seed % orders.length], slip, seed });
        if (!work.visible) continue;
        seen++;
        const result = check(work.settings, work.submission);
        // An order charged is one the refit calls not supported.
        if (slipNamed(result.findings, slip) && (slip !== 'order-not-supported' || (result.refit as Refit).orderVerdict === 'not-supported')) named++;
      }
      console.log(`recall ${slip}: ${named}/${seen} = ${((100 * named) / seen).toFixed(1)} %`);
      expect(seen).toBeGreaterThanOrEqual(SEEDS * 0.8);
      expect(named / seen).toBeGreaterThanOrEqual(0.97);
    });
  }

  it('correct work is charged nothing, and k/2 by the 2A → P convention is named in a note, never charged', () => {
    for (let seed = FIRST_SEED; seed < FIRST_SEED + SEEDS; seed++) {
      const clean = generateWork({ order: (seed % 3) as Order, slip: 'none', seed });
      expect(check(clean.settings, clean.submission).findings.filter((f) => f.pointsLost > 0)).toEqual([]);
      const half = generateWork({ order: (seed % 3) as Order, slip: 'stoichiometric-k', seed });
      const result = check(half.settings, half.submission);
      expect(result.findings.filter((f) => f.pointsLost > 0)).toEqual([]);
      expect(result.findings.map((f) => f.code)).toContain('stoichiometric-k');
    }
  });
});

describe('the order named on generated runs', () => {
  it('is right on at least 99 % of runs covering two half-lives with noise of 1 % of the initial signal', () => {
    for (const order of [0, 1, 2] as const) {
      let right = 0;
      for (let seed = FIRST_SEED; seed < FIRST_SEED + 2 * SEEDS; seed++) {
        const work = generateWork({ order, slip: 'none', seed });
        const refit = check(work.settings, work.submission).refit as Refit;
        if (refit.order === order && refit.orderVerdict === 'supported') right++;
      }
      console.log(`order ${order} named right: ${right}/${2 * SEEDS} = ${((100 * right) / (2 * SEEDS)).toFixed(1)} %`);
      expect(right / (2 * SEEDS)).toBeGreaterThanOrEqual(0.99);
    }
  });

  it('is left open, with the reason, where no run covers a half-life', () => {
    for (let seed = FIRST_SEED; seed < FIRST_SEED + 30; seed++) {
      const work = generateWork({ order: (seed % 3) as Order, slip: 'none', seed, halfLives: 0.6 });
      const result = check(work.settings, work.submission);
      const refit = result.refit as Refit;
      expect(refit.order).toBeNull();
      expect(refit.orderReason).toMatch(/too little of the reaction/);
      expect(refit.orderVerdict).toBe('undetermined');
      // Nothing to grade the order against: the item is left out, and nothing is charged for it.
      expect(result.items?.map((i) => i.item)).not.toContain('order');
      expect(result.findings.filter((f) => f.pointsLost > 0)).toEqual([]);
    }
  });
});
