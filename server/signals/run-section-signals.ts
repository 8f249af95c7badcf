import { findSharedReadings } from './shared-readings.ts';
import { nothingCompared, type SectionSignals } from './section-report.ts';
import { findSmoothRuns } from './smooth-readings.ts';

/** A valid submission with runs of readings, as far as the signals read it. */
interface RunsPayload {
  studentId: string;
  runs: Array<{ label: string; timeUnit: string; readings: Array<[number, number]>; reported?: { k?: { value: string | number } } }>;
}

/** Readings that look alike between students, and runs smoother than the instrument, for kinds with runs of readings. */
export function runSectionSignals(settings: { classDataset?: unknown; instrumentNoise?: number }, submissions: unknown[]): SectionSignals {
  if (settings.classDataset) return nothingCompared('the class was handed one dataset, so shared and identical readings are expected');
  const payloads = submissions as RunsPayload[];
  const shared = findSharedReadings(payloads.map((p) => ({ studentId: p.studentId, runs: p.runs, reportedK: p.runs.map((r) => r.reported?.k?.value) })));
  return { ...shared, smooth: findSmoothRuns(payloads, settings.instrumentNoise) };
}
