import type { Finding } from '../../schemas/result.ts';

/** A finding before scoring: what it would cost, and which rubric item (per run where it applies). */
export interface DraftFinding extends Omit<Finding, 'id' | 'pointsLost' | 'itemKey'> {
  charge: number;
  /** The rubric item instance the points come from, e.g. `k@runs[2]`; the books cap points per instance (rubric-books.ts). */
  itemKey?: string;
}

/**
 * Turns drafts (in the order the work was done) into findings with points: a systematic cause (one
 * that comes from a habit, not a one-off: `systematic`, the kind's list) is named each time it shows
 * and costs once, where it first entered. What each finding asks is capped by its rubric item later, in
 * the books (settleBooks), the one place points are capped.
 */
export function scoreFindings(drafts: DraftFinding[], systematic: ReadonlySet<string>): Finding[] {
  const chargedAt = new Map<string, string>();
  return drafts.map(({ charge, itemKey, ...draft }) => {
    const causes = [draft.code, ...(draft.alsoCodes ?? [])];
    let points = charge;
    let message = draft.message;
    const earlier = causes.every((c) => systematic.has(c) && chargedAt.has(c)) ? chargedAt.get(draft.code) : undefined;
    if (points > 0 && earlier !== undefined) {
      points = 0;
      message += ` Counted once: the same likely cause was already scored at ${earlier}.`;
    }
    if (charge > 0) for (const c of causes) if (systematic.has(c) && !chargedAt.has(c)) chargedAt.set(c, draft.path);
    return { id: `${draft.code}@${draft.path}`, ...draft, ...(itemKey !== undefined && { itemKey }), message, pointsLost: points };
  });
}
