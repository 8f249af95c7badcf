import type { Finding, RubricCount, Signal } from '../../schemas/result.ts';
import { settleBooks } from '../checks/rubric-books.ts';
import type { SignalChoiceRow } from '../store/signal-choices.ts';
import type { OverrideRow, ResultRow } from '../store/submissions.ts';

/**
 * A stored result with the TAs' overrides applied: each finding's points are the latest override's
 * (within what its rubric item has left, should a regrade have changed the item's worth), the score is
 * recomputed by the books, and every override stays listed (the audit trail). Overrides are keyed by
 * submission and finding id (code and place), so they carry over to a regrade that finds the same thing.
 */
export interface EffectiveFinding extends Finding {
  override?: { pointsLost: number; reason: string; reasonShown: boolean; by: string; at: Date; originalPointsLost: number };
}

/** A type, not an interface, so that it fits the loose result schema of the responses. */
export type EffectiveResult = {
  resultId: number;
  status: string;
  score: number | null;
  maxScore: number;
  engineVersion: string;
  settingsVersion: number;
  gradedAt: Date;
  releasedAt: Date | null;
  refit: unknown;
  findings: EffectiveFinding[];
  rejected: Array<{ path: string; message: string }>;
  /** What the maximum is made of (absent in results stored before it was kept). */
  items?: RubricCount[];
  /**
   * Signals about the measurement, for review; empty in results stored before they were kept. Those a
   * TA put on the student's sheet (their latest choice) carry `onSheet: true`.
   */
  signals: Signal[];
};

/** How a choice names its signal: a signal is one code at one place. */
export const signalKey = (s: { code: string; path: string }): string => `${s.code} ${s.path}`;

export function effectiveResult(row: ResultRow, overrides: OverrideRow[], choices: SignalChoiceRow[] = []): EffectiveResult {
  const stored = row.findings as { findings: Finding[]; rejected: Array<{ path: string; message: string }>; items?: RubricCount[]; signals?: Signal[] };
  const latest = new Map<string, OverrideRow>();
  for (const o of overrides) if (o.submissionId === row.submissionId) latest.set(o.findingId, o);
  const asked: EffectiveFinding[] = stored.findings.map((f) => {
    const o = latest.get(f.id);
    if (!o) return f;
    return { ...f, pointsLost: o.pointsAfter, override: { pointsLost: o.pointsAfter, reason: o.reason, reasonShown: o.reasonShown, by: o.by, at: o.at, originalPointsLost: f.pointsLost } };
  });
  const books = settleBooks(stored.items, row.maxScore, asked);
  const findings = books.findings as EffectiveFinding[];
  const onSheet = new Map<string, boolean>();
  for (const c of choices) if (c.submissionId === row.submissionId) onSheet.set(signalKey(c), c.onSheet);
  return {
    resultId: row.resultId,
    status: row.status,
    score: row.score === null ? null : books.score,
    maxScore: row.score === null ? row.maxScore : books.maxScore,
    engineVersion: row.engineVersion,
    settingsVersion: row.settingsVersion,
    gradedAt: row.gradedAt,
    releasedAt: row.releasedAt,
    refit: row.refit,
    findings,
    rejected: stored.rejected,
    items: stored.items,
    signals: (stored.signals ?? []).map((s) => (onSheet.get(signalKey(s)) ? { ...s, onSheet: true } : s)),
  };
}
