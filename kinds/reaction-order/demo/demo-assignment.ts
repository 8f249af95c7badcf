import { seededRandom } from '../../../server/demo/seeded-random.ts';
import { KIND, Settings, type SettingsInput, type Submission } from '../schemas.ts';
import { orderSubmission, slipsFor, type OrderSlip } from './submission-generator.ts';

/**
 * The demo's assignment of this kind, an invented scenario: Corvane violet, an invented dye, fading by
 * an invented reaction that is second order in the dye (2 A → P), followed at its absorption maximum in
 * a 0.5 cm cell (ε = 2.35 × 10⁴ M⁻¹ cm⁻¹, the product absorbing A_∞ = 0.040; all invented). Every
 * student hands in two runs; every second makes one slip, the slips in turn. In the shape the registry's
 * demo entry takes (title, settings, about, section).
 */
const settings: SettingsInput = {
  kind: KIND,
  signal: { type: 'absorbance', molarAbsorptivity: { value: 2.35e4, unit: 'M^-1 cm^-1' }, pathLength: { value: 0.5, unit: 'cm' }, endAbsorbance: 0.04 },
};

export const reactionOrderDemo = {
  title: 'Order of the fading of Corvane violet (invented scenario)',
  settings,
  about: 'the order of a dye’s fading and its k from absorbance against time',
  section(ids: readonly string[], seed = 20261205): { submissions: Submission[]; slipped: Map<string, OrderSlip[]> } {
    const parsed = Settings.parse(settings);
    const slips = slipsFor(parsed, 2);
    const random = seededRandom(seed);
    const slipped = new Map<string, OrderSlip[]>();
    const submissions = ids.map((id, i) => {
      const slip = i % 2 === 1 ? slips[Math.floor(i / 2) % slips.length] : undefined;
      if (slip) slipped.set(id, [slip]);
      return orderSubmission(random, parsed, id, { order: 2 }, slip);
    });
    return { submissions, slipped };
  },
};
