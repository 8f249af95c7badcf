import { findingCodes, KIND, Settings, stages, Submission } from '../../../schemas/kinds/first-order-catalysis.ts';
import type { ExperimentKind } from '../experiment-kind.ts';
import { checkFirstOrderCatalysis } from './check-submission.ts';
import { runSectionSignals } from '../../signals/run-section-signals.ts';
import { maxScore } from './scoring.ts';
import { settingsIssues } from './settings-issues.ts';

export const firstOrderCatalysis: ExperimentKind<Settings, Submission> = {
  kind: KIND,
  findingCodes,
  stages,
  settingsSchema: Settings,
  submissionSchema: Submission,
  settingsIssues,
  check: checkFirstOrderCatalysis,
  maxScore,
  sectionSignals: runSectionSignals,
  // The parser loads on the first CSV, not with the checker.
  csvLayout: {
    main: 'readings',
    optional: ['reported'],
    read: async (files) => (await import('../../input/csv-submissions.ts')).parseSubmissionsCsv(files.readings, files.reported),
  },
};
