import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { slipPlace, temperatureSlips, temperatureSubmission } from '../../kinds/temperature-dependence/demo/submission-generator.ts';

/** Held-out recall of the temperature-dependence kind: seeds 300000 on, which no test uses, 500 per slip. Printed, never asserted. */
const N = 500;

export function benchTemperatureRecall(): void {
  const assignment = parseAssignment({ kind: 'temperature-dependence' });
  const check = (seed: number, slip?: (typeof temperatureSlips)[number]) => checkSubmission(assignment, temperatureSubmission(seededRandom(seed), 'T-01', slip));
  let clean = 0;
  for (let s = 0; s < N; s++) if (!check(300000 + s).findings.some((f) => f.severity === 'error')) clean++;
  const lines = temperatureSlips.map((slip) => {
    let named = 0;
    for (let s = 0; s < N; s++) {
      const at = check(310000 + s, slip).findings.find((f) => f.path === slipPlace[slip]);
      if (at && (at.code === slip || at.alsoCodes?.includes(slip))) named++;
    }
    return `${slip} ${((100 * named) / N).toFixed(1)} %`;
  });
  console.log(`temperature dependence, held-out recall (${N} each): ${lines.join(', ')}; clean work with no error ${((100 * clean) / N).toFixed(1)} % (targets: >= 97 %, 100 %)`);
}
