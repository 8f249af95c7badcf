import type { Finding } from '../../schemas/result.ts';

/**
 * The findings as a student reads them: one card per likely cause (the same code and causes, wherever
 * it recurs, even in a later stage: the card stands under the stage where the cause first shows), and the values that only follow from the student's own earlier numbers
 * at no cost apart. A code that names no cause (`unexplained`, `implausible`, a refit note) stays one card per place.
 */
export interface FindingCard {
  /** The places in the checker's order; the first is where the cause entered, and its message is printed. */
  members: Finding[];
  severity: Finding['severity'];
  pointsLost: number;
}

export interface StageFindings {
  cards: FindingCard[];
  /** Carried-forward values that cost nothing: a short line, not a card. */
  followsFromOwn: Finding[];
}

const NOT_A_CAUSE = new Set(['unexplained', 'refit-note', 'implausible']);
const RANK: Record<Finding['severity'], number> = { info: 0, warning: 1, error: 2 };

const overridden = (f: Finding) => (f as Finding & { override?: unknown }).override !== undefined;

function causeKey(f: Finding, index: number): string {
  if (NOT_A_CAUSE.has(f.code)) return `#${index}`;
  return [f.code, ...(f.alsoCodes ?? [])].join('+');
}

export function groupFindings(findings: readonly Finding[]): StageFindings {
  const followsFromOwn = findings.filter((f) => f.code === 'carried-forward' && f.pointsLost === 0 && !overridden(f));
  const byCause = new Map<string, Finding[]>();
  findings.forEach((f, i) => {
    if (followsFromOwn.includes(f)) return;
    const key = causeKey(f, i);
    byCause.set(key, [...(byCause.get(key) ?? []), f]);
  });
  const cards = [...byCause.values()].map((members) => ({
    members,
    severity: members.reduce<Finding['severity']>((worst, f) => (RANK[f.severity] > RANK[worst] ? f.severity : worst), 'info'),
    pointsLost: members.reduce((sum, f) => sum + f.pointsLost, 0),
  }));
  return { cards, followsFromOwn };
}

export interface CardCounts {
  costPoints: number;
  errorsAtNoCost: number;
  warnings: number;
  notes: number;
}

/** What the sheet shows, counted as the student sees it: cards that cost points, and the rest by kind. */
export function cardCounts(findings: readonly Finding[]): CardCounts {
  const { cards, followsFromOwn } = groupFindings(findings);
  const free = cards.filter((c) => c.pointsLost === 0);
  return {
    costPoints: cards.length - free.length,
    errorsAtNoCost: free.filter((c) => c.severity === 'error').length,
    warnings: free.filter((c) => c.severity === 'warning').length,
    notes: free.filter((c) => c.severity === 'info').length + followsFromOwn.length,
  };
}

/** "3 findings cost points; 2 warnings; 4 notes": what cost points and what did not, in words. */
export function countsInWords(counts: CardCounts): string {
  const n = (count: number, one: string, many: string) => `${count} ${count === 1 ? one : many}`;
  const parts = [
    counts.costPoints === 0 ? 'no finding cost points' : n(counts.costPoints, 'finding cost points', 'findings cost points'),
  ];
  if (counts.errorsAtNoCost > 0) parts.push(n(counts.errorsAtNoCost, 'error at no cost', 'errors at no cost'));
  if (counts.warnings > 0) parts.push(n(counts.warnings, 'warning', 'warnings'));
  if (counts.notes > 0) parts.push(n(counts.notes, 'note', 'notes'));
  return parts.join('; ');
}
