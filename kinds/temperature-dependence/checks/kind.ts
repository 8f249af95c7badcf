import { findingCodes, KIND, Settings, stages, Submission } from '../schemas.ts';
import type { ExperimentKind } from '../../../server/checks/experiment-kind.ts';
import { pointsOf } from '../../../server/checks/scored-result.ts';
import { checkTemperatureDependence, rubricCounts } from './check-submission.ts';
import { settingsIssues } from './settings-issues.ts';
import { temperatureFormSummary } from '../form-summary.ts';

export const temperatureDependence: ExperimentKind<Settings, Submission> = {
  kind: KIND,
  findingCodes,
  signalCodes: [],
  stages,
  settingsSchema: Settings,
  submissionSchema: Submission,
  settingsIssues,
  check: checkTemperatureDependence,
  maxScore: (settings, submission) => pointsOf(rubricCounts(settings, submission)),
  formSummary: temperatureFormSummary,
  // The parser loads on the first CSV, not with the checker.
  csvLayout: {
    main: 'points',
    optional: ['reported'],
    read: async (files) => (await import('../csv.ts')).parseTemperatureCsv(files.points, files.reported),
  },
};
