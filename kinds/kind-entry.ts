import type { KindReport } from '../reports/kind-report.ts';
import type { KindSettings } from '../reports/feedback-input.ts';
import type { ExperimentKind } from '../server/checks/experiment-kind.ts';
import type { CheckResult } from '../schemas/result.ts';

/**
 * What a kind's folder gives the registry (its index.ts): its checker, and its parts of the documents,
 * loaded only when a document is drawn. Typed by the kind's own settings, submission and refit.
 */
export interface KindEntry<Settings extends KindSettings = KindSettings, Submission = unknown, Refit = CheckResult['refit']> {
  checker: ExperimentKind<Settings, Submission>;
  report(): Promise<KindReport<Settings, Submission, Refit>>;
}
