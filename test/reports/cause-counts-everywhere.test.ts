import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { sectionSummary } from '../../kinds/documents.ts';
import { inject } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { gradebookCsv } from '../../reports/gradebook-csv.ts';
import { checkSubmission } from '../../server/checks/check.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { pageCounts } from '../../server/grading/page-summary.ts';
import { folded, pdfText } from '../support/pdf-reading.ts';
import { GRADED_AT, section } from './fixtures.ts';

/**
 * The results page, the gradebook and the section summary count a student's errors alike: one per
 * likely cause that costs points. Verdicts worked by hand from the slips made below (common practice,
 * no source: a slip is one mistake wherever it shows), checked by the real checker.
 */
const s = section(21, [undefined, undefined, undefined], { reference: true });
const assignment = parseAssignment(s.settings);
// S-001 fitted against seconds and wrote each k with the unit min^-1: one slip in all four k values.
const carried = structuredClone(s.students[0].submission);
for (const run of carried.runs) run.reported!.k!.value = Number(run.reported!.k!.value) / 60;
// S-002 made two independent slips: the wrong logarithm (carried into the values after it) and a concentration unit.
const random = seededRandom(3);
const twoSlips = inject('concentration-unit', inject('log-base', s.students[1].submission, random, s.settings).submission, random, s.settings).submission;
const results = [checkSubmission(assignment, carried), checkSubmission(assignment, twoSlips), s.students[2].result];
const submissions = [carried, twoSlips, s.students[2].submission];

// Hand-worked: [causes costing points, warnings at no cost, notes] for S-001, S-002, S-003.
const EXPECTED = { 'S-001': [1, 1, 0], 'S-002': [2, 0, 5], 'S-003': [0, 0, 0] } as const;

describe('one count of causes in the results page, the gradebook and the section summary', () => {
  it('the checker found what the verdicts were worked from', () => {
    const codes = results.map((r) => r.findings.map((f) => `${f.code}:${f.pointsLost}`));
    expect(results.map((r) => r.studentId)).toEqual(['S-001', 'S-002', 'S-003']);
    expect(codes[0]).toEqual(['time-unit:2', 'time-unit:0', 'time-unit:0', 'time-unit:0', 'sig-figs:0', 'sig-figs:0', 'sig-figs:0', 'sig-figs:0']);
    expect(codes[1].filter((c) => !c.startsWith('carried-forward'))).toEqual(['log-base:1', 'log-base:0', 'log-base:0', 'log-base:0', 'concentration-unit:2', 'concentration-unit:0']);
    expect(codes[1].filter((c) => c === 'carried-forward:0')).toHaveLength(5);
    expect(codes[2]).toEqual([]);
  });

  it('the results page', () => {
    for (const r of results) {
      const c = pageCounts(r.findings);
      expect([c.errors, c.warnings, c.infos]).toEqual(EXPECTED[r.studentId as keyof typeof EXPECTED]);
    }
  });

  it('the gradebook', () => {
    const [header, ...rows] = parse(gradebookCsv(results, { assignment: 'Lab 1' })) as string[][];
    expect(header.slice(4, 7)).toEqual(['causes_costing_points', 'warnings', 'infos']);
    expect(Object.fromEntries(rows.map((r) => [r[0], r.slice(4, 7).map(Number)]))).toEqual(EXPECTED);
  });

  it('the section summary: the attention table counts causes costing points, the clean student is not listed', async () => {
    const header = { course: 'Kinetics laboratory (invented)', section: 'Thursday B', assignment: 'Mutarotation kinetics', gradedAt: GRADED_AT };
    const text = folded(await pdfText(await sectionSummary({ header, settings: s.settings, results, submissions })));
    expect(text).toContain('Causes costing points');
    // Score, then causes costing points, then warnings, then the codes that cost points (hand-worked: 22 − 2 and 22 − 3).
    expect(text).toContain('S-001 20 / 22 1 1 time-unit');
    expect(text).toContain('S-002 19 / 22 2 0 concentration-unit, log-base');
    expect(text).not.toMatch(/S-003 22 \/ 22/);
  });
});
