import { describe, expect, it } from 'vitest';
import { convert } from '../../server/engine/units.ts';

/**
 * The workspace's plot series (web/js/plot-series.js, the page's own module, loaded as the browser
 * loads it). Runs and fits are written by hand here: F = exp(−k t) exactly, so ln F = −k t.
 */
const url = new URL('../../web/js/plot-series.js', import.meta.url).href;
const { runPlotSeries, rateLawPlotSeries, convertUnit } = (await import(url)) as {
  runPlotSeries: (run: unknown, fit: unknown, settings: unknown, findings?: unknown[], index?: number) => any;
  rateLawPlotSeries: (payload: unknown, refit: unknown, settings: unknown) => any;
  convertUnit: (value: number, from: string, to: string) => number | undefined;
};

const settings = { fitModel: 'origin', units: { k: 'min^-1', kN: 'min^-1', kA: 'M^-1 min^-1' }, tolerances: { k: { relative: 0.01 } } };
// 0.5 min^-1 is 1/120 s^-1 (60 s in a minute, by definition).
const times = [0, 60, 120, 180, 240, 300, 420, 600];
const lnF = times.map((t) => -t / 120);
const run = (reportedK?: { value: string; unit: string }) => ({
  label: '0.10 M',
  timeUnit: 's',
  catalyst: { value: 0.1, unit: 'M' },
  readings: times.map((t, i) => [t + 30, Math.exp(lnF[i])]),
  ...(reportedK ? { reported: { k: reportedK } } : {}),
});
const fit = { label: '0.10 M', model: 'origin', lnF, k: { instructor: { value: 0.5, standardError: 0.001, unit: 'min^-1' } } };
const at = (line: { intercept: number; slope: number }, t: number) => line.intercept + line.slope * t;

describe('the workspace’s ln F plot of a run timed in seconds', () => {
  it('draws the refit line through the points although k is per minute', () => {
    const series = runPlotSeries(run(), fit, settings);
    expect(series.timeUnit).toBe('s');
    // Times counted from the first reading (30 s here), as the refit counts them.
    expect(series.points.map((p: { t: number }) => p.t)).toEqual(times);
    expect(series.ourLine.slope).toBeCloseTo(-1 / 120, 12);
    for (const p of series.points) expect(at(series.ourLine, p.t)).toBeCloseTo(p.y, 9);
  });

  it('draws the student’s line with their k, converted to the run’s unit, where it differs', () => {
    // The factor-of-60 slip: 0.5 written per second. Their line falls 60 times as fast as ours.
    const slip = runPlotSeries(run({ value: '0.5', unit: 's^-1' }), fit, settings);
    expect(slip.theirLine.slope).toBeCloseTo(-0.5, 12);
    expect(slip.theirLine.slope / slip.ourLine.slope).toBeCloseTo(60, 9);
    // The same k written right in another spelling agrees within the tolerance: no second line.
    expect(runPlotSeries(run({ value: '0.0083333', unit: 's-1' }), fit, settings).theirLine).toBeUndefined();
    // ... unless the run has a finding, when the student's line is drawn beside ours.
    const withFinding = runPlotSeries(run({ value: '0.0083333', unit: 's-1' }), fit, settings, [{ path: 'runs[2].lnF' }], 2);
    expect(withFinding.theirLine.slope).toBeCloseTo(-0.0083333, 9);
    // A unit that cannot be read leaves the student's line out, saying why.
    const unread = runPlotSeries(run({ value: '0.5', unit: 'per min' }), fit, settings);
    expect(unread.theirLine).toBeUndefined();
    expect(unread.notes.join(' ')).toContain('per min');
  });

  it('reads the spellings of rate-constant units as the engine does', () => {
    for (const [from, to] of [['min^-1', 's^-1'], ['min-1', 'h^-1'], ['1/min', 's-1'], ['min⁻¹', 'ms^-1'], ['M^-1 min^-1', 'M-1 s-1'], ['mM', 'M'], ['µM', 'mM']]) {
      expect(convertUnit(1, from, to), `${from} → ${to}`).toBeCloseTo(convert(1, from, to), 12);
    }
    expect(convertUnit(1, 'min^-1', 'M')).toBeUndefined();
  });
});

describe('the workspace’s rate-law plot', () => {
  it('puts ours and the student’s lines in the instructor’s k unit', () => {
    const payload = {
      runs: [0.05, 0.1, 0.2].map((c) => ({ ...run({ value: String(0.1 + 2 * c), unit: 'min^-1' }), catalyst: { value: c * 1000, unit: 'mM' } })),
      reported: { kN: { value: '0.1', unit: 'min^-1' }, kA: { value: '2', unit: 'M^-1 min^-1' } },
    };
    // Ours per second: k_N = 0.06 min^-1 is 0.001 s^-1, k_A = 1.2 M^-1 min^-1 is 0.02 M^-1 s^-1.
    const refit = {
      runs: [0.05, 0.1, 0.2].map((c) => ({ ...fit, k: { instructor: { value: 0.06 + 1.2 * c, standardError: 0.001, unit: 'min^-1' } } })),
      kN: { value: 0.001, standardError: 1e-5, unit: 's^-1' },
      kA: { value: 0.02, standardError: 1e-4, unit: 'M^-1 s^-1' },
    };
    const law = rateLawPlotSeries(payload, refit, settings);
    expect(law.kUnit).toBe('min^-1');
    expect(law.ours.map((p: { c: number }) => p.c)).toEqual([0.05, 0.1, 0.2]);
    expect(law.ourLine.intercept).toBeCloseTo(0.06, 12);
    expect(law.ourLine.slope).toBeCloseTo(1.2, 12);
    for (const p of law.ours) expect(at(law.ourLine, p.c)).toBeCloseTo(p.k, 12);
    expect(law.theirLine).toEqual({ intercept: 0.1, slope: 2 });
    for (const p of law.theirs) expect(at(law.theirLine, p.c)).toBeCloseTo(p.k, 12);
  });
});
