import { describe, expect, it } from 'vitest';
import type { Submission } from '../../kinds/first-order-catalysis/schemas.ts';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { checkValue, type ValueCheck } from '../../server/checks/check-value.ts';
import type { DraftFinding } from '../../server/checks/draft-finding.ts';
import { DECIMAL_SHIFT, LOG_BASE, SIGN, TIME_UNIT } from '../../server/checks/explain.ts';
import { firstOrderCauses } from '../../kinds/first-order-catalysis/checks/causes.ts';
import { roundingOf, roundingOfUncertainty } from '../../server/checks/rounding-rule.ts';
import { sigFigProblem } from '../../server/checks/sig-figs.ts';
import { readWritten } from '../../server/checks/written-number.ts';

// The rounding conventions here are common practice, no source: a value is given to the decimal
// place of its standard error's first or second significant figure; a number rounded to a place
// lies within half a unit of that place of the number it came from; an integer's trailing zeros
// (880) do not say whether they are significant. Every expected verdict below is worked by hand.

describe('how a reported number is read', () => {
  it('counts the figures and the last place as written', () => {
    // 0.0520: digits 5, 2, 0 after the leading zeros; last digit in the 4th decimal place.
    expect(readWritten('0.0520')).toEqual({ decimals: 4, figures: 3, finest: 4 });
    // The JSON number 0.052 prints as 0.052: 3 places shown, and the zeros it may have lost are unknown.
    expect(readWritten(0.052)).toEqual({ decimals: 3, figures: 2, finest: Number.POSITIVE_INFINITY });
    // 880: the trailing zero only holds the place; the last significant digit is in the tens.
    expect(readWritten('880')).toEqual({ decimals: -1, figures: 2, finest: 0 });
    expect(readWritten(880)).toMatchObject({ decimals: -1, figures: 2 });
    // 8.80e2 says its zero: three figures, to the units.
    expect(readWritten('8.80e2')).toEqual({ decimals: 0, figures: 3, finest: 0 });
    // 1.069e-4 as JSON prints so: 4 figures, last in the 7th decimal place.
    expect(readWritten(1.069e-4)).toMatchObject({ decimals: 7, figures: 4 });
    expect(readWritten('-0.014')).toEqual({ decimals: 3, figures: 2, finest: 3 });
  });

  it('counts no trailing zero of an integer as significant, as a string or as a number', () => {
    expect(sigFigProblem('12340', '880')).toBeUndefined();
    expect(sigFigProblem(12340, 880)).toBeUndefined();
    // 885 has three figures that all count.
    expect(sigFigProblem(12340, 885)).toMatchObject({ problem: 'uncertainty-digits' });
    // 12345 ± 880: the value goes to the units, the uncertainty only to the tens.
    expect(sigFigProblem(12345, 880)).toMatchObject({ problem: 'value-over-precise' });
  });

  it('rests no finding on zeros a JSON number may have lost; a string keeps its digits', () => {
    // 0.05 ± 0.003 sent as numbers: the value may have been written 0.050, so nothing is said.
    expect(sigFigProblem(0.05, 0.003)).toBeUndefined();
    // Written "0.05", it stops at the hundredths, before the thousandths of its uncertainty.
    expect(sigFigProblem('0.05', 0.003)).toMatchObject({ problem: 'value-under-precise' });
    // One-figure 0.0003 may have been 0.00030 as a number: 0.0521 to four places is then no excess.
    expect(sigFigProblem(0.05213, 0.0003)).toBeUndefined();
    expect(sigFigProblem(0.052134, 0.0003)).toMatchObject({ problem: 'value-over-precise' });
  });
});

/** One value checked on its own: 2 % relative tolerance, as for k_N and k_A by default. */
function judge(over: Partial<ValueCheck> & Pick<ValueCheck, 'reported' | 'expected'>): { kind: string; drafts: DraftFinding[] } {
  const drafts: DraftFinding[] = [];
  const outcome = checkValue(
    { what: 'k_N', path: 'reported.kN', stage: 'rate-law', rubricItem: 'kN', itemKey: 'kN', charge: 2, unit: 'min^-1', factors: [], causes: firstOrderCauses, tolerance: { relative: 0.02 }, ...over },
    drafts,
  );
  return { kind: outcome.kind, drafts };
}

describe('a value rounded correctly is right', () => {
  it('k_N 0.00011 ± 0.00058 from the student\'s own 1.069e-4 is carried forward: |0.00011 - 0.0001069| = 3.1e-6 is within half of 1e-5', () => {
    const r = judge({ reported: 0.00011, expected: 0.02, carriedForward: { value: 1.069e-4, from: 'your own k_obs values' }, rounding: roundingOf(0.00011, 0.00058, undefined, 1) });
    expect(r.kind).toBe('carried-forward');
    expect(r.drafts.map((d) => d.code)).toEqual(['carried-forward']);
  });

  it('k_N -0.014 ± 0.022 from -0.01352: the difference 0.00048 is within half of 0.001', () => {
    const r = judge({ reported: -0.014, expected: 0.0186, carriedForward: { value: -0.01352, from: 'your own k_obs values' }, rounding: roundingOf(-0.014, 0.022, undefined, 1) });
    expect(r.kind).toBe('carried-forward');
  });

  it('k_A 0.3 ± 1.3 from 0.3132: the difference 0.0132 is within half of 0.1, a place finer than the SE\'s first figure (1)', () => {
    const r = judge({ reported: 0.3, expected: 0.2118, carriedForward: { value: 0.3132, from: 'your own k_obs values' }, rounding: roundingOf(0.3, 1.3, undefined, 1) });
    expect(r.kind).toBe('carried-forward');
  });

  it('against our refit too: 0.0003 ± 0.0011 for our 0.00034 (2 % would allow only 0.0000068)', () => {
    expect(judge({ reported: 0.0003, expected: 0.00034, rounding: roundingOf(0.0003, 0.0011, undefined, 1) }).kind).toBe('right');
  });

  it('but not a value off by more than half its last place: 0.00012 for 0.0001069 is 1.3e-5 away', () => {
    const r = judge({ reported: 0.00012, expected: 0.02, carriedForward: { value: 1.069e-4, from: 'your own k_obs values' }, rounding: roundingOf(0.00012, 0.00058, undefined, 1) });
    expect(r.kind).toBe('unexplained');
  });

  it('a value rounded more coarsely than its SE\'s first figure is a significant-figures finding, not a wrong value', () => {
    // 0.011 is 0.01149 rounded to the thousandths, but the SE 0.00003 fixes the value to the 1e-5 place.
    const r = judge({ reported: 0.011, expected: 0.01149, rounding: roundingOf(0.011, 0.00003, undefined, 1) });
    expect(r.kind).toBe('right');
    expect(r.drafts).toEqual([expect.objectContaining({ code: 'sig-figs', detail: 'value-under-precise', rubricItem: 'sigFigs', charge: 1 })]);
  });

  it('measures the place by our SE where the student gives none', () => {
    const r = judge({ reported: 0.011, expected: 0.01149, rounding: roundingOf(0.011, undefined, 0.0004, 0) });
    // Our SE 0.0004 has its first figure in the 4th place; 0.011 stops at the 3rd: a warning (sigFigs worth 0).
    expect(r.drafts).toEqual([expect.objectContaining({ code: 'sig-figs', severity: 'warning', charge: 0 })]);
    expect(judge({ reported: 0.0115, expected: 0.01149, rounding: roundingOf(0.0115, undefined, 0.0004, 0) }).drafts).toEqual([]);
  });

  it('rests no such finding on zeros a JSON number may have lost', () => {
    const tolerance = { relative: 0.001 };
    // Sent as the number 0.011, it may have been written 0.0110: to the 1e-4 place of the SE's first
    // figure, 0.01103 rounds to 0.0110, so the value may be right as written. No finding.
    expect(judge({ reported: 0.011, expected: 0.01103, tolerance, rounding: roundingOf(0.011, 0.0004, undefined, 1) })).toEqual({ kind: 'right', drafts: [] });
    // The string "0.011" says it stops at the thousandths: a finding.
    expect(judge({ reported: 0.011, expected: 0.01103, tolerance, rounding: roundingOf('0.011', 0.0004, undefined, 1) }).drafts.map((d) => d.code)).toEqual(['sig-figs']);
    // 0.01149 to the 1e-4 place is 0.0115, not 0.0110: whatever zeros were lost, the number is too coarse.
    expect(judge({ reported: 0.011, expected: 0.01149, tolerance, rounding: roundingOf(0.011, 0.0004, undefined, 1) }).drafts.map((d) => d.code)).toEqual(['sig-figs']);
    // An integer's trailing zeros likewise: "12000" may be to the units, and 12000.3 rounds to 12000 there.
    expect(judge({ reported: 12000, expected: 12000.3, tolerance: { relative: 1e-6 }, rounding: roundingOf('12000', 8, undefined, 1) })).toEqual({ kind: 'right', drafts: [] });
  });

  it('a value rounded too coarsely keeps at least its first figure: 66.5 written "100" is not 66.5 rounded, 96 is', () => {
    const tolerance = { relative: 0.01 };
    // E_a 66.5 ± 0.22: "100" reads to the hundreds (its zeros are not significant); 66.5 to one figure
    // is 70, so "100" keeps none of its figures and is a wrong value, with no significant-figures finding.
    const wrong = judge({ reported: 100, expected: 66.5, tolerance, rounding: roundingOf('100', 0.22, undefined, 1) });
    expect(wrong.kind).toBe('unexplained');
    expect(wrong.drafts.map((d) => d.code)).toEqual(['unexplained']);
    // 96 to one figure is 100 (9.6 tens round up to 10 tens): a coarse rounding, |100 - 96| = 4 is within half of 10.
    const coarse = judge({ reported: 100, expected: 96, tolerance, rounding: roundingOf('100', 0.22, undefined, 1) });
    expect(coarse.kind).toBe('right');
    expect(coarse.drafts.map((d) => d.code)).toEqual(['sig-figs']);
    // 70 keeps the first figure of 66.5 (to one figure it is 70): a coarse rounding, not a wrong value.
    expect(judge({ reported: 70, expected: 66.5, tolerance, rounding: roundingOf('70', 0.22, undefined, 1) }).drafts.map((d) => d.code)).toEqual(['sig-figs']);
  });

  it('a standard error keeps at least its first figure: 0.000005 is 0.0000054 rounded, 0.00001 is not', () => {
    const tolerance = { relative: 0.25 };
    expect(judge({ reported: 0.000005, expected: 0.0000054, tolerance, rounding: roundingOfUncertainty(0.000005) }).kind).toBe('right');
    expect(judge({ reported: 0.00001, expected: 0.0000054, tolerance, rounding: roundingOfUncertainty(0.00001) }).kind).toBe('unexplained');
  });
});

describe('a slip named by the digits written', () => {
  // k_N of the student's own k_obs 1.0684e-4 ± 0.00057 (the near-zero casebook cases); our refit 1.0681e-4.
  // Written to the 1e-5 place, finer than the SE's first figure (1e-4). The factors are the rate law's for k_N.
  const own = 1.0684e-4;
  const rateLaw = (written: string, se = 0.00057) =>
    judge({ reported: Number(written), expected: 1.0681e-4, carriedForward: { value: own, from: 'your own k_obs values' }, factors: [SIGN, LOG_BASE, ...TIME_UNIT, ...DECIMAL_SHIFT], rounding: roundingOf(written, se, undefined, 2) });
  const code = (r: { drafts: DraftFinding[] }) => r.drafts.map((d) => d.code).join(',');

  it('names the sign reversed for -0.00011: -1.0684e-4 rounded to 1e-5 is -0.00011, and 1.0684e-4 rounded is +0.00011', () => {
    // |-0.00011 + 0.00010684| = 3.16e-6: within half of 1e-5, though not within 2 % of 1.0684e-4 (2.1e-6).
    expect(code(rateLaw('-0.00011'))).toBe('sign-flipped');
  });

  it('names nothing where the slip does not give the digits: -0.00012 is 1.3e-5 from -1.0684e-4', () => {
    expect(code(rateLaw('-0.00012'))).toBe('unexplained');
  });

  it('names nothing by rounding where the value is written more coarsely than its SE: -0.0001 beside an SE of 0.00001', () => {
    // The place 1e-4 is coarser than the SE's first figure (1e-5); -0.0001 is 6.8e-6 from -1.0684e-4, outside 2 %.
    expect(code(rateLaw('-0.0001', 0.00001))).toBe('unexplained');
  });

  it('names a slip for no more values on the 1e-5 grid than the slips\' values rounded there, each keeping its first figure', () => {
    // Worked by hand from 1.0684e-4 (our 1.0681e-4 rounds alike): x(-1) -0.00011; / ln 10 = 4.640e-5 -> +-0.00005;
    // / 10 = 1.068e-5 -> +-0.00001; / 60 = 1.78e-6, / 100, / 1000, / 3600 all round to 0.00000, which keeps no figure
    // of them; x 10 and more lie off the grid. 0.00011 itself is right.
    const named: string[] = [];
    for (let i = -30; i <= 30; i++) {
      const written = (i / 1e5).toFixed(5);
      const r = rateLaw(written);
      if (r.kind === 'explained') named.push(written);
      else if (i !== 11) expect(r.kind, written).toBe('unexplained');
    }
    expect(named.sort()).toEqual(['-0.00001', '-0.00005', '-0.00011', '0.00001', '0.00005']);
  });
});

describe('a k written to two figures', () => {
  // One invented run: x = 10.873 + 10 e^(-0.01149 t) at t = 0..15 min to 0.001, x_inf = 10.873 recorded.
  // With a digit added, x_inf 10.49 gives a k near 0.011 too: two figures of k cannot tell the two apart.
  // The ln F column, worked here as ln((x - x_inf)/(x_0 - x_inf)), is right; k = 0.011 is 0.01149 to 2 figures.
  const infinity = 10.873;
  const readings = Array.from({ length: 16 }, (_, t): [number, number] => [t, Number((infinity + 10 * Math.exp(-0.01149 * t)).toFixed(3))]);
  const y = readings.map(([, x]) => Math.log((x - infinity) / (readings[0][1] - infinity)));
  const lnF = y.map((v) => Number(v.toFixed(4)));
  const submission = (k: number | string, uncertainty: number | string, column = true): Submission => ({
    studentId: 'R-01',
    runs: [{ label: '0.1 M', catalyst: { value: 0.1, unit: 'M' }, timeUnit: 'min', readings, infinity, reported: { ...(column ? { lnF } : {}), k: { value: k, uncertainty, unit: 'min^-1' } } }],
  });
  const assignment = parseAssignment({ kind: 'first-order-catalysis', fitModel: 'origin', rubric: { sigFigs: 1 } });
  // The SE of the slope through the origin, worked here: sqrt(SSE / (n - 1) / sum t^2).
  const t = readings.map(([time]) => time);
  const stt = t.reduce((s, ti) => s + ti * ti, 0);
  const slope = t.reduce((s, ti, i) => s + ti * y[i], 0) / stt;
  const se = Math.sqrt(t.reduce((s, ti, i) => s + (y[i] - slope * ti) ** 2, 0) / (t.length - 1) / stt);
  const se2 = Number(se.toPrecision(2));
  const atK = (s: Submission) => checkSubmission(assignment, s).findings.filter((f) => f.path === 'runs[0].reported.k');

  it('beside a right ln F column is a rounding fault (sig-figs), never a wrong x_inf', () => {
    // Readings to 0.001 fix k to about 1e-6 (the SE): two figures of k are far too few.
    expect(se).toBeLessThan(1e-5);
    const r = checkSubmission(assignment, submission(0.011, se2));
    expect(r.findings.filter((f) => f.path === 'runs[0].reported.k').map((f) => f.code)).toEqual(['sig-figs']);
    expect(r.findings.some((f) => f.code === 'wrong-infinity')).toBe(false);
    // One run and no rate law (one concentration): ln F 1 + k 2 + its SE 1 + rounding 1 = 5, less the 1 for rounding.
    expect(r.maxScore).toBe(5);
    expect(r.score).toBe(4);
  });

  it('without a column, is a rounding fault too: plain rounding gives the value, so no slip is named', () => {
    expect(atK(submission(0.011, se2, false)).map((f) => f.code)).toEqual(['sig-figs']);
  });

  it('a k that no rounding of the refit gives is still judged wrong: 0.0125', () => {
    const found = atK(submission(0.0125, se2)).find((f) => f.code !== 'sig-figs');
    expect(found).toMatchObject({ severity: 'error', pointsLost: 2 });
    expect(found!.code).not.toBe('wrong-infinity');
  });
});
