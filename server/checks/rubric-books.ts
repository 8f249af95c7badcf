import type { Finding, RubricCount } from '../../schemas/result.ts';

/**
 * The books of one result, kept in one place so that the checker's score, the TAs' overrides, the
 * results table, the gradebook and the sheet's rubric rows all add up the same way: every finding's
 * points come out of one rubric item (one instance of it where the item counts per run), no item
 * loses more than it is worth, the rows sum to the points lost and the score is the maximum less them.
 */
export interface RubricRow {
  item: string;
  /** Times the item counts for this submission (runs, or 1). */
  count: number;
  each: number;
  available: number;
  lost: number;
  earned: number;
}

export interface Books {
  /** The findings with the points they really cost (what was asked, within what their item has left). */
  findings: Finding[];
  rows: RubricRow[];
  maxScore: number;
  lost: number;
  score: number;
}

// Points are written with a few decimals; sums of them are kept clear of binary rounding dust.
const tidy = (x: number): number => Math.round(x * 1e9) / 1e9;

type Priced = Pick<Finding, 'rubricItem' | 'itemKey'>;

interface Pools {
  /** The instance a finding's points come out of, and what it is worth. */
  instance: { key: string; worth: number };
  /** The whole item, and what it is worth. */
  item: { key: string; worth: number };
}

/**
 * Where a finding's points come from. Results stored before findings named their instance, and
 * kinds whose items count once, draw on the whole item. Without the items (results stored before
 * they were kept) the one pool is the maximum.
 */
function poolsOf(f: Priced, items: readonly RubricCount[] | undefined, maxScore: number): Pools {
  if (!items) return { instance: { key: '*', worth: maxScore }, item: { key: '*', worth: maxScore } };
  const item = items.find((c) => c.item === f.rubricItem);
  // Points on an item this submission is not graded on cost nothing.
  if (!item) return { instance: { key: `-${f.rubricItem ?? ''}`, worth: 0 }, item: { key: `-${f.rubricItem ?? ''}`, worth: 0 } };
  const whole = { key: item.item, worth: tidy(item.each * item.count) };
  return { instance: f.itemKey !== undefined ? { key: `@${f.itemKey}`, worth: item.each } : whole, item: whole };
}

/** The maximum: what the items are worth together, or as stored for a result that does not list them. */
const maxOf = (items: readonly RubricCount[] | undefined, maxScore: number): number => (items ? tidy(items.reduce((sum, c) => sum + c.count * c.each, 0)) : maxScore);

/** A result's books: each finding's points settled within its pools, in order; the rows, the points lost and the score. */
export function settleBooks(items: readonly RubricCount[] | undefined, maxScore: number, findings: readonly Finding[]): Books {
  const max = maxOf(items, maxScore);
  const spent = new Map<string, number>();
  const settled = findings.map((f) => {
    const { instance, item } = poolsOf(f, items, max);
    const left = Math.min(instance.worth - (spent.get(instance.key) ?? 0), item.worth - (spent.get(item.key) ?? 0));
    const points = tidy(Math.max(0, Math.min(f.pointsLost, left)));
    spent.set(instance.key, tidy((spent.get(instance.key) ?? 0) + points));
    if (item.key !== instance.key) spent.set(item.key, tidy((spent.get(item.key) ?? 0) + points));
    return points === f.pointsLost ? f : { ...f, pointsLost: points };
  });
  const rows = (items ?? []).map(({ item, count, each }) => {
    const available = tidy(each * count);
    const lost = tidy(settled.reduce((sum, f) => (f.rubricItem === item ? sum + f.pointsLost : sum), 0));
    return { item, count, each, available, lost, earned: tidy(available - lost) };
  });
  const lost = tidy(settled.reduce((sum, f) => sum + f.pointsLost, 0));
  return { findings: settled, rows, maxScore: max, lost, score: tidy(max - lost) };
}

/**
 * The most a TA may set one finding's points to: what its rubric item (instance) has left once the
 * item's other findings have cost what they cost, their own overrides applied. `undefined`: no such finding.
 */
export function overrideLimit(items: readonly RubricCount[] | undefined, maxScore: number, findings: readonly Finding[], findingId: string): number | undefined {
  const target = findings.find((f) => f.id === findingId);
  if (!target) return undefined;
  const others = settleBooks(items, maxScore, findings.filter((f) => f !== target)).findings;
  const max = maxOf(items, maxScore);
  const { instance, item } = poolsOf(target, items, max);
  const spentOn = (key: string) =>
    others.reduce((sum, f) => {
      const p = poolsOf(f, items, max);
      return p.instance.key === key || p.item.key === key ? sum + f.pointsLost : sum;
    }, 0);
  return tidy(Math.max(0, Math.min(instance.worth - spentOn(instance.key), item.worth - spentOn(item.key))));
}
