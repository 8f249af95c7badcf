import { sharedCauseTexts, type CauseVocabulary } from '../../../server/checks/cause-text.ts';

/** The likely causes this kind names, in words, with their order of preference. */
export const firstOrderCauses: CauseVocabulary = {
  texts: {
    ...sharedCauseTexts,
    'time-unit': { what: 'the time unit of the value does not match the unit declared', check: 'the unit of your times and the unit you wrote next to the value' },
    'concentration-unit': { what: 'concentrations in mM were used where M was declared (or the reverse)', check: 'the concentration unit in the second fit' },
    'swapped-axes': { what: 't was fitted against ln F instead of ln F against t', check: 'which column is x and which is y in the fit' },
    'wrong-infinity': { what: 'a different end value x_inf was used in ln F', check: 'the x_inf used for this run' },
    'fit-model': { what: 'the line was fitted with a different model from the one the assignment asks for', check: 'whether the fit should pass through the origin or have an intercept' },
    'half-life-for-rate': { what: 'the half-life ln 2/k was reported in place of k', check: 'which quantity the value is' },
    'uncertainty-kind': { what: 'another measure of spread was reported as the standard error', check: 'that the uncertainty is the standard error of the slope' },
  },
  priority: ['fit-model', 'sign-flipped', 'log-base', 'time-unit', 'concentration-unit', 'uncertainty-kind', 'half-life-for-rate', 'swapped-axes', 'wrong-infinity', 'decimal-shift'],
  joinMethodSlips: new Set(['sign-flipped', 'log-base', 'time-unit']),
  systematic: new Set(['sign-flipped', 'log-base', 'time-unit', 'concentration-unit', 'swapped-axes', 'wrong-infinity', 'fit-model', 'half-life-for-rate', 'uncertainty-kind']),
};
