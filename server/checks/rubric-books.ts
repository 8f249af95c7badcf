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

/**
 * The item of a deduction taken off the whole score rather than out of one rubric item (late work):
 * no item of the maximum, so the maximum stays; it is settled after the items' findings and takes at
 * most what they have left, so the score never goes below 0. Not a word a kind's rubric uses.
 */
export const OFF_THE_SCORE = 'off-the-score';
const offTheScore = (f: Priced): boolean => f.rubricItem === OFF_THE_SCORE;

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
  const settled = [...findings];
  let lost = 0;
  const settle = (i: number, left: number) => {
    const f = findings[i];
    const points = tidy(Math.max(0, Math.min(f.pointsLost, left)));
    if (points !== f.pointsLost) settled[i] = { ...f, pointsLost: points };
    lost = tidy(lost + points);
    return points;
  };
  findings.forEach((f, i) => {
    if (offTheScore(f)) return;
    const { instance, item } = poolsOf(f, items, max);
    const points = settle(i, Math.min(instance.worth - (spent.get(instance.key) ?? 0), item.worth - (spent.get(item.key) ?? 0)));
    spent.set(instance.key, tidy((spent.get(instance.key) ?? 0) + points));
    if (item.key !== instance.key) spent.set(item.key, tidy((spent.get(item.key) ?? 0) + points));
  });
  // Then the deductions off the score, out of what the items' findings left.
  findings.forEach((f, i) => {
    if (offTheScore(f)) settle(i, max - lost);
  });
  const rows = (items ?? []).map(({ item, count, each }) => {
    const available = tidy(each * count);
    const itemLost = tidy(settled.reduce((sum, f) => (f.rubricItem === item ? sum + f.pointsLost : sum), 0));
    return { item, count, each, available, lost: itemLost, earned: tidy(available - itemLost) };
  });
  // Worth nothing of the maximum: the row shows what came off the score, so that the rows still add up.
  const offScore = tidy(settled.reduce((sum, f) => (offTheScore(f) ? sum + f.pointsLost : sum), 0));
  if (items && settled.some(offTheScore)) rows.push({ item: OFF_THE_SCORE, count: 1, each: 0, available: 0, lost: offScore, earned: -offScore });
  return { findings: settled, rows, maxScore: max, lost, score: tidy(max - lost) };
}

/**
 * The most a TA may set one finding's points to: what its rubric item (instance) has left once the
 * item's other findings have cost what they cost, their own overrides applied. `undefined`: no such finding.
 */
export function overrideLimit(items: readonly RubricCount[] | undefined, maxScore: number, findings: readonly Finding[], findingId: string): number | undefined {
  const target = findings.find((f) => f.id === findingId);
  if (!target) return undefined;
  const othersBooks = settleBooks(items, maxScore, findings.filter((f) => f !== target));
  const others = othersBooks.findings;
  const max = maxOf(items, maxScore);
  // What the items' findings and the other deductions off the score have left of it.
  if (offTheScore(target)) return tidy(Math.max(0, max - othersBooks.lost));
  const { instance, item } = poolsOf(target, items, max);
  const spentOn = (key: string) =>
    others.reduce((sum, f) => {
      // Deductions off the score are settled after the items: they never narrow an item's finding.
      if (offTheScore(f)) return sum;
      const p = poolsOf(f, items, max);
      return p.instance.key === key || p.item.key === key ? sum + f.pointsLost : sum;
    }, 0);
  return tidy(Math.max(0, Math.min(instance.worth - spentOn(instance.key), item.worth - spentOn(item.key))));
}
