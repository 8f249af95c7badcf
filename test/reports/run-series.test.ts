import { describe, expect, it } from 'vitest';
import { allRunSeries } from '../../kinds/first-order-catalysis/report/run-series.ts';
import { Settings, SubmittedRun, type RunRefit } from '../../kinds/first-order-catalysis/schemas.ts';
import type { Finding } from '../../schemas/result.ts';

/**
 * The numbers the sheet's ln F plots are drawn from. Runs and fits are written by hand: F = exp(−k t)
 * exactly, so ln F = −k t, with k = 0.5 min^-1 = 1/120 s^-1 (60 s in a minute, by definition).
 */
const settings = Settings.parse({ kind: 'first-order-catalysis', fitModel: 'origin' });
const times = [0, 60, 120, 180, 240, 300, 420, 600];
const lnF = times.map((t) => -t / 120);
const run = (k: string, unit: string) =>
  SubmittedRun.parse({
    label: '0.10 M',
    catalyst: { value: 0.1, unit: 'M' },
    timeUnit: 's',
    readings: times.map((t, i) => [t + 30, Math.exp(lnF[i])]),
    infinity: 0,
    reported: { k: { value: k, unit } },
  });
const estimate = { value: 0.5, standardError: 0.001, ci95: [0.498, 0.502] as [number, number], unit: 'min^-1' };
const fit: RunRefit = { label: '0.10 M', model: 'origin', lnF, k: { instructor: estimate } };
const finding = (path: string) => ({ id: `lnF@${path}`, code: 'transcription', stage: 'runs', path, severity: 'error', pointsLost: 1 }) as Finding;
const at = (line: { intercept: number; slope: number }, t: number) => line.intercept + line.slope * t;

describe('the sheet’s ln F plot of a run timed in seconds', () => {
  it('draws the refit line through the points although k is per minute', () => {
    const [series] = allRunSeries(settings, [run('0.5', 'min^-1')], { runs: [fit] }, []);
    expect(series!.ourLine.slope).toBeCloseTo(-1 / 120, 12);
    expect(series!.points.map((p) => p.t)).toEqual(times);
    for (const p of series!.points) expect(at(series!.ourLine, p.t)).toBeCloseTo(p.y, 9);
    // A k within the tolerance and no finding on the run: the student's line would lie on ours.
    expect(series!.theirLine).toBeUndefined();
  });

  it('draws the student’s line for a k that differs, and for every run with a finding', () => {
    const [slip] = allRunSeries(settings, [run('0.5', 's^-1')], { runs: [fit] }, []);
    expect(slip!.theirLine!.slope / slip!.ourLine.slope).toBeCloseTo(60, 9);
    const [found] = allRunSeries(settings, [run('0.5', 'min^-1')], { runs: [fit] }, [finding('runs[0].reported.lnF[3]')]);
    expect(found!.theirLine!.slope).toBeCloseTo(-1 / 120, 12);
    // A finding of another run does not draw a line here.
    const [other] = allRunSeries(settings, [run('0.5', 'min^-1')], { runs: [fit] }, [finding('runs[1].reported.k')]);
    expect(other!.theirLine).toBeUndefined();
  });
});
