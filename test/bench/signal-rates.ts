import { checkSubmission, parseAssignment } from '../../server/checks/check.ts';
import { cleanCase } from '../../server/demo/submission-generator.ts';
import { sectionSignals } from '../../server/signals/section-signals.ts';
import { computedReadings, ownRunsSection } from '../support/own-runs-section.ts';

/**
 * How often the signals for review fire on honest generated work (invented data, own runs, noise at
 * 0.001 deg resolution) and on work with the condition: a copied classmate's readings shifted by a
 * constant, and readings computed from a curve. Printed, never asserted (the tests hold the limits).
 */
const SECTIONS = 20;
const STUDENTS = 30;

export function benchSignalRates(): void {
  const settings = { kind: 'first-order-catalysis' };
  let honestFlagged = 0;
  let copiesFound = 0;
  let computedFound = 0;
  for (let seed = 1; seed <= SECTIONS; seed++) {
    const students = ownRunsSection(seed, STUDENTS);
    const honest = sectionSignals(settings, students);
    const flagged = new Set([...honest.pairs.flatMap((p) => p.students), ...honest.smooth.map((r) => r.studentId)]);
    honestFlagged += flagged.size;
    const copy = structuredClone(students[0]);
    copy.studentId = 'S-900';
    for (const run of copy.runs) run.readings = run.readings.map(([t, x]) => [t, Number((Number(x) + 0.75).toFixed(3))]);
    const computed = { ...computedReadings(students[1]), studentId: 'S-901' };
    const withCondition = sectionSignals(settings, [...students, copy, computed]);
    if (withCondition.pairs.some((p) => p.students.includes('S-900'))) copiesFound++;
    if (withCondition.smooth.some((r) => r.studentId === 'S-901')) computedFound++;
  }
  let runSignalled = 0;
  for (let seed = 0; seed < 300; seed++) {
    const { settings: s, submission } = cleanCase(seed);
    if ((checkSubmission(parseAssignment(s), submission).signals ?? []).length > 0) runSignalled++;
  }
  console.log(
    `signals: honest students signalled ${honestFlagged} of ${SECTIONS * STUDENTS} (section signals) and ${runSignalled} of 300 (run signals); ` +
      `a copied classmate's readings found in ${copiesFound} of ${SECTIONS}, computed readings in ${computedFound} of ${SECTIONS} (targets: < 1 % and >= 95 %)`,
  );
}
