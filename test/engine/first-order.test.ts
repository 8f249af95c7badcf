import { describe, expect, it } from 'vitest';
import { fitFirstOrderLinear } from '../../server/engine/first-order-linear.ts';
import { fitFirstOrderNonlinear } from '../../server/engine/first-order-nonlinear.ts';
import { firstOrderTransform } from '../../server/engine/first-order-run.ts';
import { fitGuggenheim } from '../../server/engine/guggenheim.ts';
import { fitLine } from '../../server/engine/linear-fit.ts';
import { minutes, syntheticReadings } from '../../server/demo/synthetic-run.ts';
import { thrown } from '../support/thrown.ts';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('a published worked example: sucrose inversion in 0.5 M HCl at 35 C', () => {
  // Source: a textbook-style worked problem on a public chemistry question-and-answer site, as
  // recorded in test/reference/kinetics-check-values.md. t/min = 0..40, rotation/deg below,
  // r_inf = -11.1 deg. The least-squares slope of ln(r_t - r_inf) against t is -8.718e-3 per min
  // [derived there]. The source's own one-interval answer, 8.625e-3 min^-1, was worked with rounded
  // intermediate values (2.303 x 0.03745 / 10); unrounded, (1/10) ln(43.5/39.9) = 8.638e-3 min^-1.
  const run = { times: [0, 10, 20, 30, 40], readings: [32.4, 28.8, 25.5, 22.4, 19.6], infinity: -11.1, timeUnit: 'min' };

  it('the first interval alone gives k = 8.638e-3 min^-1, within 0.2 % of the printed 8.625e-3', () => {
    // -ln F at t = 10 min over 10 min; 0.2 % admits the source's rounded 8.625e-3 (0.15 % below).
    const k = -firstOrderTransform(run, run.infinity).lnF[1] / 10;
    expect(Math.abs(k - 8.638e-3)).toBeLessThan(0.0005e-3); // half a unit of 8.638e-3's last place
    expect(rel(8.625e-3, k)).toBeLessThan(0.002);
  });

  it('the fit of ln F with an intercept gives k = 8.718e-3 min^-1', () => {
    const fit = fitFirstOrderLinear(run, 'intercept');
    expect(fit.k.value).toBeCloseTo(8.718e-3, 6);
    expect(fit.k.unit).toBe('min^-1');
    // exp(intercept) x (r_0 - r_inf) = 43.53 deg [derived in the reference file].
    expect(Math.exp(fit.interceptLnF.value) * 43.5).toBeCloseTo(43.53, 2);
    expect(fit.halfLife.value).toBeCloseTo(Math.LN2 / fit.k.value, 12);
  });

  it('the decadic slope times ln 10 = 2.302585093 (a mathematical constant) gives the same k', () => {
    const t = run.times;
    const log10 = run.readings.map((r) => Math.log10(r - run.infinity));
    const decadic = fitLine(t, log10);
    expect(decadic.slope).toBeCloseTo(-3.786e-3, 6);
    expect(-decadic.slope * 2.302585093).toBeCloseTo(fitFirstOrderLinear(run, 'intercept').k.value, 9);
  });

  it('the Guggenheim method with D = 10 min gives k = 8.16e-3 (only ~30 % of the reaction: poorly conditioned)', () => {
    // 8.16e-3 is derived in the reference file; loose tolerance, as it advises.
    const fit = fitGuggenheim(run, 10);
    expect(fit.pairs).toEqual([[0, 1], [1, 2], [2, 3], [3, 4]]);
    expect(fit.k.value).toBeCloseTo(8.16e-3, 4);
  });
});

describe('noise-free runs: every method returns the rate constant it was made with', () => {
  // Glucose-like run: x_0 = 22.44 deg, x_inf = 10.54 deg (derived example in the reference file),
  // k = 0.05 per min, a reading every minute for 15 minutes.
  const times = minutes(16);
  const spec = { k: 0.05, x0: 22.44, xInf: 10.54, times };
  const run = { times, readings: syntheticReadings(spec), infinity: 10.54, timeUnit: 'min', readingUnit: 'deg' };

  it.each([
    ['linear, through the origin', () => fitFirstOrderLinear(run, 'origin').k.value],
    ['linear, with an intercept', () => fitFirstOrderLinear(run, 'intercept').k.value],
    ['exponential, x_inf fixed', () => fitFirstOrderNonlinear(run, { infinity: 'fixed' }).k.value],
    ['exponential, x_inf fitted', () => fitFirstOrderNonlinear(run, { infinity: 'fitted' }).k.value],
    ['exponential, x_inf fitted, no x_inf measured', () => fitFirstOrderNonlinear({ ...run, infinity: undefined }, { infinity: 'fitted' }).k.value],
    ['Guggenheim', () => fitGuggenheim({ ...run, infinity: undefined }).k.value],
  ])('%s: k to 1e-9 relative', (_, k) => {
    expect(rel(k(), 0.05)).toBeLessThan(1e-9);
  });

  it('the fitted exponential recovers x_0 and x_inf as well', () => {
    const fit = fitFirstOrderNonlinear({ ...run, infinity: undefined }, { infinity: 'fitted' });
    expect(rel(fit.x0.value, 22.44)).toBeLessThan(1e-9);
    expect(rel(fit.infinity.value, 10.54)).toBeLessThan(1e-9);
    expect(fit.x0.unit).toBe('deg');
  });

  it('gives each reading its leverage: between 0 and 1, summing to the number of parameters', () => {
    // The hat matrix J (J'J)^-1 J' is a projection onto the parameters' columns, so its trace is their
    // number (a property of least squares, common practice, no source).
    const sum = (v: number[]) => v.reduce((a, b) => a + b, 0);
    const fitted = fitFirstOrderNonlinear({ ...run, infinity: undefined }, { infinity: 'fitted' });
    expect(sum(fitted.leverages)).toBeCloseTo(3, 9);
    const fixed = fitFirstOrderNonlinear(run, { infinity: 'fixed' });
    expect(sum(fixed.leverages)).toBeCloseTo(2, 9);
    for (const h of fitted.leverages) expect(h).toBeGreaterThan(0);
    for (const h of fitted.leverages) expect(h).toBeLessThan(1);
  });

  it('works for a rise toward x_inf and with times in seconds not starting at zero', () => {
    const t = times.map((m) => 120 + 60 * m);
    const readings = syntheticReadings({ k: 0.05 / 60, x0: 0.2, xInf: 0.9, times: t.map((s) => s - 120) });
    const rise = { times: t, readings, infinity: 0.9, timeUnit: 's' };
    const linear = fitFirstOrderLinear(rise, 'origin');
    expect(rel(linear.k.value, 0.05 / 60)).toBeLessThan(1e-9);
    expect(linear.k.unit).toBe('s^-1');
    expect(rel(fitFirstOrderNonlinear(rise, { infinity: 'fitted' }).k.value, 0.05 / 60)).toBeLessThan(1e-9);
    expect(rel(fitGuggenheim(rise).k.value, 0.05 / 60)).toBeLessThan(1e-9);
  });
});

describe('typed errors', () => {
  const times = minutes(5);
  const good = { times, readings: [20, 18, 16.5, 15.2, 14.1], infinity: 10, timeUnit: 'min' };

  it('a reading on the wrong side of x_inf names the reading, never a NaN', () => {
    const e = thrown(() => firstOrderTransform({ ...good, readings: [20, 18, 9.5, 15.2, 14.1] }, 10));
    expect(e.code).toBe('non-positive-ratio');
    expect(e.field).toBe('readings[2]');
    expect(e.message).toContain('reading 2');
  });
  it('a reading equal to x_inf', () => {
    expect(thrown(() => fitFirstOrderLinear({ ...good, readings: [20, 18, 16.5, 10, 14.1] }, 'origin')).field).toBe('readings[3]');
  });
  it('x_inf equal to x_0', () => {
    expect(thrown(() => fitFirstOrderLinear({ ...good, infinity: 20 }, 'origin')).field).toBe('infinity');
  });
  it('fewer than 3 readings', () => {
    const e = thrown(() => fitFirstOrderLinear({ ...good, times: [0, 1], readings: [20, 18] }, 'intercept'));
    expect([e.code, e.field]).toEqual(['too-few-points', 'readings']);
  });
  it('all times equal', () => {
    expect(thrown(() => fitFirstOrderLinear({ ...good, times: [3, 3, 3, 3, 3] }, 'intercept')).code).toBe('degenerate-x');
  });
  it('times that go back name the time; a repeated time is a replicate reading', () => {
    const e = thrown(() => fitFirstOrderLinear({ ...good, times: [0, 1, 3, 2, 4] }, 'intercept'));
    expect([e.code, e.field]).toEqual(['times-not-increasing', 'times[3]']);
    expect(fitFirstOrderLinear({ ...good, times: [0, 1, 1, 2, 3] }, 'intercept').line.n).toBe(5);
  });
  it('a non-finite reading or x_inf', () => {
    const e = thrown(() => fitFirstOrderLinear({ ...good, readings: [20, 18, Number.NaN, 15.2, 14.1] }, 'origin'));
    expect([e.code, e.field]).toEqual(['non-finite', 'readings[2]']);
    expect(thrown(() => fitFirstOrderLinear({ ...good, infinity: Infinity }, 'origin')).field).toBe('infinity');
  });
  it('Guggenheim without enough pairs', () => {
    expect(thrown(() => fitGuggenheim(good, 3)).code).toBe('no-interval-pairs');
  });
  it('an exponential fit with x_inf fixed but none measured', () => {
    expect(thrown(() => fitFirstOrderNonlinear({ ...good, infinity: undefined }, { infinity: 'fixed' })).field).toBe('infinity');
  });
});
