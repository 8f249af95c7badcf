import { z } from 'zod';
import { LATE_POLICY_DEFAULT, LatePolicy } from '../../../schemas/common.ts';
import { HANDING_IN_STAGE } from '../../../schemas/result.ts';

/**
 * A kind that lives only in the test suite: runs of readings decaying to a known end value, each run
 * fitted for its own first-order k (ln F against t), and nothing over the runs (no catalyst, no rate
 * law). It shows that the command, the pool, the service, the documents and the page take a kind they
 * do not know. Invented data only.
 */
export const DECAY_RUNS = 'decay-runs';

export const Settings = z.object({
  kind: z.literal(DECAY_RUNS),
  /** A share of the refit k. */
  tolerance: z.number().positive().max(0.5).default(0.03),
  pointsPerRun: z.number().nonnegative().max(20).default(2),
  /** Fewer readings in a run raise the kind's own signal, few-readings. */
  minReadings: z.number().int().min(3).max(50).default(6),
  late: LatePolicy.default(LATE_POLICY_DEFAULT),
});
export type Settings = z.infer<typeof Settings>;

const Run = z.object({
  label: z.string().min(1).max(40),
  timeUnit: z.enum(['s', 'min']),
  /** The end value x_inf, measured. */
  infinity: z.number(),
  readings: z.array(z.tuple([z.number(), z.number()])).min(3).max(200),
  reported: z.object({ k: z.object({ value: z.number() }) }),
});

export const Submission = z.object({
  studentId: z.string().min(1).max(64),
  runs: z.array(Run).min(1).max(12),
});
export type Submission = z.infer<typeof Submission>;

/** Our values for each run, in the run's own rate unit; k is null where the run could not be fitted. */
export interface RunRefit {
  label: string;
  k: { value: number; standardError: number; unit: string } | null;
  interceptLnF: number | null;
}
export interface Refit {
  [key: string]: unknown;
  runs: RunRefit[];
}

export const findingCodes = ['sign-flipped', 'log-base', 'half-life-for-k', 'unexplained', 'late-submission'] as const;
export const signalCodes = ['few-readings'] as const;
export const stages = [{ id: 'runs', title: 'Each run: k' }, HANDING_IN_STAGE];
