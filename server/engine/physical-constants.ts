/**
 * Constants of the SI, exact since its 2019 revision (CODATA 2018 values): the Boltzmann constant,
 * the Planck constant and the Avogadro constant; the molar gas constant is their product N_A k_B.
 */
export const BOLTZMANN = 1.380649e-23; // J K^-1
export const PLANCK = 6.62607015e-34; // J s
export const AVOGADRO = 6.02214076e23; // mol^-1
export const GAS_CONSTANT = AVOGADRO * BOLTZMANN; // J K^-1 mol^-1, 8.314462618...
// ln(k_B/h) in ln(s^-1 K^-1), the constant of transition-state theory's rate equation: 23.75998...
export const LN_KB_OVER_H = Math.log(BOLTZMANN / PLANCK);
