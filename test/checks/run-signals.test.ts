import { describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { cleanCase } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { gaussian, seededRandom } from '../../server/demo/seeded-random.ts';
import { syntheticReadings } from '../../server/demo/synthetic-run.ts';
import { END_VALUE_P, END_VALUE_SCREEN_MARGIN } from '../../kinds/first-order-catalysis/checks/run-signals.ts';
import { tCriticalTwoSided, tTwoSidedP } from '../../server/engine/student-t.ts';

/** Signals about how a run was measured: never on honest generated work, always on the condition. */
const assignment = parseAssignment({ kind: 'first-order-catalysis', fitModel: 'origin', rubric: { lnF: 0 } });
const times = Array.from({ length: 16 }, (_, t) => t);

/** An invented run, noise 0.003 deg, shown to `places` decimals. */
function run(seed: number, x0: number, xInf: number, places = 3) {
  const xs = syntheticReadings({ k: 0.05, x0, xInf, times, noise: 0.003, random: seededRandom(seed) }).map((x) => Number(x.toFixed(places)));
  return { label: 'A', catalyst: { value: 0.1, unit: 'M' }, timeUnit: 'min', readings: times.map((t, i) => [t, xs[i]]), infinity: xInf };
}
const signalsOf = (r: object) => checkSubmission(assignment, { studentId: 'G-01', runs: [r] }).signals ?? [];

describe('measurement signals', () => {
  it('are raised on no honest generated submission (300, every assignment variant)', () => {
    let signalled = 0;
    for (let seed = 0; seed < 300; seed++) {
      const { settings, submission } = cleanCase(seed);
      if ((checkSubmission(parseAssignment(settings), submission).signals ?? []).length > 0) signalled++;
    }
    console.log(`honest: ${signalled} of 300 submissions with a signal`);
    expect(signalled).toBe(0);
  });

  it('name readings written more finely than the display (computed values), with the count', () => {
    for (let seed = 0; seed < 20; seed++) {
      expect(signalsOf(run(seed, 22.4, 10.5, 6))).toEqual([expect.objectContaining({ code: 'over-resolution', path: 'runs[0].readings', evidence: expect.objectContaining({ readingsOffStep: expect.any(Number), displayStep: 0.001 }) })]);
    }
    expect(signalsOf(run(1, 22.4, 10.5))).toEqual([]);
  });

  it('name a run whose readings move too few display steps for k to be known to 5 %', () => {
    // An amplitude of 0.03 deg, a change of about 0.016 deg over the run: some 16 display steps. Every seed of 20.
    for (let seed = 0; seed < 20; seed++) {
      const signals = signalsOf(run(seed, 10.53, 10.5));
      expect(signals.map((s) => s.code)).toEqual(['small-change']);
      expect(signals[0].evidence.relativeStandardError).toBeGreaterThan(0.05);
      expect(signals[0].evidence.displaySteps).toBeLessThan(200);
    }
  });

  /** A run read from a curve f(t) with noise 0.003 deg, shown to 0.001 deg. */
  const curve = (seed: number, f: (t: number) => number, infinity: number) => {
    const random = seededRandom(seed);
    const xs = times.map((t) => Number((f(t) + 0.003 * gaussian(random)).toFixed(3)));
    return { label: 'A', catalyst: { value: 0.1, unit: 'M' }, timeUnit: 'min', readings: times.map((t, i) => [t, xs[i]]), infinity };
  };
  const codesOf = (r: object) => signalsOf(r).map((s) => s.code);

  it('name residuals that run in a pattern: second-order data fitted as first order, every seed of 20', () => {
    for (let seed = 0; seed < 20; seed++) {
      const signals = signalsOf(curve(seed, (t) => 10.5 + 12 / (1 + 0.15 * t), 10.5));
      const pattern = signals.find((s) => s.code === 'residual-pattern');
      expect(pattern).toEqual(expect.objectContaining({ path: 'runs[0].readings' }));
      expect(pattern?.evidence.pValue).toBeLessThan(1e-4);
      expect(pattern?.evidence.durbinWatson).toBeLessThan(1);
    }
  });

  it('name an instrument still warming up (0.3 deg settling over the first minutes) by its pattern or its end value, every seed of 20', () => {
    for (let seed = 0; seed < 20; seed++) {
      const codes = codesOf(curve(seed, (t) => 10.5 + 12 * Math.exp(-0.08 * t) - 0.3 * Math.exp(-t / 2.5), 10.5));
      expect(codes.some((c) => c === 'residual-pattern' || c === 'end-value')).toBe(true);
    }
  });

  it('name an end value read an hour after the start (a sixth of the change still to come), with both rate constants', () => {
    const early = Number((10.5 + 12 * Math.exp(-0.03 * 60)).toFixed(3));
    for (let seed = 0; seed < 20; seed++) {
      const signals = signalsOf(curve(seed, (t) => 10.5 + 12 * Math.exp(-0.03 * t), early));
      expect(signals).toEqual([expect.objectContaining({ code: 'end-value', path: 'runs[0].infinity' })]);
      const { evidence } = signals[0];
      expect(evidence.recordedEndValue).toBe(early);
      // The readings' own end value is the true one to within four of its standard errors.
      expect(Math.abs(evidence.readingsEndValue - 10.5)).toBeLessThan(4 * evidence.readingsEndValueSE);
      expect(evidence.kWithReadings).toBeCloseTo(0.03, 2);
      // An end value too close to the readings makes the run look faster.
      expect(evidence.kWithRecorded).toBeGreaterThan(1.2 * evidence.kWithReadings);
      expect(signals[0].message).toContain('cancels in F');
    }
  });

  it('screen the end value by t alone only where p cannot be under the threshold, and not much further', () => {
    // p from Student's t distribution function (@stdlib/stats-base-dists-t-cdf, a reference library).
    for (const dof of [1, 2, 3, 5, 10, 13, 30, 100, 120, 121, 1000, 1e6]) {
      const screen = tCriticalTwoSided(END_VALUE_P, dof) * (1 - END_VALUE_SCREEN_MARGIN);
      expect(tTwoSidedP(screen, dof)).toBeGreaterThanOrEqual(END_VALUE_P);
      expect(tTwoSidedP(screen, dof)).toBeLessThan(1.000001 * END_VALUE_P);
    }
  });

  it('do not name a constant zero offset of the instrument: it cancels in F (common practice, no source)', () => {
    for (let seed = 0; seed < 20; seed++) {
      const f = (t: number) => 10.5 + 12 * Math.exp(-0.08 * t);
      expect(codesOf(curve(seed, (t) => f(t) + 0.5, 11))).toEqual([]);
      const k = (r: object) => (checkSubmission(assignment, { studentId: 'G-04', runs: [r] }).refit as { runs: { k: { instructor: { value: number } } }[] }).runs[0].k.instructor.value;
      expect(k(curve(seed, (t) => f(t) + 0.5, 11))).toBeCloseTo(k(curve(seed, f, 10.5)), 12);
    }
  });

  it('name runs recorded further apart in temperature than the assignment allows, and runs without one where it is asked', () => {
    const at = (seed: number, label: string, temperatureC?: number) => ({ ...run(seed, 22.4, 10.5), label, ...(temperatureC === undefined ? {} : { temperatureC }) });
    const check = (settings: object, runs: object[]) => checkSubmission(parseAssignment({ kind: 'first-order-catalysis', fitModel: 'origin', rubric: { lnF: 0 }, ...settings }), { studentId: 'G-02', runs }).signals ?? [];
    expect(check({}, [at(1, 'A', 25.0), at(2, 'B', 25.4), at(3, 'C', 24.8)])).toEqual([]);
    const spread = check({}, [at(1, 'A', 25.0), at(2, 'B', 27.5), at(3, 'C', 24.8)]);
    expect(spread).toEqual([expect.objectContaining({ code: 'temperature-spread', path: 'runs', evidence: { spread: expect.closeTo(2.7, 12), maxSpread: 1, lowest: 24.8, highest: 27.5 } })]);
    expect(spread[0].message).toContain('run "C" at 24.8 degC, run "B" at 27.5 degC');
    expect(check({ temperature: { maxSpread: 3 } }, [at(1, 'A', 25.0), at(2, 'B', 27.5)])).toEqual([]);
    expect(check({}, [at(1, 'A', 25.0), at(2, 'B')])).toEqual([]);
    expect(check({ temperature: { required: true } }, [at(1, 'A', 25.0), at(2, 'B')])).toEqual([expect.objectContaining({ code: 'temperature-missing', evidence: { missing: 1, runs: 2 } })]);
  });

  it('name readings whose last displayed digit takes at most five values (rounded to 0.002 or 0.005), over 40 readings or more', () => {
    const roundedTo = (r: ReturnType<typeof run>, step: number) => ({ ...r, readings: r.readings.map(([t, x]) => [t, Number((Math.round(Number(x) / step) * step).toFixed(3))]) });
    const submit = (runs: object[]) => checkSubmission(assignment, { studentId: 'G-03', runs }).signals ?? [];
    for (let seed = 0; seed < 20; seed++) {
      const runs = [0, 1, 2].map((i) => run(10 * seed + i, 22.4 - i, 10.5));
      expect(submit(runs)).toEqual([]);
      for (const step of [0.002, 0.005]) {
        const signals = submit(runs.map((r) => roundedTo(r, step)));
        expect(signals).toEqual([expect.objectContaining({ code: 'digit-preference', path: 'runs', evidence: { readings: 48, digitsUsed: expect.any(Number) } })]);
        expect(signals[0].evidence.digitsUsed).toBeLessThanOrEqual(step === 0.002 ? 5 : 2);
      }
      // Two runs (32 readings) are too few to tell a preference from chance.
      expect(submit(runs.slice(0, 2).map((r) => roundedTo(r, 0.005)))).toEqual([]);
    }
  });
});
