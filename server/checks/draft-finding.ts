import type { Finding } from '../../schemas/result.ts';

/** A finding before scoring: what it would cost, and which rubric item (per run where it applies). */
export interface DraftFinding extends Omit<Finding, 'id' | 'pointsLost'> {
  charge: number;
  /** The rubric item instance the points come from, e.g. `k@runs[2]`; caps apply per instance. */
  itemKey?: string;
}

/** Causes that come from a habit, not a one-off: named each time they show, scored once. */
const SYSTEMATIC = new Set<string>([
  'sign-flipped',
  'log-base',
  'time-unit',
  'concentration-unit',
  'swapped-axes',
  'wrong-infinity',
  'fit-model',
  'half-life-for-rate',
  'uncertainty-kind',
]);

/**
 * Turns drafts (in the order the work was done: readings, runs, rate law, reporting) into findings
 * with points: a systematic cause costs once, where it first entered; no rubric item loses more than
 * it is worth.
 */
export function scoreFindings(drafts: DraftFinding[], itemPoints: (itemKey: string) => number): Finding[] {
  const chargedAt = new Map<string, string>();
  const spent = new Map<string, number>();
  return drafts.map(({ charge, itemKey, ...draft }) => {
    const causes = [draft.code, ...(draft.alsoCodes ?? [])];
    let points = charge;
    let message = draft.message;
    const earlier = causes.every((c) => SYSTEMATIC.has(c) && chargedAt.has(c)) ? chargedAt.get(draft.code) : undefined;
    if (points > 0 && earlier !== undefined) {
      points = 0;
      message += ` Counted once: the same likely cause was already scored at ${earlier}.`;
    }
    if (itemKey !== undefined) {
      const left = itemPoints(itemKey) - (spent.get(itemKey) ?? 0);
      points = Math.max(0, Math.min(points, left));
      spent.set(itemKey, (spent.get(itemKey) ?? 0) + points);
    }
    if (charge > 0) for (const c of causes) if (SYSTEMATIC.has(c) && !chargedAt.has(c)) chargedAt.set(c, draft.path);
    return { id: `${draft.code}@${draft.path}`, ...draft, message, pointsLost: points };
  });
}
