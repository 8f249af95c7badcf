// Renders the kind's sheets and summary from the hand-made result, for looking at them:
//   npx tsx test/kinds/reaction-order/render-report.ts OUT_DIR && pdftoppm -png -r 60 OUT_DIR/R-02.pdf OUT_DIR/R-02
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { renderFeedbackSheet } from '../../../reports/feedback-sheet.ts';
import { renderSectionSummary } from '../../../reports/section-summary.ts';
import { findingCodes, stages } from '../../../kinds/reaction-order/schemas.ts';
import { reactionOrderReport } from '../../../kinds/reaction-order/report/report.ts';
import type { KindReport } from '../../../reports/kind-report.ts';
import { sampleStudents } from './report-samples.ts';
import { FADING_SETTINGS } from './report-fixture.ts';

const out = process.argv[2] ?? '/tmp/reaction-order-samples';
mkdirSync(out, { recursive: true });
const kind = { report: reactionOrderReport as unknown as KindReport, stages, findingCodes };
const header = (studentId: string) => ({ course: 'Kinetics laboratory (invented)', section: 'Friday A', assignment: 'Fading of an invented dye', studentId, version: 1, gradedAt: '2026-12-05T12:00:00Z' });
const students = sampleStudents();
for (const s of students) {
  writeFileSync(join(out, `${s.submission.studentId}.pdf`), await renderFeedbackSheet({ header: header(s.submission.studentId), settings: FADING_SETTINGS, submission: s.submission, result: s.result, invented: true }, kind));
}
writeFileSync(
  join(out, 'summary.pdf'),
  await renderSectionSummary(
    {
      header: { course: 'Kinetics laboratory (invented)', section: 'Friday A', assignment: 'Fading of an invented dye', gradedAt: '2026-12-05T12:00:00Z' },
      settings: FADING_SETTINGS,
      results: students.map((s) => s.result),
      submissions: students.map((s) => s.submission),
      invented: true,
    },
    kind,
  ),
);
console.log(`wrote ${students.length} sheets and summary.pdf to ${out}`);
