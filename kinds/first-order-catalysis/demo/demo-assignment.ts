import type { KindDemo } from '../../kind-entry.ts';
import { seededRandom } from '../../../server/demo/seeded-random.ts';
import type { Submission } from '../schemas.ts';
import { generateSection } from './generated-section.ts';
import { assignmentSettings, generateAssignment } from './submission-generator.ts';

const options = { fitModel: 'origin' as const, reference: true, equilibrium: true };

/**
 * The demo's assignment of this kind: runs at several acid concentrations, a third of the section
 * with one or two common slips, every run's room temperature recorded.
 */
export const catalysisDemo: KindDemo = {
  title: 'Acid-catalysed first-order kinetics (invented scenario: HCl 0.05 to 0.40 M)',
  settings: assignmentSettings(options),
  about: 'first-order runs at several acid concentrations, and the rate law over them',
  section(ids) {
    const random = seededRandom(20261202);
    const { submissions, slipped } = generateSection(random, generateAssignment(random, options), ids);
    recordTemperatures(submissions);
    return { submissions, slipped };
  },
};

/**
 * Each run records the room's temperature, 24.6 to 25.4 degC (invented); one student measured a run
 * on a warmer afternoon, 27.2 degC, which the workspace shows as a signal for review.
 */
function recordTemperatures(submissions: Submission[]): void {
  const random = seededRandom(25);
  for (const s of submissions) for (const run of s.runs) run.temperatureC = Number((24.6 + 0.8 * random()).toFixed(1));
  const warm = submissions[7]?.runs[2];
  if (warm) warm.temperatureC = 27.2;
}
