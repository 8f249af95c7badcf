import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { cleanCase } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { sectionSignals } from '../../kinds/section-signals.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { computedReadings, ownRunsSection } from '../support/own-runs-section.ts';
import { conditionRun, type RunCondition } from '../support/run-conditions.ts';

/**
 * How often the signals for review fire on honest generated work (invented data, own runs, noise at
 * 0.001 deg resolution) and on work with the condition: a copied classmate's readings shifted by a
 * constant, and readings computed from a curve. Printed, never asserted (the tests hold the limits).
 */
const SECTIONS = 20;
const HONEST_SUBMISSIONS = 5000;
const STUDENTS = 30;

export function benchSignalRates(): void {
  const settings = { kind: 'first-order-catalysis' };
  let honestFlagged = 0;
  let copiesFound = 0;
  let computedFound = 0;
  let editedFound = 0;
  for (let seed = 1; seed <= SECTIONS; seed++) {
    const students = ownRunsSection(seed, STUDENTS);
    const honest = sectionSignals(settings, students);
    const flagged = new Set([...honest.pairs.flatMap((p) => p.students), ...honest.smooth.map((r) => r.studentId)]);
    honestFlagged += flagged.size;
    const copy = structuredClone(students[0]);
    copy.studentId = 'S-900';
    for (const run of copy.runs) run.readings = run.readings.map(([t, x]) => [t, Number((Number(x) + 0.75).toFixed(3))]);
    const computed = { ...computedReadings(students[1]), studentId: 'S-901' };
    // Another classmate's runs in reverse order, two readings of each changed by a few display steps.
    const edited = structuredClone(students[2]);
    edited.studentId = 'S-902';
    edited.runs.reverse();
    for (const run of edited.runs) for (const i of [4, 11]) run.readings[i] = [run.readings[i][0], Number((Number(run.readings[i][1]) + 0.004).toFixed(3))];
    const withCondition = sectionSignals(settings, [...students, copy, computed, edited]);
    if (withCondition.pairs.some((p) => p.students.includes('S-900'))) copiesFound++;
    if (withCondition.pairs.some((p) => p.students.includes('S-902'))) editedFound++;
    if (withCondition.smooth.some((r) => r.studentId === 'S-901')) computedFound++;
  }
  // Seeds no test uses: honest submissions of every assignment variant.
  let runSignalled = 0;
  for (let seed = 200000; seed < 200000 + HONEST_SUBMISSIONS; seed++) {
    const { settings: s, submission } = cleanCase(seed);
    if ((checkSubmission(parseAssignment(s), submission).signals ?? []).length > 0) runSignalled++;
  }
  benchRunConditions();
  benchSectionSize();
  console.log(
    `signals: honest students signalled ${honestFlagged} of ${SECTIONS * STUDENTS} (section signals) and ${runSignalled} of ${HONEST_SUBMISSIONS} submissions (run signals); ` +
      `a copied classmate's readings found in ${copiesFound} of ${SECTIONS} (shifted by a constant) and ${editedFound} of ${SECTIONS} (runs reordered, two readings each edited), computed readings in ${computedFound} of ${SECTIONS} (targets: < 1 % and >= 95 %)`,
  );
}

/** The section signals' time on large honest sections: all pairs are considered, few compared. */
function benchSectionSize(): void {
  const settings = { kind: 'first-order-catalysis' };
  const times = [500, 2000, 5000].map((size) => {
    const students = ownRunsSection(size, size);
    const start = performance.now();
    sectionSignals(settings, students);
    return `${size.toLocaleString('en-US')} in ${Math.round(performance.now() - start)} ms`;
  });
  console.log(`section signals on one generated honest section: ${times.join(', ')}`);
}

const RUNS = 2000;

/** Per run: the share signalled on honest runs and on each condition, and which signal named it. */
function benchRunConditions(): void {
  const assignment = parseAssignment({ kind: 'first-order-catalysis', fitModel: 'origin' });
  const rate = (condition: RunCondition, size = 0) => {
    const random = seededRandom(7000 + Math.round(size * 1000));
    const counts = new Map<string, number>();
    let any = 0;
    for (let i = 0; i < RUNS; i++) {
      const codes = new Set((checkSubmission(assignment, { studentId: 'B-01', runs: [conditionRun(random, condition, size)] }).signals ?? []).map((s) => s.code));
      if (codes.size > 0) any++;
      for (const code of codes) counts.set(code, (counts.get(code) ?? 0) + 1);
    }
    const by = [...counts].map(([code, n]) => `${code} ${pct(n)}`).join(', ');
    return `${pct(any)}${by ? ` (${by})` : ''}`;
  };
  console.log(`signals per run (${RUNS} runs each): honest ${rate('honest')}; end value with 2-10 % of the change to come ${rate('early-end')}`);
  console.log(`  steady drift over the run: ${[0.05, 0.1, 0.15, 0.3].map((d) => `${d} deg ${rate('linear-drift', d)}`).join('; ')}`);
  console.log(`  instrument still warming up: ${[0.1, 0.3, 0.5].map((d) => `${d} deg ${rate('warm-up', d)}`).join('; ')}`);
}

const pct = (n: number) => `${((100 * n) / RUNS).toFixed(1)} %`;
