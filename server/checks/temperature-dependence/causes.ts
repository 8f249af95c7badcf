import { sharedCauseTexts, type CauseVocabulary } from '../cause-text.ts';

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
