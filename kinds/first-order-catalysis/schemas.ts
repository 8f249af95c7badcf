import { z } from 'zod';
import { Band, FiniteNumber, withFastPath, FitModel, NumberLike, Quantity, ReportedValue, StudentId, Text, Tolerance, UnitText, LatePolicy, LATE_POLICY_DEFAULT } from '../../schemas/common.ts';
import { Estimate, HANDING_IN_STAGE, RefitValue } from '../../schemas/result.ts';
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
  { id: 'equilibrium', title: 'Equilibrium: composition, K, k_{f} and k_{r}' },
  { id: 'reporting', title: 'Reporting' },
  HANDING_IN_STAGE,
] as const;
export type Stage = (typeof stages)[number]['id'];

/**
 * The codes of the equilibrium block (only with `equilibrium` in the settings): the composition
 * outside 0 to 1 is a finding on the data; the others are slips of the student's arithmetic.
 */
export const equilibriumCodes = [
  'composition-outside',
  'anomers-swapped',
  'percent-fraction',
  'inverted-constant',
  'path-length-unit',
  'mass-concentration-unit',
  'start-for-end-value',
  'rate-constants-swapped',
] as const;
export type EquilibriumCode = (typeof equilibriumCodes)[number];

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
  ...equilibriumCodes,
  'sig-figs',
  'unit-unrecognised',
  'unit-assumed',
  'missing-value',
  'unexplained',
  'refit-note',
  'late-submission',
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
      // With the settings' equilibrium block: the run's composition at equilibrium and the split of k.
      /** [α]_eq = α_inf / (l c), in deg mL g^-1 dm^-1. */
      specificRotation: ReportedValue.optional(),
      /** x_B, the fraction of the anomer with the smaller specific rotation; unit `%` for a percentage, else a fraction. */
      xB: ReportedValue.optional(),
      /** K = [B]/[A] = x_B / x_A (no unit). */
      K: ReportedValue.optional(),
      /** k_f (A -> B) = k_obs K / (1 + K) and k_r (B -> A) = k_obs / (1 + K). */
      kf: ReportedValue.optional(),
      kr: ReportedValue.optional(),
    })
    .optional(),
});
export type SubmittedRun = z.infer<typeof SubmittedRun>;

const points = z.number().nonnegative().max(1000);

export const Submission = z.object({
  studentId: StudentId,
  runs: z.array(SubmittedRun).min(1, 'at least one run').max(50),
  reported: z
    .object({
      kN: ReportedValue.optional(),
      kA: ReportedValue.optional(),
      // With the settings' equilibrium block: the mean K over the runs, and k_N and k_A split as each k_obs is.
      K: ReportedValue.optional(),
      kNf: ReportedValue.optional(),
      kNr: ReportedValue.optional(),
      kAf: ReportedValue.optional(),
      kAr: ReportedValue.optional(),
    })
    .optional(),
});
export type Submission = z.infer<typeof Submission>;

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

export const SPECIFIC_ROTATION_UNIT = 'deg mL g^-1 dm^-1';
const SpecificRotation = z.object({ value: FiniteNumber, unit: z.literal(SPECIFIC_ROTATION_UNIT).default(SPECIFIC_ROTATION_UNIT), name: Text(40).optional() });
/** The cell's path length; [α] takes it in dm. */
export const PathLength = z.object({ value: z.number().positive().max(1000), unit: z.enum(['dm', 'cm', 'mm']) });
export type PathLength = z.infer<typeof PathLength>;
/** The solution's mass concentration; [α] takes it in g/mL. */
export const MassConcentration = z.object({ value: z.number().positive().max(1000), unit: z.enum(['g/mL', 'g/100 mL', 'g/L']) });
export type MassConcentration = z.infer<typeof MassConcentration>;

const EquilibriumTolerances = z.object({
  specificRotation: Tolerance.default({ relative: 0.01 }),
  xB: Tolerance.default({ absolute: 0.005 }),
  K: Tolerance.default({ relative: 0.02 }),
  /** For k_f and k_r, per run and of k_N and k_A. */
  kSplit: Tolerance.default({ relative: 0.02 }),
});

const EquilibriumRubric = z.object({
  /** Per run with x_inf: [α]_eq where given, and x_B. */
  composition: points.default(1),
  /** Per run with x_inf: K. */
  constant: points.default(1),
  /** Per run with x_inf: k_f and k_r together. */
  kSplit: points.default(1),
  /** Once: the mean K. */
  meanK: points.default(1),
  /** Once: k_N and k_A split into forward and reverse parts. */
  rateLawSplit: points.default(1),
});

/**
 * The run's end value read as the equilibrium composition: [α]_eq = α_inf / (l c) lies between the
 * pure anomers' specific rotations. A is always the anomer with the larger specific rotation, whichever
 * form the runs start from, so that k_f (A -> B) and k_r keep their names.
 */
export const Equilibrium = z
  .object({
    pureForms: z.object({
      A: SpecificRotation,
      B: SpecificRotation,
      /** Where the specific rotations hold: they are comparable only at one wavelength and temperature. */
      wavelengthNm: z.number().positive().max(10000),
      temperatureC: FiniteNumber,
    }),
    pathLength: PathLength,
    concentration: MassConcentration,
    /** Where runs were made up at other concentrations: by run label; a run not named has `concentration`. */
    concentrationByRun: z.record(Text(40), MassConcentration).optional(),
    /** Which anomer the runs start from. */
    startsFrom: z.enum(['A', 'B']),
    tolerances: EquilibriumTolerances.default(EquilibriumTolerances.parse({})),
    rubric: EquilibriumRubric.default(EquilibriumRubric.parse({})),
  })
  .refine((e) => e.pureForms.A.value > e.pureForms.B.value, {
    path: ['pureForms', 'A'],
    message: 'A is the anomer with the larger specific rotation: A.value must be above B.value',
  });
export type Equilibrium = z.infer<typeof Equilibrium>;

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
  /** The equilibrium composition from each run's end value and the split of k into k_f and k_r; without it neither is asked. */
  equilibrium: Equilibrium.optional(),
  late: LatePolicy.default(LATE_POLICY_DEFAULT),
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

/** One run's composition at equilibrium and the split of its k_obs (k_f, k_r in the instructor's unit of k). */
export const RunEquilibrium = z.object({
  label: z.string(),
  specificRotation: Estimate,
  xB: Estimate,
  /** Absent where x_B lies outside 0 to 1: no K follows from it. */
  K: Estimate.optional(),
  kf: Estimate.optional(),
  kr: Estimate.optional(),
});
export type RunEquilibrium = z.infer<typeof RunEquilibrium>;

export const EquilibriumRefit = z.object({
  /** One per run, null for a run without x_inf or without a fit. */
  runs: z.array(RunEquilibrium.nullable()),
  /** The mean K over the runs that give one: its standard error, and the spread (sample SD) of the runs' K. */
  meanK: z.object({ value: z.number(), standardError: z.number(), sd: z.number().optional(), n: z.number().int() }).optional(),
  kNf: Estimate.optional(),
  kNr: Estimate.optional(),
  kAf: Estimate.optional(),
  kAr: Estimate.optional(),
});
export type EquilibriumRefit = z.infer<typeof EquilibriumRefit>;

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
  /** With the settings' equilibrium block. */
  equilibrium: EquilibriumRefit.optional(),
});
export type Refit = z.infer<typeof Refit>;
