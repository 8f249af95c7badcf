import { describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';

// Invented run: x(t) = 6.35 + 15.0 e^(-0.08 t), a reading a minute for 15 minutes, to 0.001 deg, with
// x_inf recorded as 6.35. The student copied x_inf as 6.53 (two neighbouring digits swapped) and
// analysed the run with it: ln F = ln((x - 6.53)/(x_0 - 6.53)), slope through the origin.
const assignment = parseAssignment({ kind: 'first-order-catalysis', fitModel: 'origin', rubric: { lnF: 0 } });
const times = Array.from({ length: 16 }, (_, t) => t);
const readings = times.map((t): [number, number] => [t, Number((6.35 + 15 * Math.exp(-0.08 * t)).toFixed(3))]);

/** k as the student computed it: least squares through the origin of ln F with their x_inf. */
function kWith(infinity: number): number {
  const x0 = readings[0][1];
  const lnF = readings.map(([, x]) => Math.log((x - infinity) / (x0 - infinity)));
  const stt = times.reduce((s, t) => s + t * t, 0);
  return -times.reduce((s, t, i) => s + t * lnF[i], 0) / stt;
}

describe('x_inf copied with two digits swapped', () => {
  it('is named wrong-infinity, with the value the student must have used', () => {
    const k = kWith(6.53);
    expect(Math.abs(k / kWith(6.35) - 1)).toBeGreaterThan(0.01);
    const result = checkSubmission(assignment, {
      studentId: 'X-01',
      runs: [{ label: 'A', catalyst: { value: 0.1, unit: 'M' }, timeUnit: 'min', readings, infinity: 6.35, reported: { k: { value: Number(k.toPrecision(5)), unit: 'min^-1' } } }],
    });
    const finding = result.findings.find((f) => f.path === 'runs[0].reported.k');
    expect(finding).toMatchObject({ code: 'wrong-infinity', severity: 'error' });
    expect(finding!.detail).toBe('x_inf taken as 6.53, the recorded 6.35 with two neighbouring digits swapped');
  });
});

describe('x_inf copied with another copying slip', () => {
  // Invented run: x(t) = 6.354 + 15.0 e^(-0.08 t) to 0.001 deg, x_inf recorded as 6.354 and used as
  // 0.6354 (the decimal point moved). The swap is the common slip and is tried at the k tolerance;
  // every other copying variant is one of dozens, so k must match it to its written digits.
  const recorded = 6.354;
  const used = 0.6354;
  const run = readings.map(([t]): [number, number] => [t, Number((recorded + 15 * Math.exp(-0.08 * t)).toFixed(3))]);
  const x0 = run[0][1];
  const lnF = run.map(([, x]) => Math.log((x - used) / (x0 - used)));
  const stt = times.reduce((s, t) => s + t * t, 0);
  const k = -times.reduce((s, t, i) => s + t * lnF[i], 0) / stt;
  const detail = 'x_inf taken as 0.6354, the recorded 6.354 with the decimal point moved';
  const submit = (reported: object, rubric: object) =>
    checkSubmission(parseAssignment({ kind: 'first-order-catalysis', fitModel: 'origin', rubric }), {
      studentId: 'X-02',
      runs: [{ label: 'A', catalyst: { value: 0.1, unit: 'M' }, timeUnit: 'min', readings: run, infinity: recorded, reported }],
    });

  it('is found from k written to 5 figures, and the x_inf used is named', () => {
    const finding = submit({ k: { value: Number(k.toPrecision(5)), unit: 'min^-1' } }, { lnF: 0 }).findings.find((f) => f.path === 'runs[0].reported.k');
    expect(finding).toMatchObject({ code: 'wrong-infinity', detail });
  });

  it('is found from the ln F column, where the whole column must match', () => {
    const column = lnF.map((v) => Number(v.toFixed(4)));
    const result = submit({ lnF: column, k: { value: Number(k.toPrecision(5)), unit: 'min^-1' } }, {});
    expect(result.findings.find((f) => f.path === 'runs[0].reported.lnF')).toMatchObject({ code: 'wrong-infinity', detail });
    // k then follows from the student's own column: the slip costs once.
    expect(result.findings.find((f) => f.path === 'runs[0].reported.k')).toMatchObject({ code: 'carried-forward' });
  });

  it('is not claimed for a k that a variant reaches only within the 1 % band', () => {
    const finding = submit({ k: { value: Number((k * 1.006).toPrecision(5)), unit: 'min^-1' } }, { lnF: 0 }).findings.find((f) => f.path === 'runs[0].reported.k');
    expect(finding).toMatchObject({ code: 'unexplained' });
  });
});
