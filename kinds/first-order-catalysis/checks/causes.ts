import { sharedCauseTexts, type CauseVocabulary } from '../../../server/checks/cause-text.ts';

// The equilibrium block's slips, in order of preference; each is a habit, named in every run and scored once.
const EQUILIBRIUM_SLIPS = ['percent-fraction', 'anomers-swapped', 'inverted-constant', 'rate-constants-swapped', 'path-length-unit', 'mass-concentration-unit', 'start-for-end-value'];

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
    'anomers-swapped': { what: 'the two anomers were swapped in the fraction (x_A given as x_B)', check: 'which specific rotation is [α]_A, the larger, in x_B = ([α]_A − [α]_eq)/([α]_A − [α]_B)' },
    'percent-fraction': { what: 'a percentage was written where a fraction is declared (or a fraction where a percentage is)', check: 'whether the value is a fraction or a percentage, and the unit written beside it' },
    'inverted-constant': { what: 'K was inverted (x_A/x_B in place of x_B/x_A)', check: 'that K = [B]/[A] = x_B/x_A, with B the anomer of smaller specific rotation' },
    'path-length-unit': { what: 'the path length was used in cm where [α] needs dm', check: 'the unit of l in [α] = α/(l c)' },
    'mass-concentration-unit': { what: 'a concentration in g/100 mL was used as if in g/mL', check: 'the unit of c in [α] = α/(l c)' },
    'start-for-end-value': { what: 'the first reading α_0 was used in place of the end value α_inf', check: 'that [α]_eq comes from the end value read after equilibrium' },
    'rate-constants-swapped': { what: 'k_f and k_r were swapped', check: 'that k_f = k_obs K/(1 + K) belongs to A → B and k_r = k_obs/(1 + K) to B → A' },
  },
  priority: ['fit-model', 'sign-flipped', 'log-base', 'time-unit', 'concentration-unit', 'uncertainty-kind', 'half-life-for-rate', 'swapped-axes', 'wrong-infinity', 'decimal-shift', ...EQUILIBRIUM_SLIPS],
  joinMethodSlips: new Set(['sign-flipped', 'log-base', 'time-unit']),
  systematic: new Set(['sign-flipped', 'log-base', 'time-unit', 'concentration-unit', 'swapped-axes', 'wrong-infinity', 'fit-model', 'half-life-for-rate', 'uncertainty-kind', ...EQUILIBRIUM_SLIPS]),
};
