import { describe, expect, it } from 'vitest';
import type { CheckResult, Finding } from '../../schemas/result.ts';
import { drawnKind } from '../../kinds/registry.ts';
import { sectionSignals } from '../../kinds/section-signals.ts';
import { renderSectionSummary, renderSummaryOfTotals, SectionTotals } from '../../reports/section-summary.ts';
import { AttentionList } from '../../reports/summary/attention.ts';
import { GradebookRows, gradebookCsv } from '../../reports/gradebook-csv.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { GRADED_AT, section } from './fixtures.ts';
import { pdfText } from '../support/pdf-reading.ts';

// An invented section: clean students and one slip each, two of them handing in twice.
const slips = [undefined, 'log-base', 'concentration-unit', undefined, 'sign-flipped', 'suspect-reading', 'missing-value', undefined] as const;
const s = section(33, [...slips], { reference: true });
const header = { course: 'Kinetics laboratory (invented)', section: 'Friday A', assignment: 'Mutarotation kinetics', gradedAt: GRADED_AT };

describe('the summary from running totals', () => {
  it('is the summary of the whole section, fed one result and its submission at a time', async () => {
    // A second version of two students' work, in file order after the first: the reported values of
    // the first first-order submission and the places of the last one's signals are what the summary reads.
    const resubmitted = [s.students[1], s.students[4]].map((x) => ({
      result: { ...x.result, signals: [{ code: 'end-value', path: 'runs[1].infinity', message: 'invented', evidence: {} }] },
      submission: { ...structuredClone(x.submission), runs: x.submission.runs.map((run, i) => ({ ...run, label: `again ${i}` })) },
    }));
    const students = [...s.students, ...resubmitted];
    const results = students.map((x) => x.result);
    const submissions = students.map((x) => x.submission);
    const signals = sectionSignals(s.settings, submissions);
    // Reference: the summary drawn with every result and submission held, as the service draws it.
    const whole = await pdfText(await renderSectionSummary({ header, settings: s.settings, results, submissions, signals }, await drawnKind(s.settings.kind)));
    const totals = new SectionTotals(await drawnKind(s.settings.kind), s.settings, true);
    for (const x of students) {
      totals.addResult(x.result);
      totals.addSubmission(x.submission);
    }
    const streamed = await pdfText(await renderSummaryOfTotals(totals, { header, signals }));
    expect(streamed).toBe(whole);
    // The resubmission's own run labels name the place of its signal (hand-checked against the labels set above).
    expect(streamed).toContain('Run “again 1”, end value x');
  });
});

describe('the students who most need attention, one result at a time', () => {
  // Reference, written from the rule as stated: rejected first, then the lowest share of the points,
  // then the most causes costing points, then the order given; full points and nothing costing points never listed.
  function bySorting(results: CheckResult[], limit: number): CheckResult[] {
    // A cause is a code (these findings name no other); it costs points when its findings' points add above 0.
    const errors = (r: CheckResult) => new Set(r.findings.filter((f) => r.findings.some((g) => g.code === f.code && g.pointsLost > 0)).map((f) => f.code)).size;
    const share = (r: CheckResult) => (r.status === 'checked' ? (r.score ?? 0) / r.maxScore : 0);
    const listed = results.map((r, i) => ({ r, i })).filter(({ r }) => r.status === 'rejected' || share(r) < 1 || errors(r) > 0);
    listed.sort((a, b) => {
      if ((a.r.status === 'rejected') !== (b.r.status === 'rejected')) return a.r.status === 'rejected' ? -1 : 1;
      if (share(a.r) !== share(b.r)) return share(a.r) - share(b.r);
      if (errors(a.r) !== errors(b.r)) return errors(b.r) - errors(a.r);
      return a.i - b.i;
    });
    return listed.slice(0, limit).map(({ r }) => r);
  }

  it('keeps the same first students as sorting the whole section, ties included', () => {
    const random = seededRandom(5);
    const error = (code: string, pointsLost: number): Finding => ({ code, severity: 'error', path: 'p', message: '', pointsLost }) as Finding;
    for (let trial = 0; trial < 40; trial++) {
      // Few distinct scores and error counts, so that most students tie with another.
      const results = Array.from({ length: 60 }, (_, i): CheckResult => {
        const rejected = random() < 0.05;
        return {
          studentId: `S-${i}`,
          status: rejected ? 'rejected' : 'checked',
          score: rejected ? null : Math.floor(random() * 5) * 2 + 2,
          maxScore: 10,
          refit: null,
          // Two causes, each slip charged or not: repeated codes are one cause, free ones count for nothing.
          findings: Array.from({ length: Math.floor(random() * 4) }, () => error(random() < 0.5 ? 'x' : 'y', random() < 0.5 ? 0 : 1)),
          engineVersion: 'test',
        } as CheckResult;
      });
      for (const limit of [1, 12, 100]) {
        const list = new AttentionList(limit);
        for (const r of results) list.add(r);
        expect(list.list().map((r) => r.studentId)).toEqual(bySorting(results, limit).map((r) => r.studentId));
      }
    }
  });
});

describe('the gradebook row by row', () => {
  it('is the gradebook of the whole section, roster students without a submission last', () => {
    const results = s.students.map((x) => x.result);
    const options = { assignment: 'Mutarotation kinetics', bom: true, notSubmitted: [{ studentId: 'S-500', withdrawn: false }] };
    const rows = new GradebookRows(options);
    for (const r of results) rows.add(r);
    const text = rows.text();
    expect(text).toBe(gradebookCsv(results, options));
    // Hand-counted: a header, a row per result, the one roster student; CRLF after each.
    expect(text.split('\r\n')).toHaveLength(1 + results.length + 1 + 1);
    expect(text.split('\r\n').at(-2)).toBe('S-500,,,not-submitted,0,0,0,,Mutarotation kinetics');
  });
});
