import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { feedbackSheet, sectionSummary } from '../../kinds/documents.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { firstOrderCatalysisReport } from '../../kinds/first-order-catalysis/report/report.ts';
import type { Settings, Submission } from '../../kinds/first-order-catalysis/schemas.ts';
import { checkSubmission } from '../../server/checks/check.ts';
import type { CheckResult } from '../../schemas/result.ts';
import { folded, pdfText } from '../support/pdf-reading.ts';
import { feedbackInput, GRADED_AT } from './fixtures.ts';

// The casebook's K-inverted case: glucose's published rotations (see its `source`), the student's K
// written as 1/1.75 = 0.5714 in every run (hand-worked there).
const file = join(import.meta.dirname, '../casebook/cases/foc-equilibrium-K-inverted.json');
const kase = JSON.parse(readFileSync(file, 'utf8')) as { settings: unknown; submission: Submission };
const settings = parseAssignment(kase.settings).settings as Settings;
const result = checkSubmission(parseAssignment(kase.settings), kase.submission) as CheckResult;
const student = { submission: kase.submission, result };

describe('the equilibrium block on the documents', () => {
  it('puts the composition and the split of k on the sheet, the student’s values against ours', async () => {
    const text = folded(await pdfText(await feedbackSheet(feedbackInput(settings, student))));
    expect(text).toContain('Equilibrium: composition, K, kf and kr');
    // Ours: x_B = 0.63636 and K = 1.75 (glucose, hand-worked); theirs: K 0.5714.
    expect(text).toMatch(/xB\s+“0\.05 M HCl”\s+0\.636/);
    expect(text).toMatch(/K\s+“0\.05 M HCl”\s+0\.5714\s+1\.75/);
    expect(text).toContain('mean K');
  });

  it('draws the section’s K per run in the summary', async () => {
    const text = folded(await pdfText(await sectionSummary({ header: { course: 'c', section: 's', assignment: 'a', gradedAt: GRADED_AT }, settings, results: [result], submissions: [kase.submission] })));
    expect(text).toContain('equilibrium constant K, run by run');
    expect(text).toContain('K, one mark per run');
  });

  it('sends the workspace the same rows and a plot of K run by run', () => {
    const display = firstOrderCatalysisReport.display(feedbackInput(settings, student) as never);
    const rows = display.comparison!.rows.filter((r) => r[0] === 'K');
    expect(rows).toHaveLength(4);
    expect(rows[0][2]).toBe('0.5714');
    expect(rows[0][3]).toMatch(/^1\.750\d* ± /);
    const plot = display.plots.find((p) => p.title.includes('K, run by run'))!;
    expect(plot.series[0].points).toHaveLength(4);
    expect(plot.series[0].points![0][1]).toBeCloseTo(1.75, 3);
  });
});
