import { causeCounts } from '../../reports/result-summary.ts';
import type { PageSummary } from '../store/page-summaries.ts';
import type { StoredResult } from '../store/submissions.ts';
import { effectiveResult, type EffectiveFinding, type EffectiveResult } from './effective-result.ts';
import { asShown } from './released.ts';

/**
 * Counted the way the feedback sheet groups findings: one per likely cause, so a slip repeated in four
 * values (charged once) counts once, and values that merely follow from the student's own numbers are notes.
 */
export function pageCounts(findings: EffectiveFinding[]): Pick<PageSummary, 'errors' | 'warnings' | 'infos' | 'codes'> {
  const counts = causeCounts(findings);
  return { errors: counts.costingPoints, warnings: counts.warnings, infos: counts.notes, codes: [...new Set(findings.map((f) => f.code))] };
}

/** What the results page shows of an effective result. */
export function pageSummaryOf(result: EffectiveResult): PageSummary {
  return { score: result.score, maxScore: result.maxScore, ...pageCounts(result.findings), shown: asShown(result) };
}

/** A result to store with its summary: the one a result with no override and no signal choice has. */
export function withPageSummary<T extends StoredResult>(result: T): T {
  const row = {
    resultId: 0,
    submissionId: 0,
    engineVersion: result.engineVersion,
    settingsVersion: 0,
    status: result.status,
    score: result.score,
    maxScore: result.maxScore,
    findings: JSON.parse(result.findingsJson) as unknown,
    releasedAt: null,
    gradedAt: new Date(0),
    settings: null,
    refit: null,
  };
  return { ...result, pageSummaryJson: JSON.stringify(pageSummaryOf(effectiveResult(row, []))) };
}
