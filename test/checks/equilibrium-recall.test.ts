import { describe, expect, it } from 'vitest';
import type { CheckResult } from '../../schemas/result.ts';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { isFound } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { earlyEndCase, equilibriumCase, equilibriumSlipCodes } from '../../kinds/first-order-catalysis/demo/equilibrium-slips.ts';

/**
 * Recall of the equilibrium block's diagnoses on generated, held-out submissions (invented data, see
 * the generator): for each slip, the share of 100 seeded submissions whose result holds every finding
 * the slip's definition says it must cause (the generator declares where it made the slip; the
 * verdict, a finding of that cause at that place, is the slip's definition). Clean work: no error.
 * And a run whose end value was read early is signalled by its K.
 */
const CASES = 100;
const MIN_RECALL = 0.97;
const CLEAN = 200;
const SHOWN = 3;

const foundList = (result: CheckResult): string =>
  result.status === 'rejected'
    ? `rejected: ${(result.rejected ?? []).map((r) => `${r.path}: ${r.message}`).join('; ')}`
    : result.findings.filter((f) => f.code !== 'carried-forward').map((f) => `${f.code}@${f.path}`).join(', ') || '(none)';

describe('equilibrium diagnoses on generated submissions', () => {
  it.each(equilibriumSlipCodes)('%s: every expected finding in at least 97 of 100 submissions', (code) => {
    const failures: string[] = [];
    for (let seed = 0; seed < CASES; seed++) {
      const { settings, submission, expected } = equilibriumCase(code, seed);
      expect(expected.length).toBeGreaterThan(0);
      const result = checkSubmission(parseAssignment(settings), submission);
      if (!expected.every((e) => isFound(e, result.findings))) failures.push(`  seed ${seed}: expected ${expected.map((e) => `${e.code}@${e.path}`).join(', ')}\n    found ${foundList(result)}`);
    }
    const recall = 1 - failures.length / CASES;
    console.log(`recall ${code}: ${recall.toFixed(2)} (${CASES - failures.length}/${CASES})`);
    if (recall < MIN_RECALL) console.log(failures.slice(0, SHOWN).join('\n'));
    expect(recall).toBeGreaterThanOrEqual(MIN_RECALL);
  });

  it('clean submissions: none rejected, none with an error finding or a K signal', () => {
    const bad: string[] = [];
    let apart = 0;
    for (let seed = 0; seed < CLEAN; seed++) {
      const { settings, submission } = equilibriumCase(undefined, seed);
      const result = checkSubmission(parseAssignment(settings), submission);
      if (result.status === 'rejected' || result.findings.some((f) => f.severity === 'error')) bad.push(`  seed ${seed}: ${foundList(result)}`);
      if (result.score !== result.maxScore) bad.push(`  seed ${seed}: score ${result.score}/${result.maxScore}`);
      if (result.signals?.some((s) => s.code === 'constant-apart')) apart++;
    }
    console.log(`clean: ${bad.length}/${CLEAN} with an error or points lost, ${apart}/${CLEAN} with a K signal`);
    if (bad.length) console.log(bad.slice(0, SHOWN).join('\n'));
    expect(bad).toEqual([]);
    expect(apart).toBe(0);
  });

  it('a run whose end value was read early is signalled by its K in at least 97 of 100 submissions', () => {
    const missed: string[] = [];
    for (let seed = 0; seed < CASES; seed++) {
      const { settings, submission, run } = earlyEndCase(seed);
      const result = checkSubmission(parseAssignment(settings), submission);
      const signals = (result.signals ?? []).filter((s) => s.code === 'constant-apart');
      if (!signals.some((s) => s.path === `runs[${run}].infinity`)) missed.push(`  seed ${seed}: run ${run}; signals ${signals.map((s) => s.path).join(', ') || 'none'}`);
    }
    const recall = 1 - missed.length / CASES;
    console.log(`early end value signalled: ${recall.toFixed(2)}`);
    if (recall < MIN_RECALL) console.log(missed.slice(0, SHOWN).join('\n'));
    expect(recall).toBeGreaterThanOrEqual(MIN_RECALL);
  });
});
