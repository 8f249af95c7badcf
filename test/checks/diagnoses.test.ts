import { describe, expect, it } from 'vitest';
import type { Refit, Submission } from '../../kinds/first-order-catalysis/schemas.ts';
import type { CheckResult } from '../../schemas/result.ts';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { fitLine, fitThroughOrigin } from '../../server/engine/linear-fit.ts';
import { acid, handMadeSubmission, readingsFor, recomputeRateLaw } from '../support/hand-made-section.ts';

// Hand-made cases on the invented section of test/support/hand-made-section.ts:
// k_obs = 0.03, 0.04, 0.06, 0.10 min^-1 at [H+] = 0.05, 0.10, 0.20, 0.40 M; k_N = 0.02 min^-1,
// k_A = 0.2 M^-1 min^-1. Constants: ln 10 = 2.302585093 and ln 2 = 0.693147 (mathematical constants),
// 60 s per min (definition of the minute), 1000 mM per M (definition of the milli prefix).
const assignment = parseAssignment({ kind: 'first-order-catalysis', fitModel: 'origin' });

function check(edit: (s: Submission) => void, settings = assignment): CheckResult {
  const s = handMadeSubmission();
  edit(s);
  return checkSubmission(settings, s);
}
// Rounding (sig-figs) is tested on its own; the edits below set unrounded values.
const codesAt = (r: CheckResult, path: string) => r.findings.filter((f) => f.path === path && f.code !== 'sig-figs').map((f) => f.code);
const at = (r: CheckResult, path: string) => r.findings.find((f) => f.path === path);
const k = (s: Submission, i: number) => s.runs[i].reported!.k!;

describe('a careful submission', () => {
  it('earns every point with no finding', () => {
    const r = checkSubmission(assignment, handMadeSubmission());
    expect(r.status).toBe('checked');
    expect(r.findings).toEqual([]);
    // 4 runs x (lnF 1 + k 2 + SE 1) + k_N 2 + SE 1 + k_A 2 + SE 1
    expect([r.score, r.maxScore]).toEqual([22, 22]);
  });
});

describe('each diagnosis, fed data that has exactly that slip', () => {
  it('sign-flipped: k of run 2 reported as -0.04 (the slope itself)', () => {
    const r = check((s) => (k(s, 1).value = -0.04));
    expect(at(r, 'runs[1].reported.k')).toMatchObject({ code: 'sign-flipped', severity: 'error', pointsLost: 2, expected: expect.closeTo(0.04, 4) });
    expect(r.score).toBe(20);
  });

  it('log-base: k of run 2 reported as 0.04 / 2.302585 = 0.01737', () => {
    const r = check((s) => (k(s, 1).value = 0.01737));
    expect(codesAt(r, 'runs[1].reported.k')).toEqual(['log-base']);
  });

  it('two causes at once: -0.01737 is named as sign and log base', () => {
    const r = check((s) => (k(s, 1).value = -0.01737));
    expect(at(r, 'runs[1].reported.k')).toMatchObject({ code: 'sign-flipped', alsoCodes: ['log-base'] });
  });

  it('log-base in the ln F column: the column and every k from it, scored once where it entered', () => {
    const r = check((s) => {
      for (const run of s.runs) {
        run.reported!.lnF = run.reported!.lnF!.map((v) => (v === null ? null : Number(v) / Math.LN10));
        run.reported!.k!.value = Number(run.reported!.k!.value) / Math.LN10;
        run.reported!.k!.uncertainty = Number(run.reported!.k!.uncertainty) / Math.LN10;
      }
      recomputeRateLaw(s);
    });
    expect(acid.map((_, i) => codesAt(r, `runs[${i}].reported.lnF`))).toEqual([['log-base'], ['log-base'], ['log-base'], ['log-base']]);
    expect(codesAt(r, 'runs[0].reported.k')).toEqual(['carried-forward']);
    expect(codesAt(r, 'reported.kA')).toEqual(['carried-forward']);
    // 1 point for the first ln F column; nothing else.
    expect(r.score).toBe(21);
  });

  it('time-unit: k of run 3 declared min^-1 but per second: 0.06 / 60 = 0.001', () => {
    const r = check((s) => (k(s, 2).value = 0.001));
    expect(codesAt(r, 'runs[2].reported.k')).toEqual(['time-unit']);
  });

  it('decimal-shift: 0.4 for 0.04', () => {
    const r = check((s) => (k(s, 1).value = 0.4));
    expect(codesAt(r, 'runs[1].reported.k')).toEqual(['decimal-shift']);
  });

  it('concentration-unit: k_A = 0.0002 M^-1 min^-1, the slope against [H+] in mM (0.2 / 1000)', () => {
    const r = check((s) => {
      s.reported!.kA = { value: 0.0002, uncertainty: Number(s.reported!.kA!.uncertainty) / 1000, unit: 'M^-1 min^-1' };
    });
    expect(codesAt(r, 'reported.kA')).toEqual(['concentration-unit']);
  });

  it('half-life-for-rate: run 3 reports ln 2 / 0.06 = 11.55', () => {
    const r = check((s) => (k(s, 2).value = 11.55));
    expect(codesAt(r, 'runs[2].reported.k')).toEqual(['half-life-for-rate']);
  });

  it('swapped-axes: t fitted against ln F through the origin; slope = sum(t lnF)/sum(lnF^2), about -1/k = -16.7 for k = 0.06', () => {
    const r = check((s) => {
      const run = s.runs[2];
      const lnF = run.reported!.lnF!.map(Number);
      const swapped = fitThroughOrigin(lnF, run.readings.map((p) => p[0]));
      expect(-swapped.slope).toBeCloseTo(1 / 0.06, 0);
      run.reported!.k!.value = -swapped.slope;
    });
    expect(codesAt(r, 'runs[2].reported.k')).toEqual(['swapped-axes']);
  });

  it('wrong-infinity: run 1 with the last reading (2 + 10 e^-0.3 = 9.408) as x_inf, the refit that matches is named', () => {
    const r = check((s) => {
      const run = s.runs[0];
      const xs = run.readings.map((p) => p[1]);
      const inf = xs[xs.length - 1];
      const lnF = xs.map((x, i) => (i === xs.length - 1 ? null : Math.log((x - inf) / (xs[0] - inf))));
      run.reported!.lnF = lnF;
      const keep = lnF.slice(0, -1) as number[];
      const fit = fitThroughOrigin(keep.map((_, i) => i), keep);
      run.reported!.k = { value: -fit.slope, uncertainty: fit.seSlope, unit: 'min^-1' };
    });
    expect(at(r, 'runs[0].reported.lnF')).toMatchObject({ code: 'wrong-infinity', detail: 'x_inf taken as the last reading, 9.408' });
    expect(codesAt(r, 'runs[0].reported.k')).toEqual(['carried-forward']);
  });

  it('fit-model: the intercept model where the origin was asked, told apart by x_0 copied 0.05 deg high', () => {
    // With x_0 too high every ln F shifts by about -ln(1 + 0.05/10) = -0.005; the intercept absorbs
    // the shift, the origin model tilts, so the two models' k differ by several per cent.
    const r = check((s) => {
      const run = s.runs[0];
      run.readings[0] = [0, 12.05];
      const xs = run.readings.map((p) => p[1]);
      const lnF = xs.map((x) => Math.log((x - 2) / (12.05 - 2)));
      run.reported!.lnF = lnF;
      const fit = fitLine(xs.map((_, i) => i), lnF);
      run.reported!.k = { value: -fit.slope, uncertainty: fit.seSlope, unit: 'min^-1' };
    });
    expect(codesAt(r, 'runs[0].reported.k')).toEqual(['fit-model']);
  });

  it('uncertainty-kind: the residual SD of the ln F points reported as the standard error', () => {
    const r = check((s) => {
      const run = s.runs[1];
      const fit = fitThroughOrigin(run.readings.map((p) => p[0]), run.reported!.lnF!.map(Number));
      run.reported!.k!.uncertainty = fit.residualSD;
    });
    expect(at(r, 'runs[1].reported.k.uncertainty')).toMatchObject({ code: 'uncertainty-kind', detail: 'standard deviation of the points' });
  });

  it('unit-unrecognised: "per minnit" is a warning; the value is read in the asked unit and is right', () => {
    const r = check((s) => (k(s, 0).unit = 'per minnit'));
    expect(at(r, 'runs[0].reported.k')).toMatchObject({ code: 'unit-unrecognised', severity: 'warning', pointsLost: 0 });
  });

  it('missing-value: no k_A costs its points', () => {
    const r = check((s) => delete s.reported!.kA);
    expect(at(r, 'reported.kA')).toMatchObject({ code: 'missing-value', pointsLost: 2 });
  });

  it('unexplained: 0.04 x 1.37 = 0.0548 matches no common slip, and no cause is suggested', () => {
    const r = check((s) => (k(s, 1).value = 0.0548));
    const f = at(r, 'runs[1].reported.k')!;
    expect(f.code).toBe('unexplained');
    expect(f.message).toContain('no common slip explains it');
  });

  it('implausible: k_A outside the reference band, a warning that costs nothing', () => {
    const banded = parseAssignment({ kind: 'first-order-catalysis', fitModel: 'origin', reference: { kA: { min: 0.5, max: 1, unit: 'M^-1 min^-1' } } });
    const r = check(() => {}, banded);
    expect(at(r, 'reported.kA')).toMatchObject({ code: 'implausible', severity: 'warning', pointsLost: 0 });
  });

  it('transcription: with the class data handed out, run 2 at t = 3 (2 + 10 e^-0.12 = 10.869) copied as 10.896', () => {
    const original = handMadeSubmission();
    const withClass = parseAssignment({
      kind: 'first-order-catalysis',
      fitModel: 'origin',
      classDataset: { runs: original.runs.map(({ reported: _, ...run }) => run) },
    });
    const r = check((s) => (s.runs[1].readings[3] = [3, 10.896]), withClass);
    expect(at(r, 'runs[1].readings[3]')).toMatchObject({ code: 'transcription', detail: 'transposed-digits', expected: 10.869, reported: 10.896 });
  });

  it('suspect-reading: without class data, 10.869 copied as 10.689 stands 0.18 deg off the curve; 10.869 is offered', () => {
    const r = check((s) => (s.runs[1].readings[3] = [3, 10.689]));
    expect(at(r, 'runs[1].readings[3]')).toMatchObject({ code: 'suspect-reading', severity: 'warning', detail: 'transposed-digits' });
    expect(at(r, 'runs[1].readings[3]')!.message).toContain('meant as 10.869');
  });

  it('sig-figs: "0.040003" with uncertainty "0.0012" has more decimal places than its uncertainty', () => {
    const r = check((s) => (s.runs[1].reported!.k = { value: '0.040003', uncertainty: '0.0012', unit: 'min^-1' }));
    expect(at(r, 'runs[1].reported.k')).toMatchObject({ code: 'sig-figs', detail: 'value-over-precise' });
  });
});

describe('the refit, in the units the instructor asks for and in those the student declared', () => {
  it('a student reporting per second is right, and sees our values per second too (1 min = 60 s, a definition)', () => {
    const r = check((s) => {
      for (const run of s.runs) {
        const k = run.reported!.k!;
        run.reported!.k = { value: Number(k.value) / 60, uncertainty: Number(k.uncertainty) / 60, unit: 's^-1' };
      }
      const kA = s.reported!.kA!;
      s.reported!.kA = { value: Number(kA.value) / 60, uncertainty: Number(kA.uncertainty) / 60, unit: 'M^-1 s^-1' };
    });
    expect(r.findings.filter((f) => f.code !== 'sig-figs')).toEqual([]);
    const refit = r.refit as Refit;
    expect(refit.runs[1].k!.instructor.unit).toBe('min^-1');
    expect(refit.runs[1].k!.declared).toMatchObject({ unit: 's^-1', value: expect.closeTo(refit.runs[1].k!.instructor.value / 60, 12) });
    expect(refit.kADeclared).toMatchObject({ unit: 'M^-1 s^-1', value: expect.closeTo(refit.kA!.value / 60, 12) });
    expect(refit.kNDeclared).toBeUndefined();
  });
});

describe('scoring', () => {
  it('carried-forward: a wrong k in run 4 (decimal shift) costs 2 points once; k_N and k_A from it earn full points', () => {
    const r = check((s) => {
      k(s, 3).value = 1.0;
      recomputeRateLaw(s);
    });
    expect(codesAt(r, 'runs[3].reported.k')).toEqual(['decimal-shift']);
    expect(at(r, 'reported.kA')).toMatchObject({ code: 'carried-forward', severity: 'info', pointsLost: 0 });
    expect(r.score).toBe(20);
  });

  it('a systematic cause in every run is named in every run and scored once', () => {
    const r = check((s) => {
      s.runs.forEach((run) => {
        run.reported!.k!.value = Number(run.reported!.k!.value) / 60;
        run.reported!.k!.uncertainty = Number(run.reported!.k!.uncertainty) / 60;
      });
      recomputeRateLaw(s);
    });
    const timeUnit = r.findings.filter((f) => f.code === 'time-unit' && f.path.endsWith('reported.k'));
    expect(timeUnit.map((f) => f.pointsLost)).toEqual([2, 0, 0, 0]);
    expect(timeUnit[1].message).toContain('Counted once');
    expect(r.score).toBe(20);
  });

  it('rejects a run whose time unit cannot be read, naming the field', () => {
    const r = check((s) => (s.runs[2].timeUnit = 'fortnights'));
    expect(r.status).toBe('rejected');
    expect(r.rejected).toEqual([{ path: 'runs[2].timeUnit', message: expect.stringContaining('fortnights') }]);
  });

  it('a reading on the wrong side of x_inf is named and left out of the refit, not a rejection', () => {
    const r = check((s) => (s.runs[0].readings[5] = [5, 1.5]));
    expect(r.status).toBe('checked');
    expect(at(r, 'runs[0].readings[5]')).toMatchObject({ code: 'suspect-reading', severity: 'warning' });
    expect((r.refit as Refit).runs[0].lnF?.[5]).toBeNull();
  });

  it('rejects times that go back, naming the row', () => {
    const r = check((s) => (s.runs[1].readings[4][0] = 2.5));
    expect(r.rejected).toEqual([{ path: 'runs[1].readings[4][0]', message: 'time 2.5 comes before the time above it, 3' }]);
  });

  it('uses the right readings for the section', () => {
    expect(readingsFor(0.05)[1]).toEqual([1, 11.512]);
  });
});
