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
  /** Its assignment in `npm run demo`, loaded only by the demo; absent: the demo has none of this kind. */
  demo?(): Promise<KindDemo>;
}

/**
 * A kind's part of `npm run demo`: one assignment for the demo section, with invented submissions. The
 * demo creates it, uploads the submissions and writes the section's documents the same for every kind.
 */
export interface KindDemo {
  title: string;
  /** The settings as an instructor sends them. */
  settings: unknown;
  /** What the assignment asks, in a few words, for the demo's printout. */
  about: string;
  /** Invented submissions of the students `ids`, and the slips the generator gave each, by student id. */
  section(ids: readonly string[]): { submissions: unknown[]; slipped: ReadonlyMap<string, readonly string[]> };
}
