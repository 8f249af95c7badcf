import type { KindDemo } from '../../kind-entry.ts';
import { seededRandom } from '../../../server/demo/seeded-random.ts';
import { KIND } from '../schemas.ts';
import { temperatureSlips, temperatureSubmission } from './submission-generator.ts';

/**
 * The demo's assignment of this kind: every student hands in rate constants at six temperatures
 * (invented), every third with one slip.
 */
export const temperatureDemo: KindDemo = {
  title: 'Activation energy from rate constants at six temperatures (invented scenario)',
  settings: { kind: KIND },
  about: 'activation energy from rate constants at six temperatures',
  section(ids) {
    const random = seededRandom(20261203);
    const slipped = new Map<string, string[]>();
    const submissions = ids.map((id, i) => {
      const slip = i % 3 === 2 ? temperatureSlips[Math.floor(i / 3) % temperatureSlips.length] : undefined;
      if (slip) slipped.set(id, [slip]);
      return temperatureSubmission(random, id, slip);
    });
    return { submissions, slipped };
  },
};
