import { cleanSuspectWarnings, transpositionRecall, USUAL_NOISE, type NoiseRange } from '../support/transposed-readings.ts';

/**
 * Recall of suspect readings on the corpus of small transpositions in any position (test/support/
 * transposed-readings.ts), seeds 1,000,000 on, which no test uses; and the warnings on its clean
 * submissions, seeds 2,000,000 on. Printed, never asserted.
 */
const CASES = 2000;

const range = (noise: NoiseRange) => (noise[0] === noise[1] ? `${noise[0]}` : `${noise[0]}-${noise[1]}`);

export function benchTranspositionRecall(): void {
  for (const noise of [USUAL_NOISE, [0.006, 0.006] as NoiseRange]) {
    const recall = transpositionRecall(1_000_000, CASES, noise);
    const clean = cleanSuspectWarnings(2_000_000, CASES, noise);
    const atEnds = recall.misses.filter((m) => m.index === 0).length;
    console.log(
      `suspect readings, small transpositions (0.05-0.1 deg) in any position, scatter ${range(noise)} deg: ` +
        `${((100 * recall.found) / CASES).toFixed(1)} % found at the reading changed (${recall.found}/${CASES}; ${atEnds} of the misses at the first reading), ` +
        `${((100 * recall.namedSwap) / CASES).toFixed(1)} % named as a swap; clean: ${clean.warnings} suspect-reading warnings on ${clean.runs} runs ` +
        `(${clean.submissions} of ${CASES} submissions) (targets: >= 99 %, false alarms stated)`,
    );
  }
}
