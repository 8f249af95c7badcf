import { describe, expect, it } from 'vitest';
import type { Finding, RubricCount } from '../../schemas/result.ts';
import { LatePolicy } from '../../schemas/common.ts';
import { scoredResult } from '../../server/checks/scored-result.ts';
import { overrideLimit } from '../../server/checks/rubric-books.ts';
import { applyLatePolicy } from '../../server/grading/late-policy.ts';
import { effectiveResult } from '../../server/grading/effective-result.ts';
import type { OverrideRow, ResultRow } from '../../server/store/submissions.ts';
import { rubricLinesOf } from '../../reports/feedback/rubric-lines.ts';
import { Settings as CatalysisSettings } from '../../kinds/first-order-catalysis/schemas.ts';
import { Settings as TemperatureSettings } from '../../kinds/temperature-dependence/schemas.ts';
import { Settings as OrderSettings } from '../../kinds/reaction-order/schemas.ts';
import { Settings as DecaySettings } from '../support/decay-runs/schemas.ts';

// Five runs, k worth 2 points each: a maximum of 10 (hand-worked).
const ITEMS: RubricCount[] = [{ item: 'k', count: 5, each: 2 }];
const kFinding = (run: number, points: number, code = 'unexplained'): Finding => ({
  id: `${code}@runs[${run}].reported.k`,
  code,
  stage: 'run',
  path: `runs[${run}].reported.k`,
  severity: 'error',
  pointsLost: points,
  rubricItem: 'k',
  itemKey: `k@runs[${run}]`,
  message: 'k differs from the refit',
});
const checked = (findings: Finding[]) => ({ ...scoredResult('S-1', ITEMS, findings, {}, []), engineVersion: 'test' });
const DEDUCT_2 = { policy: 'deduct', points: 2 } as const;

function storedRow(result: ReturnType<typeof checked>): ResultRow {
  return { resultId: 1, submissionId: 1, engineVersion: 'test', settingsVersion: 1, status: 'checked', score: result.score, maxScore: result.maxScore, findings: { findings: result.findings, rejected: [], items: result.items, signals: [] }, releasedAt: null, gradedAt: new Date(0), settings: null, refit: null } as ResultRow;
}
const override = (findingId: string, before: number, after: number): OverrideRow => ({ id: 1, submissionId: 1, findingId, pointsBefore: before, pointsAfter: after, reason: 'accepted a late excuse', reasonShown: false, by: 'ta', at: new Date(0) });

describe('the late policy applied to a checked result (hand-worked verdicts)', () => {
  const eightOfTen = checked([kFinding(0, 2)]);

  it('takes the points off a late submission under deduct: 8/10 less 2 is 6/10, the maximum unchanged', () => {
    expect([eightOfTen.score, eightOfTen.maxScore]).toEqual([8, 10]);
    const late = applyLatePolicy(eightOfTen, DEDUCT_2, true);
    expect([late.score, late.maxScore]).toEqual([6, 10]);
    const added = late.findings.filter((f) => f.code === 'late-submission');
    expect(added).toHaveLength(1);
    expect(added[0]).toMatchObject({ pointsLost: 2, stage: 'handing-in', severity: 'error' });
    expect(added[0].message).toContain('Submitted after the deadline');
  });

  it('never takes the score below 0: 1/10 less 2 is 0/10, the finding costing the 1 point left', () => {
    const oneOfTen = checked([kFinding(0, 2), kFinding(1, 2), kFinding(2, 2), kFinding(3, 2), kFinding(4, 1)]);
    expect(oneOfTen.score).toBe(1);
    const late = applyLatePolicy(oneOfTen, DEDUCT_2, true);
    expect([late.score, late.maxScore]).toEqual([0, 10]);
    expect(late.findings.find((f) => f.code === 'late-submission')?.pointsLost).toBe(1);
  });

  it('leaves a submission on time, and late work under grade or hold, as checked', () => {
    expect(applyLatePolicy(eightOfTen, DEDUCT_2, false)).toEqual(eightOfTen);
    expect(applyLatePolicy(eightOfTen, { policy: 'grade', points: 0 }, true)).toEqual(eightOfTen);
    expect(applyLatePolicy(eightOfTen, { policy: 'hold', points: 3 }, true)).toEqual(eightOfTen);
  });

  it('leaves a rejected result alone (no score to take from)', () => {
    const rejected = { studentId: 'S-1', status: 'rejected' as const, score: null, maxScore: 0, refit: null, findings: [], rejected: [{ path: 'runs', message: 'at least one run' }], engineVersion: 'test' };
    expect(applyLatePolicy(rejected, DEDUCT_2, true)).toEqual(rejected);
  });

  it('charges a carried-forward error once, and the late points on top: 10 − 2 − 2 = 6', () => {
    // Two findings on run 0's k instance asking 2 each: the instance is worth 2, so 2 in all (hand-worked).
    const twice = checked([kFinding(0, 2), kFinding(0, 2, 'carried-forward')]);
    expect(twice.score).toBe(8);
    expect(applyLatePolicy(twice, DEDUCT_2, true).score).toBe(6);
  });

  it('applied again, replaces its finding rather than doubling it', () => {
    const late = applyLatePolicy(eightOfTen, DEDUCT_2, true);
    const again = applyLatePolicy(late, { policy: 'deduct', points: 3 }, true);
    expect(again.score).toBe(5);
    expect(again.findings.filter((f) => f.code === 'late-submission')).toHaveLength(1);
  });

  it('shows on the rubric rows as points off the score, the Lost column adding up to 10 − 6', () => {
    const lines = rubricLinesOf(applyLatePolicy(eightOfTen, DEDUCT_2, true), { k: 'k' });
    expect(lines.map((l) => [l.label, l.available, l.lost])).toEqual([['k', 10, 2], ['Late work, off the score', 0, 2]]);
    expect(lines.reduce((sum, l) => sum + l.lost, 0)).toBe(4);
  });

  it('lets a TA override the late finding like any other: to 0 gives 8/10 back, to 1 gives 7/10', () => {
    const late = applyLatePolicy(eightOfTen, DEDUCT_2, true);
    const id = late.findings.find((f) => f.code === 'late-submission')!.id;
    // The most it may cost: the 8 points the items' findings left (hand-worked).
    expect(overrideLimit(late.items, late.maxScore, late.findings, id)).toBe(8);
    expect(effectiveResult(storedRow(late), []).score).toBe(6);
    expect(effectiveResult(storedRow(late), [override(id, 2, 0)]).score).toBe(8);
    expect(effectiveResult(storedRow(late), [override(id, 2, 1)]).score).toBe(7);
    // An item's finding overridden to 0: 10 − 0 − 2 = 8, the late points still taken.
    expect(effectiveResult(storedRow(late), [override(kFinding(0, 2).id, 2, 0)]).score).toBe(8);
    expect(overrideLimit(late.items, late.maxScore, late.findings, kFinding(0, 2).id)).toBe(2);
  });
});

describe('the late policy in the settings', () => {
  it('reads settings stored before it as graded as usual (common practice, no source: old rows keep their meaning)', () => {
    const stored = [CatalysisSettings.parse({ kind: 'first-order-catalysis', fitModel: 'intercept' }), TemperatureSettings.parse({ kind: 'temperature-dependence' }), DecaySettings.parse({ kind: 'decay-runs' })];
    for (const settings of stored) expect(settings.late).toEqual({ policy: 'grade', points: 0 });
  });

  it('refuses deduct with 0 points, naming late.points', () => {
    const parsed = CatalysisSettings.safeParse({ kind: 'first-order-catalysis', fitModel: 'origin', late: { policy: 'deduct', points: 0 } });
    expect(parsed.success).toBe(false);
    expect(parsed.error?.issues.map((i) => i.path.join('.'))).toEqual(['late.points']);
    expect(LatePolicy.safeParse({ policy: 'hold', points: 0 }).success).toBe(true);
    expect(LatePolicy.safeParse({ policy: 'deduct', points: -1 }).success).toBe(false);
  });

  it('is part of every kind’s settings', () => {
    for (const schema of [CatalysisSettings, TemperatureSettings, OrderSettings, DecaySettings]) expect(Object.keys(schema.shape)).toContain('late');
  });
});
