import { describe, expect, it } from 'vitest';
import type { CheckResult } from '../../schemas/result.ts';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { cleanCase, isFound, slipCase, slipCodes, type ExpectedFinding } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';

/**
 * Recall of the checker's diagnoses on generated submissions (invented data, see the generator): for
 * each slip, the share of 100 seeded submissions whose result holds every finding the slip must cause.
 * And the false alarms on clean submissions across every assignment variant.
 */
const CASES_PER_SLIP = 100;
const MIN_RECALL = 0.98;
const CLEAN_CASES = 300;
const MAX_CLEAN_ERROR_SHARE = 0.01;
const EXAMPLES_SHOWN = 3;

const foundList = (result: CheckResult): string =>
  result.status === 'rejected'
    ? `rejected: ${(result.rejected ?? []).map((r) => `${r.path}: ${r.message}`).join('; ')}`
    : result.findings.map((f) => `${f.code}${f.alsoCodes ? `+${f.alsoCodes.join('+')}` : ''}@${f.path}${f.detail ? ` (${f.detail})` : ''}`).join(', ') || '(none)';

const expectedList = (expected: ExpectedFinding[]): string =>
  expected.map((e) => `${e.code}@${e.path}${e.detail ? ` (${e.detail})` : ''}`).join(', ');

describe('diagnosis recall on generated submissions', () => {
  it.each(slipCodes)('%s: every expected finding in at least 98 of 100 submissions', (code) => {
    const failures: string[] = [];
    for (let seed = 0; seed < CASES_PER_SLIP; seed++) {
      const { settings, submission, expected } = slipCase(code, seed);
      const result = checkSubmission(parseAssignment(settings), submission);
      if (!expected.every((e) => isFound(e, result.findings))) {
        failures.push(`  seed ${seed}: expected ${expectedList(expected)}\n    found ${foundList(result)}`);
      }
    }
    const recall = 1 - failures.length / CASES_PER_SLIP;
    console.log(`recall ${code}: ${recall.toFixed(2)} (${CASES_PER_SLIP - failures.length}/${CASES_PER_SLIP})`);
    if (recall < MIN_RECALL) console.log(failures.slice(0, EXAMPLES_SHOWN).join('\n'));
    expect(recall).toBeGreaterThanOrEqual(MIN_RECALL);
  });

  it('clean submissions: none rejected, at most 1 % with an error finding', () => {
    let rejected = 0;
    const withError: string[] = [];
    for (let seed = 0; seed < CLEAN_CASES; seed++) {
      const { settings, submission } = cleanCase(seed);
      const result = checkSubmission(parseAssignment(settings), submission);
      if (result.status === 'rejected') rejected++;
      if (result.findings.some((f) => f.severity === 'error')) withError.push(`  seed ${seed}: ${foundList(result)}`);
    }
    const share = withError.length / CLEAN_CASES;
    console.log(`clean: ${rejected}/${CLEAN_CASES} rejected, ${withError.length}/${CLEAN_CASES} (${(100 * share).toFixed(1)} %) with an error finding`);
    if (withError.length > 0) console.log(withError.slice(0, EXAMPLES_SHOWN).join('\n'));
    expect(rejected).toBe(0);
    expect(share).toBeLessThanOrEqual(MAX_CLEAN_ERROR_SHARE);
  });
});
