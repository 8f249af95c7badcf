
/**
 * Plain words for each likely cause: what would produce the number, and what to check. The wording
 * stays tentative on purpose: a diagnosis is a likely cause for a TA to confirm, never a verdict.
 */
export const causeText: Partial<Record<string, { what: string; check: string }>> = {
  'sign-flipped': { what: 'the sign of the slope was kept (k is minus the slope)', check: 'the sign of the reported value' },
  'log-base': { what: 'log10 was used where the natural logarithm ln is needed', check: 'which logarithm the spreadsheet used (LOG10 or LN)' },
  'time-unit': { what: 'the time unit of the value does not match the unit declared', check: 'the unit of your times and the unit you wrote next to the value' },
  'concentration-unit': { what: 'concentrations in mM were used where M was declared (or the reverse)', check: 'the concentration unit in the second fit' },
  'decimal-shift': { what: 'the decimal point moved when the value was copied', check: 'the value as copied from your calculation' },
  'swapped-axes': { what: 't was fitted against ln F instead of ln F against t', check: 'which column is x and which is y in the fit' },
  'wrong-infinity': { what: 'a different end value x_inf was used in ln F', check: 'the x_inf used for this run' },
  'fit-model': { what: 'the line was fitted with a different model from the one the assignment asks for', check: 'whether the fit should pass through the origin or have an intercept' },
  'half-life-for-rate': { what: 'the half-life ln 2/k was reported in place of k', check: 'which quantity the value is' },
  'uncertainty-kind': { what: 'another measure of spread was reported as the standard error', check: 'that the uncertainty is the standard error of the slope' },
};

/** "likely cause: ...; check ..." for the causes found, in order. */
export function likelyCause(codes: string[], details: string[] = []): string {
  const parts = codes.map((c) => causeText[c]).filter((t) => t !== undefined);
  if (parts.length === 0) return '';
  const what = parts.map((p) => p.what).join(', and ');
  const extra = details.length ? ` (${details.join('; ')})` : '';
  return `The likely cause is that ${what}${extra}; this is a reading of the numbers, not a certainty. Please check ${parts.map((p) => p.check).join(' and ')}.`;
}
