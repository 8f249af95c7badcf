import { describe, expect, it } from 'vitest';
import { renderFeedbackSheet } from '../../../reports/feedback-sheet.ts';
import { renderSectionSummary } from '../../../reports/section-summary.ts';
import type { KindReport } from '../../../reports/kind-report.ts';
import { findingCodes, stages } from '../../../kinds/reaction-order/schemas.ts';
import { reactionOrderReport } from '../../../kinds/reaction-order/report/report.ts';
import { halfLifeRows, valueRows } from '../../../kinds/reaction-order/report/value-rows.ts';
import { classK, classOrders } from '../../../kinds/reaction-order/report/class-values.ts';
import { folded, pdfText } from '../../support/pdf-reading.ts';
import { FADING_SETTINGS } from './report-fixture.ts';
import { sampleStudents } from './report-samples.ts';

/**
 * The figures the sheet prints for the hand-made fading result (report-fixture.ts), each worked by hand
 * from the refit numpy 2.4.6 and scipy 1.17.1 gave: k of order 1 = 0.04539393 ± 0.00018583 min^-1
 * (fit to [A]); order 2, 2918.48 ± 259.43 M^-1 min^-1; [A]_0 of run A 3.01667e-5 M, 83.7 % reacted.
 */
const [clean, secondOrder, wrongUnit, seconds] = sampleStudents();
const kind = { report: reactionOrderReport as unknown as KindReport, stages, findingCodes };

describe('reaction-order values against the refit', () => {
  it('prints k with its SE to two figures and the difference of the reported value', () => {
    const [order, k] = valueRows(FADING_SETTINGS, clean.submission, clean.result.refit!);
    expect(order).toEqual(['Order n', '1', '1', 'same', '—']);
    // 0.04539393 ± 0.00018583 → 0.04539 ± 0.00019; (0.0454 − 0.04539393) / 0.04539393 = +0.0134 %.
    expect(k).toEqual(['k (order 1)', '0.0454 ± 0.0006 min⁻¹', '0.04539 ± 0.00019 min⁻¹', '+0.01 %', '±2 %; SE ±25 %']);
  });

  it('grades k by the order reported and, where the data name another order, also shows that order’s k', () => {
    const rows = valueRows(FADING_SETTINGS, secondOrder.submission, secondOrder.result.refit!);
    expect(rows[0]).toEqual(['Order n', '2', '1', 'differs', '—']);
    // Their k is nearer the 1/[A] line's 6155.32 ± 595.76 than the fit's 2918.48: (6200 − 6155.32) / 6155.32 = +0.726 %.
    expect(rows[1].slice(0, 4)).toEqual(['k (order 2)', '6.2 × 10³ ± 0.5 × 10³ M⁻¹ min⁻¹', '6160 ± 600 M⁻¹ min⁻¹ (line)', '+0.73 %']);
    // M^-1 min^-1 is no unit of a first-order k: no difference against order 1.
    expect(rows[2].slice(0, 4)).toEqual(['k (order 1, the order named)', '6.2 × 10³ ± 0.5 × 10³ M⁻¹ min⁻¹', '0.04539 ± 0.00019 min⁻¹', '—']);
  });

  it('notes an order the data favour only slightly, and says so where they cannot tell', () => {
    const notRuledOut = { ...secondOrder.result.refit!, orderVerdict: 'not-ruled-out' as const };
    expect(valueRows(FADING_SETTINGS, secondOrder.submission, notRuledOut)[0]).toEqual(['Order n', '2', '1 (yours is not ruled out)', 'not ruled out', '—']);
    const open = { ...clean.result.refit!, order: null, k: null, orderReason: 'the runs cover too little', orderVerdict: 'undetermined' as const };
    const rows = valueRows(FADING_SETTINGS, clean.submission, open);
    expect(rows[0]).toEqual(['Order n', '1', 'cannot tell: the runs cover too little', '—', '—']);
    expect(rows).toHaveLength(2);
  });

  it('prints a value whose SE was lost to JSON (null) without one', () => {
    const refit = structuredClone(clean.result.refit!);
    (refit.byOrder[1].nonlinear!.k as { standardError: number | null }).standardError = null;
    // 0.04539393 to 4 figures.
    expect(valueRows(FADING_SETTINGS, clean.submission, refit)[1][2]).toBe('0.04539 min⁻¹');
  });

  it('reads a k in another time unit in the refit’s unit for the difference', () => {
    // 0.0454 s^-1 = 2.724 min^-1; (2.724 − 0.04539393) / 0.04539393 = +5901 %.
    expect(valueRows(FADING_SETTINGS, seconds.submission, seconds.result.refit!)[1][3]).toBe('+5901 %');
  });

  it('prints each run’s half-life against ln 2 / k, with [A]_0 and how much reacted', () => {
    // ln 2 / 0.04539393 = 15.2696 min, SE ln 2 × 0.00018583 / 0.04539393² = 0.0625; (15.3 − 15.2696) / 15.2696 = +0.199 %.
    expect(halfLifeRows(FADING_SETTINGS, clean.submission, clean.result.refit!)).toEqual([
      ['“A”', '3.02 × 10⁻⁵ M', '84 %', '15.3 min', '15.270 ± 0.063 min', '+0.20 %', '±3 %'],
      ['“B”', '1.51 × 10⁻⁵ M', '83 %', '15.3 min', '15.270 ± 0.063 min', '+0.20 %', '±3 %'],
    ]);
    expect(halfLifeRows(FADING_SETTINGS, wrongUnit.submission, wrongUnit.result.refit!)[1].slice(3, 6)).toEqual(['—', '15.270 ± 0.063 min', '—']);
  });

  it('counts the class’s orders and gathers k by order, a k of another order’s unit left out and counted', () => {
    const results = sampleStudents().map((s) => s.result);
    const submissions = sampleStudents().map((s) => s.submission);
    // Every refit names order 1; three students reported 1, one reported 2.
    expect(classOrders(results, submissions)).toEqual({ named: [0, 4, 0, 0], reported: [0, 3, 1], agreeing: 3 });
    const ks = classK(FADING_SETTINGS, results, submissions);
    // No student named or reported order 0: it has no row.
    expect(ks.map((k) => [k.order, k.unit, k.refit.length, k.unreadable])).toEqual([
      [1, 'min^-1', 4, 1],
      [2, 'M^-1 min^-1', 0, 0],
    ]);
    // Reported in order 1: 0.0454 min^-1, and 0.0454 s^-1 = 2.724 min^-1; R-03's M^-1 min^-1 is unreadable there.
    expect(ks[0].reported.map((v) => Number(v.toPrecision(6)))).toEqual([0.0454, 2.724]);
    expect(ks[1].reported).toEqual([6200]);
  });
});

describe('reaction-order documents', () => {
  it('the sheet shows the order, k, each law’s fit, the three plots and the half-lives', async () => {
    const text = folded(await pdfText(await renderFeedbackSheet({ header: { course: 'C', section: 'S', assignment: 'Fading', studentId: 'R-02', version: 1, gradedAt: '2026-12-05T12:00:00Z' }, settings: FADING_SETTINGS, submission: secondOrder.submission, result: secondOrder.result }, kind)));
    for (const phrase of ['Your order and k against the refit', 'Each order’s fit', 'The three integrated laws', 'Order 0: [A] against t', 'Order 1: ln [A] against t', 'Order 2: 1/[A] against t', 'Half-lives', '6160 ± 600 M⁻¹ min⁻¹ (line)', '+0.73 %', '11.4 ± 1.0 min']) expect(text).toContain(phrase);
    // The order-2 line's k (numpy lstsq: 6155.32) and the student's k on the plot of their order.
    expect(text).toContain('refit line: k = 6155 M');
    expect(text).toContain('your k = 6200 M');
    expect(text).toContain('order 2: your order');
    expect(text).toContain('order 1: named by the refit');
  });

  it('the summary counts orders and spreads k by order', async () => {
    const students = sampleStudents();
    const text = folded(
      await pdfText(
        await renderSectionSummary(
          { header: { course: 'C', section: 'S', assignment: 'Fading', gradedAt: '2026-12-05T12:00:00Z' }, settings: FADING_SETTINGS, results: students.map((s) => s.result), submissions: students.map((s) => s.submission) },
          kind,
        ),
      ),
    );
    expect(text).toContain('The class’s order');
    expect(text).toContain('3 of 4 reported the order their data name');
    expect(text).toContain('The class’s k, by order');
    expect(text).toContain('1 reported k left out');
    // The header cuts a long fact with an ellipsis: the signal's must fit whole.
    expect(text).toContain('SIGNAL absorbance, ε 24000 M⁻¹ cm⁻¹ Findings');
  });
});
