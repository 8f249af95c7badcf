import { findingCodes, KIND, Settings, stages, Submission } from '../schemas.ts';
import type { ExperimentKind } from '../../../server/checks/experiment-kind.ts';
import { checkFirstOrderCatalysis } from './check-submission.ts';
import { runSectionSignals } from '../../../server/signals/run-section-signals.ts';
import { maxScore } from './scoring.ts';
import { settingsIssues } from './settings-issues.ts';
import { catalysisFormSummary } from '../form-summary.ts';

export const firstOrderCatalysis: ExperimentKind<Settings, Submission> = {
  kind: KIND,
  findingCodes,
  // What run-signals.ts raises, in the order the signals panel lists them.
  signalCodes: ['small-change', 'over-resolution', 'residual-pattern', 'end-value', 'temperature-spread', 'temperature-missing', 'digit-preference', 'constant-apart'],
  stages,
  settingsSchema: Settings,
  submissionSchema: Submission,
  settingsIssues,
  check: checkFirstOrderCatalysis,
  maxScore,
  formSummary: catalysisFormSummary,
  sectionSignals: runSectionSignals,
  // The parser loads on the first CSV, not with the checker.
  csvLayout: {
    main: 'readings',
    optional: ['reported'],
    read: async (files) => (await import('../csv.ts')).parseSubmissionsCsv(files.readings, files.reported),
  },
};
