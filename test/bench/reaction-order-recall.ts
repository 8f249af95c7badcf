import { reactionOrder } from '../../kinds/reaction-order/checks/kind.ts';
import type { Refit } from '../../kinds/reaction-order/schemas.ts';
import { checkSubmission } from '../../server/checks/check.ts';
import { CHARGED_SLIPS, generateWork, ordersFor, slipNamed, type Order } from '../support/reaction-order-work.ts';

/** Held-out recall of the reaction-order kind and the order named: seeds 400000 on, which no test uses, 300 per slip. Printed, never asserted. */
const N = 300;

const check = (work: ReturnType<typeof generateWork>) => checkSubmission({ kind: reactionOrder, settings: reactionOrder.settingsSchema.parse(work.settings) }, work.submission);

export function benchReactionOrderRecall(): void {
  const lines = CHARGED_SLIPS.map((slip) => {
    let seen = 0;
    let named = 0;
    for (let seed = 400000; seed < 400000 + N; seed++) {
      const work = generateWork({ order: ordersFor(slip)[seed % ordersFor(slip).length], slip, seed });
      if (!work.visible) continue;
      seen++;
      if (slipNamed(check(work).findings, slip)) named++;
    }
    return `${slip} ${((100 * named) / seen).toFixed(1)} %`;
  });
  let clean = 0;
  const right = [0, 0, 0];
  for (let seed = 410000; seed < 410000 + N; seed++) {
    const order = (seed % 3) as Order;
    const result = check(generateWork({ order, slip: 'none', seed }));
    if (!result.findings.some((f) => f.pointsLost > 0)) clean++;
    if ((result.refit as Refit).order === order) right[order]++;
  }
  console.log(`reaction order, held-out recall (${N} each, slips that move a number by over 3 %): ${lines.join(', ')}; clean work uncharged ${((100 * clean) / N).toFixed(1)} % (targets: >= 97 %, 100 %)`);
  console.log(`reaction order, order named right on runs over two half-lives with 1 % noise: ${right.map((r, n) => `order ${n} ${((100 * r) / (N / 3)).toFixed(1)} %`).join(', ')} (target >= 99 %)`);
}
