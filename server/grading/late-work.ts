import { LATE_POLICY_DEFAULT, type LatePolicy } from '../../schemas/common.ts';
import type { GradedForStore } from '../batches/graded-for-store.ts';
import type { Arrival } from '../store/submissions.ts';
import { applyLatePolicy } from './late-policy.ts';

/** The late-work setting of stored (validated) settings; those stored before the setting existed grade late work as usual. */
export function latePolicyOf(settings: unknown): LatePolicy {
  return (settings as { late?: LatePolicy }).late ?? LATE_POLICY_DEFAULT;
}

/** How a student's own submission arrives: late past the deadline, and then held when the setting holds late work. */
export function studentArrival(isLate: boolean, late: LatePolicy): Arrival {
  return { source: 'student', late: isLate, held: isLate && late.policy === 'hold' };
}

/**
 * A checked submission in the form the store keeps it, with the late-work setting applied to its
 * result: its findings are JSON text here, read and written again only for a late submission.
 */
export function gradedWithLatePolicy(graded: GradedForStore, late: LatePolicy, isLate: boolean): GradedForStore {
  if (!isLate) return graded;
  const stored = JSON.parse(graded.findingsJson) as { findings: Parameters<typeof applyLatePolicy>[0]['findings']; items?: Parameters<typeof applyLatePolicy>[0]['items'] };
  const adjusted = applyLatePolicy({ status: graded.status, score: graded.score, maxScore: graded.maxScore, items: stored.items, findings: stored.findings }, late, isLate);
  return { ...graded, score: adjusted.score, maxScore: adjusted.maxScore, findingsJson: JSON.stringify({ ...stored, findings: adjusted.findings }) };
}
