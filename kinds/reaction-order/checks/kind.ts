import type { ExperimentKind } from '../../../server/checks/experiment-kind.ts';
import { pointsOf } from '../../../server/checks/scored-result.ts';
import { reactionOrderCsvLayout } from '../csv-layout.ts';
import { findingCodes, KIND, Settings, stages, Submission } from '../schemas.ts';
import { checkReactionOrder } from './check-submission.ts';
import { rubricCounts } from './rubric-counts.ts';
import { settingsIssues } from './settings-issues.ts';
import { reactionOrderFormSummary } from '../form-summary.ts';

export const reactionOrder: ExperimentKind<Settings, Submission> = {
  kind: KIND,
  findingCodes,
  // It compares no submissions of a section, so it raises no signals.
  signalCodes: [],
  stages,
  settingsSchema: Settings,
  submissionSchema: Submission,
  settingsIssues,
  check: checkReactionOrder,
  maxScore: (settings, submission) => pointsOf(rubricCounts(settings, submission)),
  csvLayout: reactionOrderCsvLayout,
  formSummary: reactionOrderFormSummary,
};
