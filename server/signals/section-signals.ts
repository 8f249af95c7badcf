import { findSharedReadings, type SharedReport } from './shared-readings.ts';
import { findSmoothRuns, type SmoothRun } from './smooth-readings.ts';

/** What a section's data say beyond the arithmetic, for the TA's review; the same for the service and the command. */
export interface SectionSignals extends SharedReport {
  /** Why nothing was compared, when nothing was. */
  notCompared?: string;
  smooth: SmoothRun[];
}

/** A valid submission of the first kind, as far as the signals read it. */
interface RunsPayload {
  studentId: string;
  runs: Array<{ label: string; timeUnit: string; readings: Array<[number, number]>; reported?: { k?: { value: string | number } } }>;
}

const nothing = (why: string): SectionSignals => ({ notCompared: why, pairs: [], groups: [], smooth: [] });

/** `submissions`: the section's latest valid submissions, as their schema read them. */
export function sectionSignals(settings: { kind: string; classDataset?: unknown; instrumentNoise?: number }, submissions: unknown[]): SectionSignals {
  if (settings.kind !== 'first-order-catalysis') return nothing(`the kind ${settings.kind} has no runs of readings to compare`);
  if (settings.classDataset) return nothing('the class was handed one dataset, so shared and identical readings are expected');
  const payloads = submissions as RunsPayload[];
  const shared = findSharedReadings(payloads.map((p) => ({ studentId: p.studentId, runs: p.runs, reportedK: p.runs.map((r) => r.reported?.k?.value) })));
  return { ...shared, smooth: findSmoothRuns(payloads, settings.instrumentNoise) };
}
