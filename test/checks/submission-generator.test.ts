import { describe, expect, it } from 'vitest';
import { Settings, Submission } from '../../kinds/first-order-catalysis/schemas.ts';
import { fitFirstOrderLinear } from '../../server/engine/first-order-linear.ts';
import { fitLine } from '../../server/engine/linear-fit.ts';
import { parseUnit } from '../../server/engine/units.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { toFigures } from '../../server/demo/careful-rounding.ts';
import {
  assignmentSettings,
  assignmentVariants,
  cleanCase,
  generateAssignment,
  generateSubmission,
  inject,
  slipCase,
  slipCodes,
  type SlipCode,
} from '../../kinds/first-order-catalysis/demo/submission-generator.ts';

/** The clean submission a slip case started from: same seed stream, drawn the same way. */
function cleanAndSlipped(code: SlipCode, seed: number, options = {}) {
  const settings = generateAssignment(seededRandom(seed), options);
  const clean = generateSubmission(seededRandom(seed + 1), settings, 1);
  return { settings, clean, ...inject(code, clean, seededRandom(seed + 2), settings) };
}

const kValues = (s: Submission) => s.runs.map((r) => Number(r.reported!.k!.value));
const runIndex = (path: string) => Number(/^runs\[(\d+)\]/.exec(path)![1]);

describe('submission generator: clean submissions', () => {
  it('passes the schemas for every assignment variant, with pseudonymous ids', () => {
    for (let seed = 0; seed < 16; seed++) {
      const { settings, submission } = cleanCase(seed);
      expect(Settings.safeParse(settings).success).toBe(true);
      expect(Submission.safeParse(submission).success).toBe(true);
      expect(submission.studentId).toBe(`S-${String(seed + 1).padStart(3, '0')}`);
    }
  });

  it('gives the default assignment: origin model, instructor units, nothing else set', () => {
    expect(assignmentSettings()).toEqual({
      kind: 'first-order-catalysis',
      fitModel: 'origin',
      units: { k: 'min^-1', kN: 'min^-1', kA: 'M^-1 min^-1' },
    });
    expect(assignmentVariants).toHaveLength(8);
  });

  it('has 4 runs of 16 one-minute readings at 0.05-0.40 M, rounded to 0.001 deg', () => {
    const { submission } = cleanCase(1);
    expect(submission.runs.map((r) => r.label)).toEqual(['0.05 M', '0.10 M', '0.20 M', '0.40 M']);
    for (const run of submission.runs) {
      expect(run.timeUnit).toBe('min');
      expect(run.readings.map(([t]) => t)).toEqual(Array.from({ length: 16 }, (_, i) => i));
      for (const x of [...run.readings.map(([, v]) => v), run.infinity!]) expect(String(x)).toMatch(/^\d+(\.\d{1,3})?$/);
    }
  });

  it('reports k as the engine refit (SE to 2 s.f., the value to the same place) and k_N, k_A from the reported k', () => {
    for (const seed of [0, 1, 2, 3, 4, 5, 6, 7]) {
      const { settings, submission } = cleanCase(seed);
      for (const run of submission.runs) {
        const times = run.readings.map(([t]) => t);
        const fit = fitFirstOrderLinear({ times, readings: run.readings.map(([, x]) => x), timeUnit: 'min', infinity: run.infinity! }, settings.fitModel);
        const se = toFigures(fit.k.standardError, 2);
        // The value rounded to the uncertainty's last place: 2 figures of the SE.
        const places = 1 - Math.floor(Math.log10(se));
        expect(run.reported!.k).toEqual({ value: Number(fit.k.value.toFixed(places)), uncertainty: se, unit: 'min^-1' });
        expect(run.reported!.lnF).toEqual(fit.transform.lnF.map((v) => Math.round(v * 1e4) / 1e4));
      }
      const line = fitLine(submission.runs.map((r) => r.catalyst.value), kValues(submission));
      expect(submission.reported!.kA!.value).toBe(Number(line.slope.toFixed(1 - Math.floor(Math.log10(toFigures(line.seSlope, 2))))));
      expect(submission.reported!.kN!.uncertainty).toBe(toFigures(line.seIntercept, 2));
    }
  });

  it('hands every student the class runs when the assignment has a class dataset', () => {
    const random = seededRandom(9);
    const settings = generateAssignment(random, { classDataset: true });
    const a = generateSubmission(random, settings, 1);
    const b = generateSubmission(random, settings, 2);
    expect(a.runs.map((r) => r.readings)).toEqual(settings.classDataset!.runs.map((r) => r.readings));
    expect(b.runs.map((r) => r.readings)).toEqual(a.runs.map((r) => r.readings));
  });

  it('is reproducible from its seed', () => {
    expect(cleanCase(5)).toEqual(cleanCase(5));
    expect(slipCase('transcription', 5)).toEqual(slipCase('transcription', 5));
  });
});

describe('submission generator: slips', () => {
  it.each(slipCodes)('%s: passes the schema, leaves its input alone, expects at least one finding', (code) => {
    for (let seed = 0; seed < 20; seed++) {
      const { submission, expected } = slipCase(code, seed);
      expect(Submission.safeParse(submission).success).toBe(true);
      expect(expected.length).toBeGreaterThan(0);
      expect(expected.every((e) => e.code === code)).toBe(true);
    }
    const { clean, submission } = cleanAndSlipped(code, 40, code === 'transcription' ? { classDataset: true } : code === 'implausible' ? { reference: true } : {});
    expect(submission).not.toEqual(clean);
  });

  it('log-base: k is the clean k / ln 10 (ln 10 = 2.302585, a mathematical constant)', () => {
    const { clean, submission } = cleanAndSlipped('log-base', 11);
    kValues(submission).forEach((k, i) => expect(Math.abs(k * Math.LN10 - kValues(clean)[i]) / kValues(clean)[i]).toBeLessThan(1e-3));
    expect(submission.runs[0].reported!.lnF![5]).toBeCloseTo(clean.runs[0].reported!.lnF![5] as number / Math.LN10, 3);
  });

  it('time-unit: times in seconds, k per second declared per minute', () => {
    const { clean, submission } = cleanAndSlipped('time-unit', 12);
    for (const run of submission.runs) {
      expect(run.timeUnit).toBe('s');
      expect(run.readings.map(([t]) => t)).toEqual(Array.from({ length: 16 }, (_, i) => 60 * i));
      expect(run.reported!.k!.unit).toBe('min^-1');
    }
    kValues(submission).forEach((k, i) => expect(Math.abs(k * 60 - kValues(clean)[i]) / kValues(clean)[i]).toBeLessThan(1e-3));
  });

  it('concentration-unit: k_A 1000 times too small, k_N unchanged', () => {
    const { clean, submission } = cleanAndSlipped('concentration-unit', 13);
    expect(Number(submission.reported!.kA!.value) * 1000).toBeCloseTo(Number(clean.reported!.kA!.value), 3);
    expect(submission.reported!.kN).toEqual(clean.reported!.kN);
  });

  it('carries a changed k forward into k_N and k_A', () => {
    const { clean, submission, expected } = cleanAndSlipped('decimal-shift', 14);
    const i = runIndex(expected[0].path);
    const ratio = kValues(submission)[i] / kValues(clean)[i];
    expect([10, 0.1].some((f) => Math.abs(ratio / f - 1) < 1e-3)).toBe(true);
    expect(submission.reported!.kA).not.toEqual(clean.reported!.kA);
  });

  it('wrong-infinity: last ln F blank, submitted x_inf unchanged, k larger', () => {
    const { clean, submission, expected } = cleanAndSlipped('wrong-infinity', 15);
    const i = runIndex(expected[0].path);
    expect(submission.runs[i].reported!.lnF!.at(-1)).toBeNull();
    expect(submission.runs[i].infinity).toBe(clean.runs[i].infinity);
    expect(kValues(submission)[i]).toBeGreaterThan(kValues(clean)[i]);
  });

  it('suspect-reading: one inner reading moved by at least 0.05 deg, the rest unchanged', () => {
    for (let seed = 0; seed < 30; seed++) {
      const { clean, submission, expected } = cleanAndSlipped('suspect-reading', 100 + seed);
      const [, i, j] = /^runs\[(\d+)\]\.readings\[(\d+)\]$/.exec(expected[0].path)!.map(Number);
      expect(j).toBeGreaterThan(0);
      expect(j).toBeLessThan(15);
      const before = clean.runs[i].readings;
      const after = submission.runs[i].readings;
      expect(after.flatMap(([, x], r) => (x === before[r][1] ? [] : [r]))).toEqual([j]);
      expect(Math.abs(after[j][1] - before[j][1])).toBeGreaterThanOrEqual(0.05);
    }
  });

  it('transcription: the copy differs from the class dataset only at the expected place', () => {
    for (let seed = 0; seed < 40; seed++) {
      const { settings, submission, expected } = slipCase('transcription', seed);
      const i = runIndex(expected[0].path);
      submission.runs.forEach((run, r) => {
        if (r !== i) expect(run.readings).toEqual(settings.classDataset!.runs[r].readings);
      });
      const cell = /readings\[(\d+)\]$/.exec(expected[0].path);
      if (cell) {
        const j = Number(cell[1]);
        const differing = submission.runs[i].readings.flatMap(([, x], r) => (x === settings.classDataset!.runs[i].readings[r][1] ? [] : [r]));
        expect(differing).toEqual([j]);
      } else {
        expect(['row-shift', 'missing-row', 'extra-row']).toContain(expected[0].detail);
      }
    }
  });

  it('implausible: k_A near 3 x the band maximum of 0.4 M^-1 min^-1', () => {
    const { submission } = slipCase('implausible', 3);
    expect(Number(submission.reported!.kA!.value)).toBeGreaterThan(1.0);
  });

  it('sig-figs: k sent as strings', () => {
    const { submission, expected } = slipCase('sig-figs', 4);
    const k = submission.runs[runIndex(expected[0].path)].reported!.k!;
    expect(typeof k.value).toBe('string');
    expect(typeof k.uncertainty).toBe('string');
  });

  it('unit-unrecognised: the unit text is one the unit grammar rejects', () => {
    for (let seed = 0; seed < 10; seed++) {
      const { submission, expected } = slipCase('unit-unrecognised', seed);
      const unit = submission.runs[runIndex(expected[0].path)].reported!.k!.unit;
      expect(() => parseUnit(unit, 'first-order-rate')).toThrow();
    }
  });

  it('missing-value: k_A deleted', () => {
    const { submission } = slipCase('missing-value', 5);
    expect(submission.reported!.kA).toBeUndefined();
    expect(submission.reported!.kN).toBeDefined();
  });

  it('unexplained: factor within [0.62, 0.8] or [1.25, 1.6], not ln 2 or 1/ln 2', () => {
    for (let seed = 0; seed < 30; seed++) {
      const { clean, submission, expected } = cleanAndSlipped('unexplained', 200 + seed);
      const i = runIndex(expected[0].path);
      const ratio = kValues(submission)[i] / kValues(clean)[i];
      expect((ratio > 0.619 && ratio < 0.801) || (ratio > 1.249 && ratio < 1.601)).toBe(true);
      for (const f of [Math.LN2, 1 / Math.LN2]) expect(Math.abs(ratio / f - 1)).toBeGreaterThan(0.02);
    }
  });

  it('refuses a slip the assignment cannot hold', () => {
    const random = seededRandom(1);
    const settings = generateAssignment(random, { fitModel: 'intercept' });
    const clean = generateSubmission(random, settings, 1);
    expect(() => inject('fit-model', clean, random, settings)).toThrow(/fitModel origin/);
    expect(() => inject('transcription', clean, random, settings)).toThrow(/class dataset/);
    expect(() => inject('implausible', clean, random, settings)).toThrow(/reference band/);
  });
});
