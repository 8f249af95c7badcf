import { prepareSubmission, sharedAmong, type PreparedSubmission } from './shared-readings.ts';
import { nothingCompared, type SectionSignalCollector } from './section-report.ts';
import { runScatters, smoothAmong, type RunScatter } from './smooth-readings.ts';

/** A valid submission with runs of readings, as far as the signals read it. */
interface RunsPayload {
  studentId: string;
  runs: Array<{ label: string; timeUnit: string; readings: Array<[number, number]>; reported?: { k?: { value: string | number } } }>;
}

/**
 * Readings that look alike between students, and runs smoother than the instrument, for kinds with runs
 * of readings. Of each submission only its runs prepared for the comparison and each run's scatter are
 * kept: on a course-wide file the submissions themselves would be most of the memory.
 */
export function runSignalCollector(settings: { classDataset?: unknown; instrumentNoise?: number }): SectionSignalCollector {
  if (settings.classDataset) {
    const why = 'the class was handed one dataset, so shared and identical readings are expected';
    return { add: () => {}, finish: () => nothingCompared(why) };
  }
  const prepared: PreparedSubmission[] = [];
  const scatters: RunScatter[] = [];
  return {
    add(submission) {
      const p = submission as RunsPayload;
      prepared.push(prepareSubmission({ studentId: p.studentId, runs: p.runs, reportedK: p.runs.map((r) => r.reported?.k?.value) }));
      for (const run of runScatters(p)) scatters.push(run);
    },
    finish: () => ({ ...sharedAmong(prepared), smooth: smoothAmong(scatters, settings.instrumentNoise) }),
  };
}
