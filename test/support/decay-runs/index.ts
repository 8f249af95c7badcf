import type { KindEntry } from '../../../kinds/kind-entry.ts';
import { runSectionSignals } from '../../../server/signals/run-section-signals.ts';
import { checkDecayRuns } from './check.ts';
import { decayRunsCsv } from './csv.ts';
import { decayFormSummary } from './form-summary.ts';
import { DECAY_RUNS, findingCodes, Settings, signalCodes, stages, Submission, type Refit } from './schemas.ts';

/**
 * The test kind as the registry takes it. This module imports nothing of the registry, so the registry
 * can import it by its address (`registerKindModule`), in the test's thread and in every worker thread.
 */
export const kind: KindEntry<Settings, Submission, Refit> = {
  checker: {
    kind: DECAY_RUNS,
    findingCodes,
    signalCodes,
    stages,
    settingsSchema: Settings,
    submissionSchema: Submission,
    settingsIssues: () => [],
    check: checkDecayRuns,
    maxScore: (settings, submission) => settings.pointsPerRun * submission.runs.length,
    csvLayout: decayRunsCsv,
    formSummary: decayFormSummary,
    // Runs of readings: the generic comparisons across a section (shared readings, smooth runs) apply.
    sectionSignals: (_settings, submissions) => runSectionSignals({}, submissions),
  },
  report: async () => (await import('./report.ts')).decayRunsReport,
};
