/**
 * How a kind names likely causes: plain words for each (what would produce the number, and what to
 * check), which causes win a tie (the commoner slip first), and which scaling slips may join a slip
 * of method. The wording stays tentative on purpose: a diagnosis is a likely cause for a TA to
 * confirm, never a verdict.
 */
export interface CauseVocabulary {
  texts: Readonly<Record<string, { what: string; check: string }>>;
  /** When two explanations have as many causes, the earlier cause here is named. */
  priority: readonly string[];
  /** Scalings that may join a slip of method (wider pairings would "explain" almost any number). */
  joinMethodSlips: ReadonlySet<string>;
  /** Causes that come from a habit, not a one-off: named each time they show, scored once. */
  systematic: ReadonlySet<string>;
}

/** The words for the shared codes, the same in every kind. */
export const sharedCauseTexts: CauseVocabulary['texts'] = {
  'sign-flipped': { what: 'the sign was reversed on the way (a minus sign lost or added, as when a slope is kept where minus the slope is needed)', check: 'the sign of the reported value' },
  'log-base': { what: 'log10 was used where the natural logarithm ln is needed', check: 'which logarithm the spreadsheet used (LOG10 or LN)' },
  'decimal-shift': { what: 'the decimal point moved when the value was copied', check: 'the value as copied from your calculation' },
};

/** "likely cause: ...; check ..." for the causes found, in order. */
export function likelyCause(vocabulary: CauseVocabulary, codes: string[], details: string[] = []): string {
  const parts = codes.map((c) => vocabulary.texts[c]).filter((t) => t !== undefined);
  if (parts.length === 0) return '';
  const what = parts.map((p) => p.what).join(', and ');
  const extra = details.length ? ` (${details.join('; ')})` : '';
  return `The likely cause is that ${what}${extra}; this is a reading of the numbers, not a certainty. Please check ${parts.map((p) => p.check).join(' and ')}.`;
}
