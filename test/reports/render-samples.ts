// Renders sample sheets (invented data) for looking at them as a TA would:
//   npx tsx test/reports/render-samples.ts OUT_DIR && pdftoppm -png -r 80 OUT_DIR/S-002.pdf OUT_DIR/S-002
// docs/feedback-sheet-page1.png is page 1 of S-009 (decimal shift) from this script:
//   pdftoppm -png -r 90 -f 1 -l 1 -singlefile OUT_DIR/S-009.pdf docs/feedback-sheet-page1
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { feedbackSheet, sectionSummary } from '../../kinds/documents.ts';
import { feedbackInput, GRADED_AT, section } from './fixtures.ts';

const out = process.argv[2] ?? '/tmp/rateproof-samples';
mkdirSync(out, { recursive: true });
const slips = [undefined, 'log-base', 'suspect-reading', 'concentration-unit', 'sign-flipped', 'time-unit', 'unit-unrecognised', 'missing-value', 'decimal-shift', 'fit-model', 'half-life-for-rate', 'uncertainty-kind', 'sig-figs', 'swapped-axes', 'wrong-infinity', 'unexplained', 'implausible'] as const;
const s = section(7, [...slips], { reference: true });
for (const student of s.students) {
  writeFileSync(join(out, `${student.submission.studentId}.pdf`), await feedbackSheet(feedbackInput(s.settings, student)));
}
writeFileSync(
  join(out, 'summary.pdf'),
  await sectionSummary({
    header: { course: 'Kinetics laboratory (invented)', section: 'Thursday B', assignment: 'Mutarotation kinetics', gradedAt: GRADED_AT },
    settings: s.settings,
    results: s.students.map((x) => x.result),
    submissions: s.students.map((x) => x.submission),
    invented: true,
  }),
);
console.log(s.students.map((x) => `${x.submission.studentId} ${x.result.score}/${x.result.maxScore} ${[...new Set(x.result.findings.map((f) => f.code))].join(',')}`).join('\n'));
