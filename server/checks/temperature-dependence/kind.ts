import { findingCodes, KIND, Settings, stages, Submission } from '../../../schemas/kinds/temperature-dependence.ts';
import type { ExperimentKind } from '../experiment-kind.ts';
import { pointsOf } from '../scored-result.ts';
import { checkTemperatureDependence, rubricCounts } from './check-submission.ts';
import { settingsIssues } from './settings-issues.ts';

export const temperatureDependence: ExperimentKind<Settings, Submission> = {
  kind: KIND,
  findingCodes,
  stages,
  settingsSchema: Settings,
  submissionSchema: Submission,
  settingsIssues,
  check: checkTemperatureDependence,
  maxScore: (settings, submission) => pointsOf(rubricCounts(settings, submission)),
  // The parser loads on the first CSV, not with the checker.
  csvLayout: {
    main: 'points',
    optional: ['reported'],
    read: async (files) => (await import('../../input/temperature-csv.ts')).parseTemperatureCsv(files.points, files.reported),
  },
};
