import { describe, expect, it } from 'vitest';
import type { CheckResult } from '../../schemas/result.ts';
import { INVENTED_NOTE } from '../../reports/feedback-input.ts';
import { formatNumber } from '../../reports/format.ts';
import { sectionSummary } from '../../kinds/documents.ts';
import { needAttention } from '../../reports/summary/attention.ts';
import { classValues } from '../../kinds/first-order-catalysis/report/class-values.ts';
import { codeCounts } from '../../reports/summary/code-counts.ts';
import { percentBins, spread } from '../../reports/summary/stats.ts';
import { sectionSignals } from '../../kinds/section-signals.ts';
import { GRADED_AT, section } from './fixtures.ts';
import { folded, pdfText } from '../support/pdf-reading.ts';

// An invented section: clean students and one slip each.
const slips = [undefined, undefined, 'log-base', 'concentration-unit', 'sign-flipped', 'suspect-reading', 'missing-value', undefined] as const;
const s = section(21, [...slips], { reference: true });
const results = s.students.map((x) => x.result);
const submissions = s.students.map((x) => x.submission);
// Hand-written: the students whose slip costs points (S-003 to S-005, S-007); the clean ones and the
// suspect reading (S-006, a warning at no cost) do not need attention.
const NEED_ATTENTION = ['S-003', 'S-004', 'S-005', 'S-007'];
const header = { course: 'Kinetics laboratory (invented)', section: 'Thursday B', assignment: 'Mutarotation kinetics', gradedAt: GRADED_AT };

describe('section summary figures', () => {
  it('spread: mean, sample SD, median', () => {
    expect(spread([1, 2, 3, 4])).toEqual({ n: 4, mean: 2.5, sd: Math.sqrt(5 / 3), median: 2.5, min: 1, max: 4 });
    expect(spread([])).toBeUndefined();
  });

  it('percent bins: ten bands, 100 % in the last', () => {
    expect(percentBins([0, 0.05, 0.1, 0.95, 1])).toEqual([2, 1, 0, 0, 0, 0, 0, 0, 0, 2]);
  });

  it('counts students per finding code, and lists who needs attention first', () => {
    const counts = codeCounts(results);
    expect(counts.find((c) => c.code === 'log-base')).toMatchObject({ students: 1, asError: 1 });
    const rejected: CheckResult = { ...results[0], studentId: 'S-900', status: 'rejected', score: null, findings: [], refit: null };
    const list = needAttention([...results, rejected]);
    expect(list[0].studentId).toBe('S-900');
    expect(list.map((r) => r.studentId).sort()).toEqual([...NEED_ATTENTION, 'S-900']);
  });

  it('takes k_N and k_A from the refit and, given the submissions, as reported', () => {
    const [kN, kA] = classValues(s.settings, results, submissions);
    expect(kN.refit).toHaveLength(results.length);
    expect(kA.reported).toHaveLength(results.length - 1); // one left k_A out
    expect(kA.band).toEqual({ min: 0.1, max: 0.4 });
    expect(classValues(s.settings, results, undefined)[0].reported).toEqual([]);
  });
});

describe('sectionSummary', () => {
  it('lists the section signals for review, worded as prompts, when they are given', async () => {
    // One student hands in another's readings shifted by a constant.
    const copy = structuredClone(submissions[0]);
    copy.studentId = 'S-099';
    for (const run of copy.runs) run.readings = run.readings.map(([t, x]) => [t, Number((Number(x) + 0.5).toFixed(3))]);
    const all = [...submissions, copy];
    const signals = sectionSignals(s.settings, all);
    expect(signals.pairs.map((p) => p.students)).toEqual([[submissions[0].studentId, 'S-099']]);
    const text = folded(await pdfText(await sectionSummary({ header, settings: s.settings, results, submissions: all, signals })));
    expect(text).toContain('For review: how the data were measured, and patterns across the section');
    expect(text).toContain('No signals about how any student’s runs were measured.');
    expect(text).toContain('not findings: no points depend on them');
    expect(text).toContain(`${submissions[0].studentId} and S-099`);
    expect(text).toContain('shifted by a constant');
    const without = folded(await pdfText(await sectionSummary({ header, settings: s.settings, results, submissions })));
    expect(without).not.toContain('For review');
  });

  it("lists each student's signals about the measurement with their places, even without section signals", async () => {
    const flagged = results.map((r, i) =>
      i === 1 ? { ...r, signals: [{ code: 'end-value' as const, path: 'runs[2].infinity', message: 'm', evidence: {} }, { code: 'temperature-spread' as const, path: 'runs', message: 'm', evidence: {} }] } : r,
    );
    const text = folded(await pdfText(await sectionSummary({ header, settings: s.settings, results: flagged, submissions })));
    expect(text).toContain('For review: how the data were measured');
    expect(text).toContain(`${flagged[1].studentId} end-value (Run “${submissions[1].runs[2].label}”, end value x∞), temperature-spread (All runs)`);
  });

  it('prints the section, the spread of k_A, the codes and the ids needing attention', async () => {
    const pdf = await sectionSummary({ header, settings: s.settings, results, submissions, invented: true });
    const text = folded(await pdfText(pdf));
    expect(text).toContain('Thursday B');
    expect(text).toContain('Score distribution');
    const kA = spread(classValues(s.settings, results, submissions)[1].refit)!;
    expect(text).toContain(formatNumber(kA.mean));
    expect(text).toContain(formatNumber(kA.median));
    expect(text).toContain('0.100 to 0.400');
    for (const code of ['log-base', 'concentration-unit', 'sign-flipped', 'missing-value']) expect(text).toContain(code);
    for (const id of NEED_ATTENTION) expect(text).toContain(id);
    expect(text).toMatch(/⁻¹/);
    expect(text).toContain(INVENTED_NOTE);
  });

  it('works without submissions, and with nothing checked', async () => {
    const text = folded(await pdfText(await sectionSummary({ header, settings: s.settings, results })));
    expect(text).toContain('not given for this summary');
    expect(text).not.toContain(INVENTED_NOTE);
    const none = folded(await pdfText(await sectionSummary({ header, settings: s.settings, results: [] })));
    expect(none).toContain('No submission could be checked.');
  });
});
