import { sharedCauseTexts, type CauseVocabulary } from '../../../server/checks/cause-text.ts';

/** The likely causes this kind names, in words, with their order of preference. */
export const orderCauses: CauseVocabulary = {
  texts: {
    ...sharedCauseTexts,
    'sign-flipped': { what: 'the sign of the slope was kept where k is minus the slope (orders 0 and 1), or reversed where k is the slope itself (order 2)', check: 'the sign of the slope and of the reported k' },
    'log-base': { what: 'log10 [A] was plotted where ln [A] is needed, which gives k divided by 2.303', check: 'which logarithm the spreadsheet used (LOG10 or LN)' },
    'time-unit': { what: 'the time unit of the value does not match the unit declared', check: 'the unit of your times and the unit you wrote next to the value' },
    'concentration-unit': { what: 'concentrations in mM were used where M was declared (or the reverse)', check: 'the concentration unit of [A] in the plot' },
    'other-order-law': { what: 'k was taken from the line of another order’s integrated law than the order you report', check: 'which plot ([A], ln [A] or 1/[A] against t) gave the slope' },
    'path-length': { what: 'the path length was left out of the Beer-Lambert law (or read in the wrong unit)', check: 'that [A] = (A − A_∞) / (ε l), with l in cm' },
    'transmittance': { what: 'transmittance (or %T) was used where absorbance is needed', check: 'that the readings converted to [A] are absorbances, A = −log10 T' },
    'absorptivity-unit': { what: 'the molar absorptivity was used in another unit than the one it was given in', check: 'the unit of ε (M^-1 cm^-1 with l in cm)' },
    'end-absorbance': { what: 'the end absorbance A_∞ was not subtracted before converting to concentration', check: 'that [A] is proportional to A − A_∞' },
    'half-life-formula': { what: 'the half-life was worked out by another order’s formula ([A]_0/2k, ln 2/k or 1/(k[A]_0))', check: 'the half-life formula for the order you report' },
  },
  // The Beer-Lambert slips that scale [A] by a power of ten (an absorptivity in m^2 mol^-1, say) come before
  // a decimal shift of the same size: the settings explain them.
  priority: ['sign-flipped', 'log-base', 'time-unit', 'absorptivity-unit', 'path-length', 'concentration-unit', 'other-order-law', 'end-absorbance', 'transmittance', 'half-life-formula', 'decimal-shift'],
  joinMethodSlips: new Set(['sign-flipped', 'time-unit']),
  systematic: new Set(['sign-flipped', 'log-base', 'time-unit', 'concentration-unit', 'other-order-law', 'path-length', 'transmittance', 'absorptivity-unit', 'end-absorbance', 'half-life-formula']),
};
