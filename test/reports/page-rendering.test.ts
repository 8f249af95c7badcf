import { describe, expect, it } from 'vitest';
import { feedbackSheet, sectionSummary } from '../../kinds/documents.ts';
import { GRADED_AT, feedbackInput, section } from './fixtures.ts';
import { pagePng, PNG_SIGNATURE, pngSize, POPPLER_ABSENT, popplerPresent } from '../support/poppler.ts';

// Pixels need poppler's pdftoppm; everything a sheet says is read without it (pdf-reading.ts).
if (!popplerPresent) console.warn(POPPLER_ABSENT);

// Invented data: the seeded generator's section.
const s = section(7, [undefined, 'log-base'], { reference: true });

describe.skipIf(!popplerPresent)('pages render to pixels (poppler)', () => {
  it('page 1 of a feedback sheet renders to an A4 PNG at 50 dpi', async () => {
    const png = await pagePng(await feedbackSheet(feedbackInput(s.settings, s.students[0])), 1, 50);
    expect(png.subarray(0, 8).equals(PNG_SIGNATURE)).toBe(true);
    // A4 at 50 dpi: 8.27 x 11.69 in.
    const { width, height } = pngSize(png);
    expect(Math.abs(width - 413)).toBeLessThanOrEqual(1);
    expect(Math.abs(height - 585)).toBeLessThanOrEqual(1);
  });

  it('page 1 of a section summary renders to a PNG', async () => {
    const header = { course: 'Kinetics laboratory (invented)', section: 'Thursday B', assignment: 'Mutarotation kinetics', gradedAt: GRADED_AT };
    const pdf = await sectionSummary({ header, settings: s.settings, results: s.students.map((x) => x.result), invented: true });
    const png = await pagePng(pdf, 1, 50);
    expect(png.subarray(0, 8).equals(PNG_SIGNATURE)).toBe(true);
    expect(pngSize(png).width).toBeGreaterThan(400);
  });
});
