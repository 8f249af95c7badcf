import type { SharedReport } from './shared-readings.ts';
import type { SmoothRun } from './smooth-readings.ts';

/** What a section's data say beyond the arithmetic, for the TA's review; the same for the service and the command. */
export interface SectionSignals extends SharedReport {
  /** Why nothing was compared, when nothing was. */
  notCompared?: string;
  smooth: SmoothRun[];
}

export const nothingCompared = (why: string): SectionSignals => ({ notCompared: why, pairs: [], groups: [], smooth: [] });

/**
 * A section's signals gathered one submission at a time (each a valid submission of the kind, as its
 * schema read it): what the comparison needs is taken from each as it comes, and the submission let go.
 */
export interface SectionSignalCollector {
  add(submission: unknown): void;
  finish(): SectionSignals;
}
