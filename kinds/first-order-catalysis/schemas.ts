import { z } from 'zod';
import { Band, FiniteNumber, withFastPath, FitModel, NumberLike, Quantity, ReportedValue, StudentId, Text, Tolerance, UnitText } from '../../schemas/common.ts';
import { Estimate, RefitValue } from '../../schemas/result.ts';
import { Readings } from '../../schemas/readings.ts';

/**
 * Experiment kind `first-order-catalysis`: first-order runs followed by a physical observable (optical
 * rotation, absorbance, conductance) at several catalyst concentrations, then
 * k_obs = k_N + k_A [catalyst].
 */
export const KIND = 'first-order-catalysis';

/** The stages findings are grouped in, in order, with their titles (sub/superscript markup). */
export const stages = [
  { id: 'readings', title: 'Readings' },
  { id: 'run', title: 'Runs: ln F and k_{obs}' },
  { id: 'rate-law', title: 'Rate law: k_{N} and k_{A}' },
  { id: 'reporting', title: 'Reporting' },
] as const;
export type Stage = (typeof stages)[number]['id'];

/** The kind's finding codes, the shared ones among them, in the order a summary lists them. */
export const findingCodes = [
  'sign-flipped',
  'log-base',
  'time-unit',
  'concentration-unit',
  'decimal-shift',
  'swapped-axes',
  'wrong-infinity',
  'fit-model',
  'half-life-for-rate',
  'uncertainty-kind',
  'carried-forward',
  'transcription',
  'suspect-reading',
  'run-not-fitted',
  'time-unit-implausible',
  'temperature-implausible',
  'implausible',
  'sig-figs',
  'unit-unrecognised',
  'unit-assumed',
  'missing-value',
  'unexplained',
  'refit-note',
] as const;
export type FindingCode = (typeof findingCodes)[number];

/** A run's raw data as measured (or as handed out in a class dataset). */
export const RunData = z.object({
  label: Text(40),
  catalyst: Quantity,
  /** Unit of the times in `readings`. */
  timeUnit: UnitText,
  /** [t, x] pairs in time order. A row repeated exactly is kept (and reported as a likely slip). */
  readings: Readings,
  /** x_inf, the end value; absent when it was never measured (then the Guggenheim method). */
  infinity: FiniteNumber.optional(),
  temperatureC: FiniteNumber.optional(),
});
export type RunData = z.infer<typeof RunData>;

export const SubmittedRun = RunData.extend({
  reported: z
    .object({
      /** The student's ln F column, one entry per reading (null where left blank). */
      lnF: z.array(NumberLike.nullable()).optional(),
      k: ReportedValue.optional(),
    })
    .optional(),
});
export type SubmittedRun = z.infer<typeof SubmittedRun>;

export const Submission = z.object({
  studentId: StudentId,
  runs: z.array(SubmittedRun).min(1, 'at least one run').max(50),
  reported: z.object({ kN: ReportedValue.optional(), kA: ReportedValue.optional() }).optional(),
});
export type Submission = z.infer<typeof Submission>;

const points = z.number().nonnegative().max(1000);

export const Rubric = z.object({
  /** Per run, for readings that match the class dataset (only with `classDataset`). */
  readings: points.default(1),
  /** Per run, for the ln F column; 0 when the column is not asked for. */
  lnF: points.default(1),
  /** Per run. */
  k: points.default(2),
  kUncertainty: points.default(1),
  kN: points.default(2),
  kNUncertainty: points.default(1),
  kA: points.default(2),
  kAUncertainty: points.default(1),
  /** Once, for values rounded consistently with their uncertainties. */
  sigFigs: points.default(0),
});
export type Rubric = z.infer<typeof Rubric>;

export const Tolerances = z.object({
  reading: Tolerance.default({ absolute: 0.0005 }),
  lnF: Tolerance.default({ absolute: 0.002 }),
  k: Tolerance.default({ relative: 0.01 }),
  kUncertainty: Tolerance.default({ relative: 0.25 }),
  kN: Tolerance.default({ relative: 0.02 }),
  kA: Tolerance.default({ relative: 0.02 }),
  /** For the standard errors of k_N and k_A. */
  rateLawUncertainty: Tolerance.default({ relative: 0.25 }),
});
export type Tolerances = z.infer<typeof Tolerances>;

export const Settings = z.object({
  kind: z.literal(KIND),
  /** The model asked for ln F against t. */
  fitModel: FitModel,
  /** How k_obs against [catalyst] is to be fitted. */
  rateLawFit: z.enum(['ordinary', 'weighted']).default('ordinary'),
  /**
   * For a weighted fit, which standard errors of k_N and k_A are right: `absolute` takes each SE of
   * k_obs as known, `scaled` multiplies by the scatter about the line (sqrt of the reduced
   * chi-square); `either` accepts both, since both conventions are taught.
   */
  weightedErrors: z.enum(['either', 'absolute', 'scaled']).default('either'),
  /** Units the instructor expects values reported in. */
  units: z
    .object({ k: UnitText.default('min^-1'), kN: UnitText.default('min^-1'), kA: UnitText.default('M^-1 min^-1') })
    .default({ k: 'min^-1', kN: 'min^-1', kA: 'M^-1 min^-1' }),
  tolerances: Tolerances.default(Tolerances.parse({})),
  rubric: Rubric.default(Rubric.parse({})),
  /** The runs handed to every student, when the class analyses shared data. */
  classDataset: z.object({ runs: z.array(RunData).min(1) }).optional(),
  /** Plausibility bands. */
  reference: z.object({ kN: Band.optional(), kA: Band.optional() }).optional(),
  /** The smallest change the instrument displays, in the readings' unit (0.001 deg for a polarimeter). */
  displayStep: z.number().positive().max(1).default(0.001),
  /** The scatter of one reading (SD, readings' unit) as the instrument's maker or the lab states it; optional. */
  instrumentNoise: z.number().positive().max(10).optional(),
  /** Runs of one experiment are meant to be at one temperature: the largest spread between them, and whether each run must record it. */
  temperature: z
    .object({ maxSpread: z.number().positive().max(100).default(1), required: z.boolean().default(false) })
    .default({ maxSpread: 1, required: false }),
});
export type Settings = z.infer<typeof Settings>;
export type SettingsInput = z.input<typeof Settings>;

/** Our values for one run: in the instructor's unit, and in the unit the student declared where it differs. */
export const RunRefit = z.object({
  label: z.string(),
  /** The model the expected k comes from: the asked one, or `exponential` for a run without x_inf. */
  model: z.enum(['origin', 'intercept', 'exponential']),
  /** Absent for a run its data cannot be fitted for; `notFitted` says why. */
  k: RefitValue.optional(),
  notFitted: z.string().optional(),
  kOtherModel: Estimate.optional(),
  kExponential: Estimate.optional(),
  halfLife: Estimate.optional(),
  /** ln F from the student's readings and x_inf, one per reading (null where undefined). */
  lnF: z.array(z.number().nullable()).optional(),
  residualSD: z.number().optional(),
});
export type RunRefit = z.infer<typeof RunRefit>;

export const Refit = z.object({
  runs: z.array(RunRefit),
  /** In the instructor's units. */
  kN: Estimate.optional(),
  kA: Estimate.optional(),
  /** The same in the units the student declared, where those differ and can be read. */
  kNDeclared: Estimate.optional(),
  kADeclared: Estimate.optional(),
  /** k_N and k_A fitted to the student's own reported k_obs values. */
  fromReportedK: z.object({ kN: Estimate, kA: Estimate }).optional(),
  /** A weighted rate law only: how far the k_obs scatter about the line beyond their standard errors. */
  weightedFit: z
    .object({
      reducedChiSquared: z.number(),
      /** The convention kN's and kA's standard errors above follow. */
      convention: z.enum(['absolute', 'scaled']),
      /** The standard errors of k_N and k_A in the other convention, in the instructor's units. */
      otherConvention: z.object({ kN: z.number(), kA: z.number() }),
    })
    .optional(),
});
export type Refit = z.infer<typeof Refit>;
