import type { z } from 'zod';
import type { CheckResult, Rejection } from '../../schemas/result.ts';
import type { CsvLayout } from '../input/csv-layout.ts';
import type { SectionSignals } from '../signals/section-report.ts';

/**
 * One kind of experiment the checker understands. A new kind is a folder, kinds/<kind>/, whose
 * checker implements this, registered by one line in kinds/registry.ts; nothing else changes.
 */
export interface ExperimentKind<Settings = unknown, Submission = unknown> {
  kind: string;
  /** Every finding code the kind's checker can give (the shared ones among them), in the order a summary lists them. */
  findingCodes: readonly string[];
  /** Every signal code the kind's checker can raise; a TA's choice of a signal names one of them. */
  signalCodes: readonly string[];
  /** The stages findings are grouped in, in order, with their titles (sub/superscript markup: k_{obs}). */
  stages: ReadonlyArray<{ id: string; title: string }>;
  settingsSchema: z.ZodType<Settings>;
  submissionSchema: z.ZodType<Submission>;
  /** What the schema cannot say about valid-looking settings (a unit of the wrong kind, say). */
  settingsIssues(settings: Settings): Rejection[];
  /** Refits, compares, diagnoses and scores one valid submission. Pure. */
  check(settings: Settings, submission: Submission): Omit<CheckResult, 'engineVersion'>;
  /** How submissions of this kind are read from CSV files; absent: JSON only. */
  csvLayout?: CsvLayout;
  /** What a section's submissions say together, for the TA's review; absent: nothing is compared. */
  sectionSignals?(settings: Settings, submissions: unknown[]): SectionSignals;
  /**
   * What was read from a valid submission, in plain lines for the student's form check ("4 runs read,
   * 16 readings each", "k reported for every run"): never a grade, a finding or a judgement on a value.
   */
  formSummary(submission: Submission): string[];
  /** The points available under these settings for this submission's shape. */
  maxScore(settings: Settings, submission: Submission): number;
}
