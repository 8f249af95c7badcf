import { describe, expect, it } from 'vitest';
import type { Submission } from '../../kinds/first-order-catalysis/schemas.ts';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { feedbackSheet } from '../../kinds/documents.ts';
import { formatNumber } from '../../reports/format.ts';
import { feedbackInput, section } from './fixtures.ts';
import { folded, pdfText } from '../support/pdf-reading.ts';

/**
 * The sheet's ln F plots draw the student's own line (dashed, its k written under the plot) for every
 * run with a finding, and for no run whose k agrees. Invented data: one clean student of the seeded
 * generator, in minutes, with four runs; each case changes its reported k by hand, and which runs must
 * show the dashed line is the hand-written verdict beside it, from what the change does to each run.
 */
const s = section(21, [undefined]);
const clean = s.students[0].submission;
const assignment = parseAssignment(s.settings);

type Change = (runs: Submission['runs']) => void;
const scaleK = (run: Submission['runs'][number], factor: number) => {
  run.reported!.k!.value = Number(run.reported!.k!.value) * factor;
};

// Hand-written verdict: the runs (0-based) whose plot must show the student's line.
const cases: Array<{ name: string; change: Change; dashed: number[] }> = [
  { name: 'nothing changed: every k agrees, no run shows it', change: () => {}, dashed: [] },
  { name: 'run 2’s k with its sign lost: that run alone', change: (runs) => scaleK(runs[1], -1), dashed: [1] },
  { name: 'run 4’s k ten times too large: that run alone', change: (runs) => scaleK(runs[3], 10), dashed: [3] },
  { name: 'every k per second, written as per minute: every run', change: (runs) => runs.forEach((run) => scaleK(run, 1 / 60)), dashed: [0, 1, 2, 3] },
];

describe('the student’s line on the sheet’s run plots', () => {
  it.each(cases)('$name', async ({ change, dashed }) => {
    const submission = structuredClone(clean);
    expect(submission.runs).toHaveLength(4);
    change(submission.runs);
    const result = checkSubmission(assignment, submission);
    const flat = folded(await pdfText(await feedbackSheet(feedbackInput(s.settings, { submission, result }))));
    // The caption under a run's plot names the student's k as the sheet formats it (its runs are timed in minutes).
    const shown = submission.runs.flatMap((run, i) => (flat.includes(`your kobs = ${formatNumber(Number(run.reported!.k!.value))} min⁻¹ (dashed line`) ? [i] : []));
    expect(shown).toEqual(dashed);
    expect(flat.split('(dashed line').length - 1).toBe(dashed.length);
  });
});
