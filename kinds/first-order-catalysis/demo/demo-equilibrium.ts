import type { Equilibrium } from '../schemas.ts';

/**
 * The demo's equilibrium block: two invented forms, A and B, with invented specific rotations (no real
 * substance's figures, so that none is presented as our measurement), a 2 dm cell and 12.0 g/100 mL.
 */
export const DEMO_EQUILIBRIUM: Equilibrium = {
  pureForms: { A: { value: 96.4, unit: 'deg mL g^-1 dm^-1', name: 'form A (invented)' }, B: { value: 21.3, unit: 'deg mL g^-1 dm^-1', name: 'form B (invented)' }, wavelengthNm: 589, temperatureC: 25 },
  pathLength: { value: 2, unit: 'dm' },
  concentration: { value: 12, unit: 'g/100 mL' },
  startsFrom: 'A',
  tolerances: { specificRotation: { relative: 0.01 }, xB: { absolute: 0.005 }, K: { relative: 0.02 }, kSplit: { relative: 0.02 } },
  rubric: { composition: 1, constant: 1, kSplit: 1, meanK: 1, rateLawSplit: 1 },
};

/** The demo scenario's equilibrium fraction of B (invented). */
export const DEMO_FRACTION_B = 0.62;
