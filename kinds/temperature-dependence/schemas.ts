import { z } from 'zod';
import { Band, FiniteNumber, NumberLike, ReportedValue, StudentId, Text, Tolerance, UnitText, LatePolicy, LATE_POLICY_DEFAULT } from '../../schemas/common.ts';
import { Estimate, HANDING_IN_STAGE, sharedFindingCodes } from '../../schemas/result.ts';
import { Readings } from '../../schemas/readings.ts';

/**
 * Experiment kind `temperature-dependence`: rate constants measured at several temperatures, fitted
 * by Arrhenius (ln k against 1/T: E_a and A) and by Eyring (ln(k/T) against 1/T with k per second:
 * the enthalpy and entropy of activation).
 */
export const KIND = 'temperature-dependence';

export const stages = [
  { id: 'runs', title: 'Rate constants from the runs' },
  { id: 'arrhenius', title: 'Arrhenius: E_{a} and A' },
  { id: 'eyring', title: 'Eyring: ΔH^{‡} and ΔS^{‡}' },
  { id: 'reporting', title: 'Reporting' },
  HANDING_IN_STAGE,
] as const;
export type Stage = (typeof stages)[number]['id'];

/** The kind's finding codes, the shared ones among them, in the order a summary lists them. */
export const findingCodes = ['temperature-implausible', 'run-not-fitted', 'time-unit-implausible', 'uncertainty-undefined', 'temperature-scale', 'gas-constant', 'energy-unit', 'reciprocal-scale', 'eyring-form', 'time-unit', ...sharedFindingCodes] as const;
export type FindingCode = (typeof findingCodes)[number];

/** A temperature as read: kelvin, or degrees Celsius (an offset, converted by the checker). */
export const Temperature = z.object({ value: FiniteNumber, unit: z.enum(['K', 'degC']) });

/** A first-order run at one temperature, as in the first kind: refitted here, its k graded, and carried forward. */
export const PointRun = z.object({
  timeUnit: UnitText,
  readings: Readings,
  /** x_inf; absent: the exponential fit finds it. */
  infinity: FiniteNumber.optional(),
  reported: z.object({ k: ReportedValue.optional() }).optional(),
});

export type PointRun = z.infer<typeof PointRun>;

/** One temperature and its rate constant: measured (`k`) or from a run of readings (`run`), one of the two. */
export const Point = z
  .object({
    label: Text(40),
    temperature: Temperature,
    k: z.object({ value: NumberLike, uncertainty: NumberLike.optional(), unit: UnitText }).optional(),
    run: PointRun.optional(),
  })
  .superRefine((p, ctx) => {
    if ((p.k === undefined) === (p.run === undefined)) ctx.addIssue({ code: 'custom', path: ['k'], message: 'either k (a measured rate constant) or run (readings to refit), not both or neither' });
  });
export type Point = z.infer<typeof Point>;

export const Submission = z.object({
  studentId: StudentId,
  // Two temperatures fix E_a and the rest exactly; their standard errors need a third.
  points: z.array(Point).min(2, 'at least 2 temperatures').max(50),
  reported: z.object({ Ea: ReportedValue.optional(), A: ReportedValue.optional(), dH: ReportedValue.optional(), dS: ReportedValue.optional() }).optional(),
});
export type Submission = z.infer<typeof Submission>;

const points = z.number().nonnegative().max(1000);

export const Rubric = z.object({
  /** Per point given as a run: its reported k. */
  k: points.default(1),
  Ea: points.default(2),
  EaUncertainty: points.default(1),
  A: points.default(1),
  dH: points.default(2),
  dS: points.default(2),
  /** Each value rounded consistently with its uncertainty; 0 (the default) makes a slip a warning only. */
  sigFigs: points.default(0),
});

export const Tolerances = z.object({
  k: Tolerance.default({ relative: 0.01 }),
  Ea: Tolerance.default({ relative: 0.02 }),
  // ln A carries the intercept's uncertainty, which 1/T far from zero makes large: A is read loosely.
  A: Tolerance.default({ relative: 0.1 }),
  dH: Tolerance.default({ relative: 0.02 }),
  dS: Tolerance.default({ absolute: 2 }),
  uncertainty: Tolerance.default({ relative: 0.25 }),
});

export const Settings = z.object({
  kind: z.literal(KIND),
  /** Ordinary least squares, or weighted by 1/SE(ln k)^2 where every k has its standard error. */
  fit: z.enum(['ordinary', 'weighted']).default('ordinary'),
  units: z
    .object({ Ea: UnitText.default('kJ mol^-1'), A: UnitText.default('s^-1'), dH: UnitText.default('kJ mol^-1'), dS: UnitText.default('J K^-1 mol^-1') })
    .default({ Ea: 'kJ mol^-1', A: 's^-1', dH: 'kJ mol^-1', dS: 'J K^-1 mol^-1' }),
  tolerances: Tolerances.default(Tolerances.parse({})),
  rubric: Rubric.default(Rubric.parse({})),
  /** Plausibility bands: a right value outside its band is a warning to look at, never points. */
  reference: z.object({ Ea: Band.optional(), A: Band.optional(), dH: Band.optional(), dS: Band.optional() }).optional(),
  late: LatePolicy.default(LATE_POLICY_DEFAULT),
});
export type Settings = z.infer<typeof Settings>;
export type SettingsInput = z.input<typeof Settings>;

/** Our values, each in the instructor's unit. */
export const Refit = z.object({
  Ea: Estimate,
  A: Estimate,
  dH: Estimate,
  dS: Estimate,
  /** The points as fitted: T in kelvin and k per second. */
  points: z.array(z.object({ label: z.string(), temperatureK: z.number(), kPerSecond: z.number() })),
});
export type Refit = z.infer<typeof Refit>;
