import { describe, expect, it } from 'vitest';
import { seededRandom } from '../../../server/demo/seeded-random.ts';
import { Settings, Submission } from '../../../kinds/reaction-order/schemas.ts';
import { reactionOrderDemo } from '../../../kinds/reaction-order/demo/demo-assignment.ts';
import { fitLinearLaw } from '../../../kinds/reaction-order/integrated-laws.ts';
import { orderSubmission, orderSlips, slipPlace, slipsFor, type OrderSlip, type TrueRun } from '../../../kinds/reaction-order/demo/submission-generator.ts';

const settings = Settings.parse(reactionOrderDemo.settings);
const concentration = Settings.parse({ kind: 'reaction-order', signal: { type: 'concentration', unit: 'M' } });

/** The same student (same seed, so the same readings) clean and with a slip. */
function pair(slip: OrderSlip, truth: TrueRun = { order: 2 }, on = settings): [Submission, Submission] {
  return [orderSubmission(seededRandom(7), on, 'S-1', truth), orderSubmission(seededRandom(7), on, 'S-1', truth, slip)];
}
const k = (s: Submission) => Number(s.reported.k.value);
const halfLives = (s: Submission) => s.runs.map((r) => Number(r.reported!.halfLife!.value));

describe('the straight-line fit the demo’s students make (the kind’s own)', () => {
  // Two runs, a common slope and an intercept each, by numpy 2.4.6 lstsq on the same numbers.
  const t = [0, 5, 10, 15];
  const runs = [
    { t, c: [1.0e-4, 7.9e-5, 6.6e-5, 5.6e-5] },
    { t, c: [6.0e-5, 5.2e-5, 4.7e-5, 4.2e-5] },
  ];
  it('gives the pooled slope of 1/[A] and its SE as numpy does', () => {
    const fit = fitLinearLaw(2, runs, 'M^-1 min^-1').k;
    expect(fit.value).toBeCloseTo(495.39113817325597, 9);
    expect(fit.standardError).toBeCloseTo(13.452273426558744, 9);
  });
  it('and of ln [A], k minus the slope', () => {
    const fit = fitLinearLaw(1, runs, 'min^-1').k;
    expect(fit.value).toBeCloseTo(0.030903695448870394, 14);
    expect(fit.standardError).toBeCloseTo(0.003546972286452757, 14);
  });
});

describe('the demo’s slips change what the student reports as worked by hand', () => {
  it('every generated submission is one the schema takes, with the demo’s two runs of 13 readings', () => {
    const { submissions, slipped: made } = reactionOrderDemo.section(Array.from({ length: 24 }, (_, i) => `B-${i + 1}`));
    for (const s of submissions) expect(Submission.safeParse(s).success).toBe(true);
    expect(submissions[0].runs.map((r) => r.readings.length)).toEqual([13, 13]);
    // Every second student, one slip each, in turn: the 12 slips a second-order absorbance run can show.
    expect([...made.values()].flat()).toEqual(slipsFor(settings, 2));
  });

  it('the stoichiometric convention halves k and its SE and leaves the half-lives', () => {
    const [clean, slipped] = pair('stoichiometric-k');
    expect(k(slipped) / k(clean)).toBeCloseTo(0.5, 2);
    expect(halfLives(slipped)).toEqual(halfLives(clean));
  });

  it('leaving out a path length of 0.5 cm doubles a second-order k: [A] read as l times too small, 1/[A] 1/l too large', () => {
    const [clean, slipped] = pair('path-length');
    expect(k(slipped) / k(clean)).toBeCloseTo(2, 2);
  });

  it('[A] in mM divides a second-order k by 1000 and multiplies a zero-order one by 1000', () => {
    const [clean, slipped] = pair('concentration-unit');
    expect(k(slipped) / k(clean)).toBeCloseTo(1e-3, 5);
    const [clean0, slipped0] = pair('concentration-unit', { order: 0, coverage: 1.6 }, concentration);
    expect(k(slipped0) / k(clean0)).toBeCloseTo(1000, -1);
  });

  it('log10 for ln divides a first-order k by ln 10 = 2.302585', () => {
    const [clean, slipped] = pair('log-base', { order: 1 });
    expect(k(clean) / k(slipped)).toBeCloseTo(Math.LN10, 2);
  });

  it('the sign, the time unit and the unit of another order keep the number and change its sign or unit', () => {
    const [clean, flipped] = pair('sign-flipped');
    expect(k(flipped)).toBe(-k(clean));
    const [, seconds] = pair('time-unit');
    expect([k(seconds), seconds.reported.k.unit]).toEqual([k(clean), 'M^-1 s^-1']);
    const [, unit] = pair('k-unit-order');
    expect([k(unit), unit.reported.k.unit]).toEqual([k(clean), 'min^-1']);
  });

  it('the order-0 half-life formula on a second-order run gives [A]_0/(2k) for 1/(k[A]_0): [A]_0²/2 times it', () => {
    const [clean, slipped] = pair('half-life-formula');
    const c0 = (clean.runs[0].readings[0][1] - 0.04) / (2.35e4 * 0.5);
    // Both written to 3 figures: the ratio within 0.2 %.
    expect(halfLives(slipped)[0] / halfLives(clean)[0] / ((c0 * c0) / 2)).toBeCloseTo(1, 2);
  });

  it('a value rounded coarser than its SE, the value itself right', () => {
    const [clean, slipped] = pair('sig-figs');
    expect(Math.abs(k(slipped) - k(clean)) / k(clean)).toBeLessThan(0.01);
    // Written as 7.4e2: the last figure's place is 10^(exponent − figures + 1), above the SE's first figure's place.
    const [mantissa, exponent] = String(slipped.reported.k.value).split('e');
    const lastPlace = Number(exponent) - (mantissa.replace(/[-.]/g, '').length - 1);
    expect(lastPlace).toBeGreaterThan(Math.floor(Math.log10(Number(slipped.reported.k.uncertainty))));
  });

  it('reports another order, with k and half-lives by its law', () => {
    const [, slipped] = pair('order-not-supported');
    expect(slipped.reported.order).toBe(1);
    expect(slipped.reported.k.unit).toBe('min^-1');
    // First order: one half-life for both runs.
    expect(halfLives(slipped)[0]).toBe(halfLives(slipped)[1]);
  });

  it('offers only the slips that change a reported value under the settings and the order', () => {
    expect(slipsFor(settings, 1)).not.toContain('path-length');
    expect(slipsFor(settings, 1)).toContain('log-base');
    expect(slipsFor(settings, 2)).not.toContain('absorptivity-unit');
    // ε in mM^-1 cm^-1 read as M^-1 cm^-1 makes [A] 1000 times too large, as [A] in mM does: one slip to tell, the first kept.
    const inMillimolar = slipsFor(Settings.parse({ ...reactionOrderDemo.settings, signal: { ...settings.signal, molarAbsorptivity: { value: 23.5, unit: 'mM^-1 cm^-1' } } }), 2);
    expect(inMillimolar).toContain('absorptivity-unit');
    expect(inMillimolar).not.toContain('concentration-unit');
    // l = 0.5 cm left out halves a zero-order k: the stoichiometric convention's k, which is right.
    expect(slipsFor(settings, 0)).not.toContain('path-length');
    // A_inf left in shifts [A] by a constant: a zero-order k is unchanged.
    expect(slipsFor(settings, 0)).not.toContain('end-absorbance');
    expect(slipsFor(concentration, 0).filter((s) => ['path-length', 'transmittance', 'absorptivity-unit', 'end-absorbance'].includes(s))).toEqual([]);
    for (const slip of orderSlips) expect(slipPlace[slip]).toMatch(/^(reported\.|runs\[0\])/);
  });

  it('the clean student’s second-order half-lives go as 1/[A]_0: run 2 at 0.6 of run 1’s [A]_0 lasts 1/0.6 as long', () => {
    const clean = orderSubmission(seededRandom(11), settings, 'S-1', { order: 2, noise: 0 });
    const [t1, t2] = halfLives(clean);
    // Readings rounded to 0.001 move [A]_0 by up to 0.1 %.
    expect(t2 / t1).toBeCloseTo(1 / 0.6, 2);
  });
});
