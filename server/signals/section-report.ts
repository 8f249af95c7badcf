import type { SharedReport } from './shared-readings.ts';
import type { SmoothRun } from './smooth-readings.ts';

/** What a section's data say beyond the arithmetic, for the TA's review; the same for the service and the command. */
export interface SectionSignals extends SharedReport {
  /** Why nothing was compared, when nothing was. */
  notCompared?: string;
  smooth: SmoothRun[];
}

export const nothingCompared = (why: string): SectionSignals => ({ notCompared: why, pairs: [], groups: [], smooth: [] });
