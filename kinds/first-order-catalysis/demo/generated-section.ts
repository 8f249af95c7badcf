import { generateSubmission, inject, type Random, type SlipCode } from './submission-generator.ts';
import type { Settings, Submission } from '../schemas.ts';

/** The slips a third of a generated section makes, one or two each. */
const COMMON_SLIPS: SlipCode[] = ['log-base', 'sign-flipped', 'time-unit', 'concentration-unit', 'decimal-shift', 'swapped-axes', 'wrong-infinity', 'fit-model', 'half-life-for-rate', 'uncertainty-kind', 'suspect-reading'];

export interface GeneratedSection {
  submissions: Submission[];
  /** The slips each student was given, by student id. */
  slipped: Map<string, SlipCode[]>;
}

/**
 * Invented submissions for the students `ids`: every third student makes one common slip, every
 * sixth a second one too; the rest are clean. Used by the demo and the whole-process bench.
 */
export function generateSection(random: Random, settings: Settings, ids: readonly string[]): GeneratedSection {
  const slipped = new Map<string, SlipCode[]>();
  const submissions = ids.map((studentId, i) => {
    let submission = { ...generateSubmission(random, settings, i + 1), studentId };
    if (i % 3 === 1) {
      const codes = [...new Set([COMMON_SLIPS[(i * 7) % COMMON_SLIPS.length], ...(i % 6 === 4 ? [COMMON_SLIPS[(i * 5 + 3) % COMMON_SLIPS.length]] : [])])];
      for (const code of codes) submission = inject(code, submission, random, settings).submission;
      slipped.set(studentId, codes);
    }
    return submission;
  });
  return { submissions, slipped };
}
