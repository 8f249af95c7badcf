import { sharedCauseTexts, type CauseVocabulary } from '../../../server/checks/cause-text.ts';

/** The likely causes this kind names, in words, with their order of preference. */
export const temperatureCauses: CauseVocabulary = {
  texts: {
    ...sharedCauseTexts,
    'temperature-scale': { what: 'temperatures in degrees Celsius were used in 1/T where kelvin are needed', check: 'that every temperature in 1/T is in kelvin (T/K = t/°C + 273.15)' },
    'gas-constant': {
      what: 'a value of R in other units was used (1.987 cal or 0.08206 L atm per K per mol) with energies in joules (R in calories gives the same number as an energy in calories written as joules)',
      check: 'the value and units of R: 8.314 J K^-1 mol^-1 with energies in joules',
    },
    'energy-unit': { what: 'the energy was written in other units than it was computed in (J and kJ, or cal and J), or converted between calories and joules the wrong way', check: 'the unit the energy was computed in and the unit written beside it' },
    'reciprocal-scale': { what: '1000/T was plotted but read as 1/T (which gives the same number as kilojoules written as joules)', check: 'the x values of the plot: 1/T or 1000/T, and the energy unit' },
    'eyring-form': { what: 'the Eyring plot used ln k instead of ln(k/T), or another value of ln(k_B/h) than 23.760', check: 'the y values of the Eyring plot and the constant ln(k_B/h)' },
    'time-unit': { what: 'the rate constants were per minute where the Eyring equation needs them per second (or the reverse)', check: 'that every k is in s^-1 before ln(k/T) is taken' },
  },
  priority: ['sign-flipped', 'temperature-scale', 'log-base', 'gas-constant', 'reciprocal-scale', 'energy-unit', 'eyring-form', 'time-unit', 'decimal-shift'],
  joinMethodSlips: new Set(['sign-flipped', 'energy-unit']),
  systematic: new Set(['sign-flipped', 'log-base', 'temperature-scale', 'gas-constant', 'energy-unit', 'reciprocal-scale', 'eyring-form', 'time-unit']),
};

/**
 * A reversed sign in this kind's words for each quantity: E_a and ΔH‡ come from a slope (minus R times
 * it), ΔS‡ from the Eyring intercept, so "the sign of the slope" would send a student to the wrong place.
 */
const SIGN_FLIPPED: Readonly<Record<string, { what: string; check: string }>> = {
  Ea: { what: 'the sign of the slope was kept (E_a is minus R times the slope of ln k against 1/T)', check: 'the sign of the reported value' },
  dH: { what: 'the sign of the slope was kept (ΔH‡ is minus R times the slope of ln(k/T) against 1/T)', check: 'the sign of the reported value' },
  dS: {
    what: 'the sign was lost in working ΔS‡ out from the intercept of the Eyring plot (ΔS‡ = R × (intercept − ln(k_B/h)), negative when the intercept is below 23.760)',
    check: 'the intercept of ln(k/T) against 1/T and the sign of ΔS‡ worked out from it',
  },
};

/** The causes in words for one quantity: the kind's, with the sign slip named where that quantity comes from. */
export function causesOf(quantity: string): CauseVocabulary {
  const sign = SIGN_FLIPPED[quantity];
  return sign ? { ...temperatureCauses, texts: { ...temperatureCauses.texts, 'sign-flipped': sign } } : temperatureCauses;
}
