import type { SharedFindingCode } from '../schemas/result.ts';

/** Words shared by the sheets. */
export const SEVERITY_WORD = { error: 'Error', warning: 'Warning', info: 'Info' } as const;

/** The shared finding codes in a few words, for a TA choosing among codes (the sheet prints the checker's message). */
const SHARED_FINDING_WORDS: Record<SharedFindingCode, string> = {
  'sign-flipped': 'Sign reversed',
  'log-base': 'log10 used for ln, or the reverse',
  'decimal-shift': 'Off by a power of ten',
  'carried-forward': 'Follows from own values (no cost)',
  implausible: 'Outside the plausible range',
  'sig-figs': 'Rounding and significant figures',
  'unit-unrecognised': 'Unit not recognised',
  'missing-value': 'Value missing',
  unexplained: 'Differs, no cause found',
  'refit-note': 'Note on the refit',
  'late-submission': 'Submitted after the deadline',
};

/** A kind's finding codes with their words, in the kind's order: the shared codes' words here, the kind's own from the kind. */
export function findingWords<C extends string>(codes: readonly C[], own: Record<Exclude<C, SharedFindingCode>, string>): Array<{ code: C; label: string }> {
  const words: Record<string, string> = { ...SHARED_FINDING_WORDS, ...own };
  return codes.map((code) => ({ code, label: words[code] }));
}
