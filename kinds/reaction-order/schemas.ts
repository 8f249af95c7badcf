import { z } from 'zod';
import { FiniteNumber, Quantity, ReportedValue, StudentId, Text, Tolerance, UnitText, LatePolicy, LATE_POLICY_DEFAULT } from '../../schemas/common.ts';
import { Estimate, HANDING_IN_STAGE, sharedFindingCodes } from '../../schemas/result.ts';
import { Readings } from '../../schemas/readings.ts';

/**
 * Experiment kind `reaction-order`: one reactant followed against time in one or more runs (as its
 * concentration, as absorbance, or as conductance), the order in that reactant (0, 1 or 2) read from
 * which integrated rate law fits, and k defined by -d[A]/dt = k [A]^n.
 */
export const KIND = 'reaction-order';

/** The stages findings are grouped in, in order, with their titles (sub/superscript markup). */
export const stages = [
  { id: 'signal', title: 'Signal to concentration' },
  { id: 'order', title: 'Order and k' },
  { id: 'half-life', title: 'Half-lives t_{1/2}' },
  { id: 'reporting', title: 'Reporting' },
  HANDING_IN_STAGE,
] as const;
export type Stage = (typeof stages)[number]['id'];

/** The kind's finding codes, the shared ones among them, in the order a summary lists them. */
export const findingCodes = [
  'order-not-supported',
  'k-unit-order',
  'other-order-law',
  'path-length',
  'transmittance',
  'absorptivity-unit',
  'end-absorbance',
  'half-life-formula',
  'stoichiometric-k',
  'time-unit',
  'concentration-unit',
  'order-undetermined',
  ...sharedFindingCodes,
] as const;
export type FindingCode = (typeof findingCodes)[number];

export const orders = [0, 1, 2] as const;
export const Order = z.union([z.literal(0), z.literal(1), z.literal(2)]);
export type Order = z.infer<typeof Order>;

const PositiveQuantity = z.object({ value: z.number().positive(), unit: UnitText });

/** The reactant measured directly as its concentration. */
export const ConcentrationSignal = z.object({ type: z.literal('concentration'), unit: UnitText });

/**
 * Absorbance, converted by the Beer-Lambert law: [A] = (A - A_inf) / (epsilon l), with A_inf the end
 * absorbance where the products absorb (absent: 0). epsilon is the reactant's molar absorptivity
 * (less the product's, where that absorbs).
 */
export const AbsorbanceSignal = z.object({
  type: z.literal('absorbance'),
  molarAbsorptivity: PositiveQuantity,
  pathLength: PositiveQuantity,
  endAbsorbance: FiniteNumber.optional(),
});

/** Conductance, converted by a linear calibration: [A] = (G - intercept) / slope. */
export const ConductanceSignal = z.object({
  type: z.literal('conductance'),
  unit: UnitText,
  calibration: z.object({
    slope: z.object({ value: FiniteNumber.refine((v) => v !== 0, 'a slope other than 0'), unit: UnitText }),
    intercept: Quantity,
  }),
});

export const Signal = z.discriminatedUnion('type', [ConcentrationSignal, AbsorbanceSignal, ConductanceSignal]);
export type Signal = z.infer<typeof Signal>;

const points = z.number().nonnegative().max(1000);

export const Rubric = z.object({
  /** Once: the order named. */
  order: points.default(2),
  k: points.default(2),
  kUncertainty: points.default(1),
  /** Once: k's unit fits the order reported (M^(1-n) per time). */
  kUnit: points.default(1),
  /** Per run that reports its half-life. */
  halfLife: points.default(1),
  /** Once, for values rounded consistently with their uncertainties; 0 (the default) makes a slip a warning only. */
  sigFigs: points.default(0),
});
export type Rubric = z.infer<typeof Rubric>;

export const Tolerances = z.object({
  k: Tolerance.default({ relative: 0.02 }),
  kUncertainty: Tolerance.default({ relative: 0.25 }),
  halfLife: Tolerance.default({ relative: 0.03 }),
});
export type Tolerances = z.infer<typeof Tolerances>;

export const Settings = z.object({
  kind: z.literal(KIND),
  signal: Signal,
  /** The time unit k and half-lives are expected in. */
  units: z.object({ time: z.enum(['s', 'min', 'h']).default('min') }).default({ time: 'min' }),
  tolerances: Tolerances.default(Tolerances.parse({})),
  rubric: Rubric.default(Rubric.parse({})),
  late: LatePolicy.default(LATE_POLICY_DEFAULT),
});
export type Settings = z.infer<typeof Settings>;
export type SettingsInput = z.input<typeof Settings>;

export const SubmittedRun = z.object({
  label: Text(40),
  /** Unit of the times in `readings`. */
  timeUnit: UnitText,
  /** [t, signal] pairs in time order, the signal as the assignment names it. */
  readings: Readings,
  /** [A]_0; absent: the run's first converted reading stands for it. */
  initialConcentration: PositiveQuantity.optional(),
  reported: z.object({ halfLife: ReportedValue.optional() }).optional(),
});
export type SubmittedRun = z.infer<typeof SubmittedRun>;

export const Submission = z.object({
  studentId: StudentId,
  runs: z.array(SubmittedRun).min(1, 'at least one run').max(50),
  reported: z.object({ order: Order, k: ReportedValue }),
});
export type Submission = z.infer<typeof Submission>;

/** One integrated law fitted to every run at once: a common k, each run its own [A]_0. */
export const LinearLawFit = z.object({
  /** k from the slope of [A], ln [A] or 1/[A] against t, in the instructor's unit (concentration in M). */
  k: Estimate,
  /** Each run's intercept of its line ([A]_0, ln [A]_0 or 1/[A]_0). */
  intercepts: z.array(z.number()),
  /** Sum of squared residuals of the transformed values. */
  residualSS: z.number(),
  dof: z.number(),
  /** Readings left out of the line (a concentration at or below zero has no logarithm or reciprocal). */
  readingsLeftOut: z.number(),
});

/** The integrated law fitted to the concentrations themselves (the signal's noise, scaled), every run at once. */
export const NonlinearLawFit = z.object({
  k: Estimate,
  /** Each run's fitted [A]_0 in M. */
  initialConcentrations: z.array(z.number()),
  /** Sum of squared residuals in M^2, and the residual SD in the signal's own unit. */
  residualSS: z.number(),
  residualSDSignal: z.number(),
  dof: z.number(),
  /**
   * Durbin-Watson statistic of the residuals in time order within runs, and its one-sided p for positive
   * correlation (a curve left in them); a fit that leaves no residual at all shows no pattern (2 and 1).
   */
  durbinWatson: z.number(),
  patternP: z.number(),
  /** The residuals, run by run, reading by reading, in M. */
  residuals: z.array(z.array(z.number())),
});

export const OrderFit = z.object({
  order: Order,
  linear: LinearLawFit.nullable(),
  nonlinear: NonlinearLawFit.nullable(),
  /** Why a fit is missing. */
  notFitted: z.string().optional(),
});
export type OrderFit = z.infer<typeof OrderFit>;

export const RunRefit = z.object({
  label: z.string(),
  /** Times in the instructor's unit and the converted concentrations in M, reading by reading. */
  times: z.array(z.number()),
  concentrations: z.array(z.number()),
  /** [A]_0 in M: as given, or the first converted reading. */
  initialConcentration: z.number(),
  /** 1 - [A]_last / [A]_0: above 1/2 the run covers at least one half-life. */
  fractionReacted: z.number(),
  /** The run's half-life by the graded order (`gradedOrder`), in the instructor's time unit. */
  halfLife: Estimate.optional(),
});
export type RunRefit = z.infer<typeof RunRefit>;

export const Refit = z.object({
  /** The order the data support; null where they cannot tell (`orderReason` says why). */
  order: Order.nullable(),
  orderReason: z.string(),
  /** k for `order` (from the fit to the concentrations), in the instructor's unit; null with `order`. */
  k: Estimate.nullable(),
  /** The graded order's k in the unit the student declared, where that differs from the instructor's and can be read. */
  kDeclared: Estimate.optional(),
  /** Orders 0, 1 and 2, in that order: byOrder[n].order is n. */
  byOrder: z.array(OrderFit),
  runs: z.array(RunRefit),
  /**
   * The order k and half-lives were graded by: the one reported, whatever the data support, so that an
   * order they do not support costs points once, at the order, and k follows from it.
   */
  gradedOrder: Order,
  /**
   * The reported order against the data: the order named (`supported`), another favoured only slightly
   * (`not-ruled-out`, a note), clearly worse (`not-supported`, charged), or no order named (`undetermined`).
   */
  orderVerdict: z.enum(['supported', 'not-ruled-out', 'not-supported', 'undetermined']),
});
export type Refit = z.infer<typeof Refit>;
