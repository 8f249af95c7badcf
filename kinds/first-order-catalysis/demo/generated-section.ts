import { analysed, generateSubmission, inject, studentId, drawRateLaw, type Random, type SlipCode } from './submission-generator.ts';
import type { Settings, Submission } from '../schemas.ts';
import { equilibriumSlipCodes, scenarioRuns, writeEquilibrium, type EquilibriumSlip } from './equilibrium-slips.ts';
import { DEMO_FRACTION_B } from './demo-equilibrium.ts';

/** The slips a third of a generated section makes, one or two each. */
const COMMON_SLIPS: SlipCode[] = ['log-base', 'sign-flipped', 'time-unit', 'concentration-unit', 'decimal-shift', 'swapped-axes', 'wrong-infinity', 'fit-model', 'half-life-for-rate', 'uncertainty-kind', 'suspect-reading'];

export interface GeneratedSection {
  submissions: Submission[];
  /** The slips each student was given, by student id. */
  slipped: Map<string, Array<SlipCode | EquilibriumSlip>>;
}

/** A clean submission; with the equilibrium block, runs of its scenario (one equilibrium for the whole section). */
function cleanSubmission(random: Random, settings: Settings, n: number): Submission {
  if (!settings.equilibrium || settings.classDataset) return generateSubmission(random, settings, n);
  const runs = scenarioRuns(random, settings.equilibrium, drawRateLaw(random), DEMO_FRACTION_B);
  return analysed({ studentId: studentId(n), runs }, settings);
}

/**
 * Invented submissions for the students `ids`: every third student makes one common slip, every
 * sixth a second one too; the rest are clean. With the equilibrium block every student reports the
 * composition and the split of k, and those with one common slip make one of its slips too. Used by the demo and the
 * whole-process bench.
 */
export function generateSection(random: Random, settings: Settings, ids: readonly string[]): GeneratedSection {
  const slipped = new Map<string, Array<SlipCode | EquilibriumSlip>>();
  const submissions = ids.map((studentId, i) => {
    let submission = { ...cleanSubmission(random, settings, i + 1), studentId };
    const codes: Array<SlipCode | EquilibriumSlip> = [];
    if (i % 3 === 1) {
      codes.push(...new Set([COMMON_SLIPS[(i * 7) % COMMON_SLIPS.length], ...(i % 6 === 4 ? [COMMON_SLIPS[(i * 5 + 3) % COMMON_SLIPS.length]] : [])]));
      for (const code of codes) submission = inject(code as SlipCode, submission, random, settings).submission;
    }
    if (settings.equilibrium) {
      // Written last, from the student's own (possibly slipped) k values.
      const slip = codes.length === 1 ? equilibriumSlipCodes[(i * 3) % equilibriumSlipCodes.length] : undefined;
      if (slip) codes.push(slip);
      writeEquilibrium(submission, settings.equilibrium, { rotation: i % 2 === 0, percent: i % 4 === 1, slip });
    }
    if (codes.length) slipped.set(studentId, codes);
    return submission;
  });
  return { submissions, slipped };
}
