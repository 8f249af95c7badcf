import { describe, expect, it } from 'vitest';
import { feedbackSheet } from '../../kinds/documents.ts';
import { feedbackInput, section } from './fixtures.ts';
import { folded, pdfText } from '../support/pdf-reading.ts';

/**
 * The sheet's ln F plots draw the student's own line (dashed, its k written under the plot) for every
 * run with a finding, and for no run without one whose k agrees. Invented data: the seeded generator's
 * students, one slip each, checked by the real checker; which runs have a finding is read from its result.
 */
describe('the student’s line on the sheet’s run plots', () => {
  it('is drawn under each run with a finding, and only there', async () => {
    const s = section(21, [undefined, 'time-unit', 'log-base', 'wrong-infinity', 'sign-flipped']);
    let total = 0;
    for (const student of s.students) {
      const runsWithFinding = student.submission.runs.filter((_, i) => student.result.findings.some((f) => f.path.startsWith(`runs[${i}]`))).length;
      const flat = folded(await pdfText(await feedbackSheet(feedbackInput(s.settings, student))));
      const drawn = flat.split('(dashed line').length - 1;
      total += drawn;
      // A run without a finding may still show a dashed line if its k differs beyond the tolerance
      // without being charged, which none of these slips makes.
      expect(drawn, `${student.submission.studentId}: ${student.result.findings.map((f) => f.path).join(', ')}`).toBe(runsWithFinding);
    }
    // The slips reach runs: every run of the time-unit slip at least.
    expect(total).toBeGreaterThanOrEqual(s.students[1].submission.runs.length);
  });
});
