import { describe, expect, it } from 'vitest';
import { analyseOrder } from '../../../kinds/reaction-order/order-analysis.ts';
import { fitLinearLaw } from '../../../kinds/reaction-order/integrated-laws.ts';
import { Settings, type SubmittedRun } from '../../../kinds/reaction-order/schemas.ts';
import { INDEPENDENT, LIBRARIES } from './independent-refits.ts';

/**
 * The kind's refits against independent ones (numpy for each law's linear form, scipy's curve_fit for
 * each law fitted to the concentrations; see independent-refits.ts for the versions) and against
 * worked examples of integrated-rate-law analysis, each source named beside its check.
 */
const relative = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

const runsOf = (readings: Array<Array<[number, number]>>, timeUnit: string): SubmittedRun[] => readings.map((r, i) => ({ label: `run ${i + 1}`, timeUnit, readings: r }));

// The datasets independent-refits.py fits, with their settings.
const DATASETS = {
  // N2O5 in CCl4 at 45 C, [N2O5]/M against t/s: a general-chemistry textbook's worked example (from memory).
  n2o5: {
    settings: { kind: 'reaction-order', signal: { type: 'concentration', unit: 'M' }, units: { time: 's' } },
    runs: runsOf([[[0, 0.1], [50, 0.0707], [100, 0.05], [200, 0.025], [300, 0.0125], [400, 0.00625]]], 's'),
  },
  // 2 NO2 -> 2 NO + O2 at 300 C, [NO2]/M against t/s: a general-chemistry textbook's worked example (from memory).
  no2: {
    settings: { kind: 'reaction-order', signal: { type: 'concentration', unit: 'M' }, units: { time: 's' } },
    runs: runsOf([[[0, 0.01], [50, 0.00787], [100, 0.00649], [200, 0.00481], [300, 0.0038]]], 's'),
  },
  // Invented absorbance runs: two runs, Beer-Lambert with a path length other than 1 cm and an end absorbance.
  dye: {
    settings: { kind: 'reaction-order', signal: { type: 'absorbance', molarAbsorptivity: { value: 8374.6, unit: 'M^-1 cm^-1' }, pathLength: { value: 5, unit: 'mm' }, endAbsorbance: 0.02 } },
    runs: runsOf(
      [
        [[0, 0.91351], [0.9437, 0.66243], [1.887, 0.5256], [2.831, 0.41417], [3.775, 0.36104], [4.718, 0.31011], [5.662, 0.28846], [6.606, 0.25677], [7.549, 0.2319]],
        [[0, 0.84207], [1.021, 0.61419], [2.043, 0.48472], [3.064, 0.38915], [4.086, 0.34976], [5.107, 0.30373], [6.129, 0.2748], [7.15, 0.22939], [8.172, 0.21963]],
      ],
      'min',
    ),
  },
  // Invented concentration run, a straight decline.
  flat: {
    settings: { kind: 'reaction-order', signal: { type: 'concentration', unit: 'M' } },
    runs: runsOf([[[0, 0.087513], [2.76, 0.076465], [5.52, 0.06708], [8.28, 0.057283], [11.04, 0.048931], [13.8, 0.040416], [16.56, 0.030366], [19.32, 0.020911]]], 'min'),
  },
} as const;

describe(`refits equal numpy ${LIBRARIES.numpy} (linear forms) and scipy ${LIBRARIES.scipy} (curve_fit) to 1e-6`, () => {
  for (const [name, data] of Object.entries(DATASETS)) {
    const analysis = analyseOrder(Settings.parse(data.settings), data.runs as unknown as SubmittedRun[]);
    for (const order of [0, 1, 2] as const) {
      const ours = analysis.fits[order];
      const theirs = INDEPENDENT[name][order];
      it(`${name}, order ${order}: the linear form's k, SE, intercepts and residual sum`, () => {
        expect(relative(ours.linear!.k.value, theirs.linear.k)).toBeLessThan(1e-6);
        expect(relative(ours.linear!.k.standardError, theirs.linear.se)).toBeLessThan(1e-6);
        ours.linear!.intercepts.forEach((b, r) => expect(relative(b, theirs.linear.intercepts[r])).toBeLessThan(1e-6));
        expect(relative(ours.linear!.residualSS, theirs.linear.sse)).toBeLessThan(1e-6);
        expect(ours.linear!.dof).toBe(theirs.linear.dof);
      });
      it(`${name}, order ${order}: the fit to the concentrations' k, SE, [A]_0 and residual sum`, () => {
        expect(relative(ours.nonlinear!.k.value, theirs.nonlinear.k)).toBeLessThan(1e-6);
        expect(relative(ours.nonlinear!.k.standardError, theirs.nonlinear.se)).toBeLessThan(1e-6);
        ours.nonlinear!.initialConcentrations.forEach((c0, r) => expect(relative(c0, theirs.nonlinear.c0[r])).toBeLessThan(1e-6));
        expect(relative(ours.nonlinear!.residualSS, theirs.nonlinear.sse)).toBeLessThan(1e-6);
      });
    }
  }
});

describe('worked examples of integrated-rate-law analysis', () => {
  it('N2O5 in CCl4 (from memory: a textbook example, k = 6.93e-3 s^-1, first order, half-life 100 s): order 1 named, k to three figures', () => {
    const analysis = analyseOrder(Settings.parse(DATASETS.n2o5.settings), DATASETS.n2o5.runs as unknown as SubmittedRun[]);
    expect(analysis.order).toBe(1);
    expect(analysis.fits[1].linear!.k.value.toPrecision(3)).toBe('0.00693');
    expect(analysis.fits[1].linear!.k.unit).toBe('s^-1');
  });

  it('NO2 at 300 C (from memory: a textbook example, k = 0.543 M^-1 s^-1, second order): order 2 named, k to three figures', () => {
    const analysis = analyseOrder(Settings.parse(DATASETS.no2.settings), DATASETS.no2.runs as unknown as SubmittedRun[]);
    expect(analysis.order).toBe(2);
    expect(analysis.fits[2].linear!.k.value.toPrecision(3)).toBe('0.543');
    expect(analysis.fits[2].linear!.k.unit).toBe('M^-1 s^-1');
  });

  it('sucrose inversion (published worked problem, test/reference/kinetics-check-values.md): the first-order line of r_t - r_inf gives k = 8.718e-3 min^-1 and exp(intercept) = 43.53 deg', () => {
    const t = [0, 10, 20, 30, 40];
    const rotation = [32.4, 28.8, 25.5, 22.4, 19.6];
    const line = fitLinearLaw(1, [{ t, c: rotation.map((r) => r + 11.1) }], 'min^-1');
    expect(line.k.value.toPrecision(4)).toBe('0.008718');
    expect(Math.exp(line.intercepts[0]).toFixed(2)).toBe('43.53');
  });

  it('sucrose inversion covers about 30 % of the reaction: the orders are left open, with the reason', () => {
    const settings = Settings.parse({ kind: 'reaction-order', signal: { type: 'conductance', unit: 'deg', calibration: { slope: { value: 1, unit: 'deg M^-1' }, intercept: { value: -11.1, unit: 'deg' } } } });
    const analysis = analyseOrder(settings, runsOf([[[0, 32.4], [10, 28.8], [20, 25.5], [30, 22.4], [40, 19.6]]], 'min'));
    expect(analysis.order).toBeNull();
    expect(analysis.orderReason).toMatch(/too little of the reaction.*less than one half-life/);
  });
});
