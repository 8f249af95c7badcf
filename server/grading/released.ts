import type { NewRelease, ReleaseRow } from '../store/releases.ts';
import type { SignalChoiceRow } from '../store/signal-choices.ts';
import type { OverrideRow, ResultRow } from '../store/submissions.ts';
import { effectiveResult, signalKey, type EffectiveResult } from './effective-result.ts';

/**
 * A submission's latest result beside what its student was shown: a release keeps the result it named
 * with the overrides and signal choices made until then, so neither a regrade, nor a later override,
 * nor a new version changes what a student sees until a TA releases again.
 */
export interface ResultAndRelease {
  /** The latest result with every override and choice so far. */
  current: EffectiveResult;
  /** What the student sees, when something was released. */
  released?: EffectiveResult;
  /** The version whose result was released (its submission id and number): this one or an earlier one of the same student. */
  releasedSubmissionId?: number;
  releasedVersion?: number;
  /**
   * Released, and the latest result would show the student something else (score, findings or
   * points, signals on the sheet); a later version than the one released always would.
   */
  changedSinceRelease: boolean;
  /** What releasing it now would record. */
  nextRelease: NewRelease;
}

/** What a student would notice of a result: its score and each finding's points and severity, and the signals on the sheet. */
export function asShown(r: EffectiveResult): string {
  return JSON.stringify([
    r.status,
    r.score,
    r.maxScore,
    r.findings.map((f) => [f.id, f.pointsLost, f.severity]),
    r.signals.filter((s) => s.onSheet).map(signalKey),
  ]);
}

export function resultAndRelease(
  current: ResultRow,
  release: ReleaseRow | undefined,
  releasedRow: ResultRow | undefined,
  overrides: OverrideRow[],
  choices: SignalChoiceRow[],
): ResultAndRelease {
  const now = effectiveResult(current, overrides, choices);
  const nextRelease = releaseOf(current.submissionId, now, overrides, choices);
  if (!release || !releasedRow) return { current: now, changedSinceRelease: false, nextRelease };
  const released = effectiveResult(
    releasedRow,
    overrides.filter((o) => o.id <= release.overridesThrough),
    choices.filter((c) => c.id <= release.choicesThrough),
  );
  const changedSinceRelease = release.submissionId !== current.submissionId || asShown(now) !== asShown(released);
  return { current: now, released: { ...released, releasedAt: release.releasedAt }, releasedSubmissionId: release.submissionId, releasedVersion: release.version, changedSinceRelease, nextRelease };
}

/** A release of the latest result with everything done to it so far. */
function releaseOf(submissionId: number, current: EffectiveResult, overrides: OverrideRow[], choices: SignalChoiceRow[]): NewRelease {
  const last = (rows: Array<{ id: number; submissionId: number }>) => rows.reduce((max, r) => (r.submissionId === submissionId && r.id > max ? r.id : max), 0);
  return { submissionId, resultId: current.resultId, overridesThrough: last(overrides), choicesThrough: last(choices) };
}
