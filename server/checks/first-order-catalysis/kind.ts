import { findingCodes, KIND, Settings, stages, Submission } from '../../../schemas/kinds/first-order-catalysis.ts';
import type { ExperimentKind } from '../experiment-kind.ts';
import { checkFirstOrderCatalysis } from './check-submission.ts';
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
};
