/**
 * An equilibrium block with glucose's published specific rotations: alpha-D-glucopyranose +112.2,
 * beta +18.7 deg mL g^-1 dm^-1 at 589 nm and 20-25 C (J. F. Robyt, Essentials of Carbohydrate
 * Chemistry, Springer 1998, ch. 3; test/reference/kinetics-check-values.md). With c = 0.100 g/mL and
 * l = 2 dm, the equilibrium mixture's +52.7 reads as alpha_inf = 10.54 deg (derived there).
 */
export const glucoseBlock = {
  pureForms: { A: { value: 112.2, name: 'α-D-glucopyranose' }, B: { value: 18.7, name: 'β-D-glucopyranose' }, wavelengthNm: 589, temperatureC: 25 },
  pathLength: { value: 2, unit: 'dm' },
  concentration: { value: 0.1, unit: 'g/mL' },
  startsFrom: 'A',
} as const;
