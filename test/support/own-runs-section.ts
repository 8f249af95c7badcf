import type { Submission } from '../../kinds/first-order-catalysis/schemas.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import type { SubmittedReadings } from '../../server/signals/shared-readings.ts';
import { generateAssignment, generateSubmission } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';

/** A generated section where every student measured their own runs (invented data), S-001, S-002, ... */
export function ownRunsSection(seed: number, students: number): Submission[] {
  const random = seededRandom(seed);
  const settings = generateAssignment(random, { fitModel: 'origin' });
  return Array.from({ length: students }, (_, i) => ({ ...generateSubmission(random, settings, i + 1), studentId: `S-${String(i + 1).padStart(3, '0')}` }));
}

/** A student's runs replaced by a curve through their first and last readings, rounded to 0.001: computed, not read. */
export function computedReadings(s: Submission): Submission {
  const copy = structuredClone(s);
  for (const run of copy.runs) {
    const x0 = Number(run.readings[0][1]);
    const xInf = Number(run.infinity);
    const [tLast, xLast] = run.readings[run.readings.length - 1].map(Number);
    const k = Math.log((x0 - xInf) / (xLast - xInf)) / tLast;
    run.readings = run.readings.map(([t]) => [t, Number((xInf + (x0 - xInf) * Math.exp(-k * Number(t))).toFixed(3))]);
  }
  return copy;
}

/** A submission as the shared-readings signal reads it. */
export const asReadings = (s: Submission): SubmittedReadings => ({
  studentId: s.studentId,
  runs: s.runs.map((r) => ({ label: r.label, readings: r.readings.map(([t, x]) => [Number(t), Number(x)] as [number, number]) })),
  reportedK: s.runs.map((r) => r.reported?.k?.value),
});
