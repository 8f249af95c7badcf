import { describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { KindDescription } from '../../../schemas/api/kinds.ts';
import { SubmissionDisplay } from '../../../schemas/display.ts';
import { AbsorbanceSignal, ConcentrationSignal, ConductanceSignal, Settings, type Refit } from '../../../kinds/reaction-order/schemas.ts';
import { READINGS_COLUMNS, REPORTED_COLUMNS } from '../../../kinds/reaction-order/csv.ts';
import { reactionOrderCsvLayout } from '../../../kinds/reaction-order/csv-layout.ts';
import { reactionOrderReport } from '../../../kinds/reaction-order/report/report.ts';
import { lawSeries, lineTexts } from '../../../kinds/reaction-order/report/law-series.ts';
import { FADING_REFIT, FADING_SETTINGS } from './report-fixture.ts';
import { sampleStudents } from './report-samples.ts';

const [clean, secondOrder] = sampleStudents();
const header = { course: 'C', section: 'S', assignment: 'Fading', studentId: 'R-02', version: 1, gradedAt: '2026-12-05T12:00:00Z' };

describe('reaction-order on the workspace’s student page', () => {
  it('sends one table and the three plots in the page’s shape', () => {
    const display = reactionOrderReport.display({ header, settings: FADING_SETTINGS, submission: secondOrder.submission, result: secondOrder.result });
    expect(SubmissionDisplay.shape.comparison.safeParse(display.comparison).success).toBe(true);
    expect(SubmissionDisplay.shape.plots.safeParse(display.plots).success).toBe(true);
    expect(display.plots.map((p) => p.title)).toEqual(['Order 0: [A] against t', 'Order 1: ln [A] against t', 'Order 2: 1/[A] against t']);
    // Order, k by the order reported and by the order named, three fits, two half-lives.
    expect(display.comparison!.rows.map((r) => r[0])).toEqual(['Order n', 'k (order 2)', 'k (order 1, the order named)', 'Order 0 fit ([A] against t)', 'Order 1 fit (ln [A] against t), named', 'Order 2 fit (1/[A] against t), reported', 't_{1/2}, run “A”', 't_{1/2}, run “B”']);
  });

  it('draws our line per run from the law’s straight line, and theirs on their order’s plot through the run’s points', () => {
    const display = reactionOrderReport.display({ header, settings: FADING_SETTINGS, submission: secondOrder.submission, result: secondOrder.result });
    const [, lnA, reciprocal] = display.plots;
    // numpy lstsq, kept to 10 figures in report-fixture.ts: ln [A] = −10.41029 − 0.0453935 t for run A.
    const ours = lnA.series.find((s) => s.group === 0 && s.line)!.line!;
    expect(ours.intercept).toBeCloseTo(-10.410289388819221, 7);
    expect(ours.slope).toBeCloseTo(-0.0453935198273161, 10);
    expect(lnA.series.some((s) => s.owner === 'student')).toBe(false);
    // Their k 6200 M^-1 min^-1 as the slope; intercept mean(1/[A]) − 6200 mean(t) = −27482.5 M^-1 for run A (numpy 2.4.6).
    const theirs = reciprocal.series.find((s) => s.group === 0 && s.owner === 'student')!.line!;
    expect(theirs.slope).toBe(6200);
    expect(theirs.intercept).toBeCloseTo(-27482.509180044348, 4);
    expect(reciprocal.notes[0]).toBe('Order 2: 1/[A] against t: the student’s order');
  });

  it('a student whose order is the refit’s gets their line on that plot only', () => {
    const display = reactionOrderReport.display({ header, settings: FADING_SETTINGS, submission: clean.submission, result: clean.result });
    expect(display.plots.map((p) => p.series.filter((s) => s.owner === 'student').length)).toEqual([0, 2, 0]);
    expect(display.plots.map((p) => p.notes[0])).toEqual(['Order 0: [A] against t', 'Order 1: ln [A] against t: named by the refit, the student’s order', 'Order 2: 1/[A] against t']);
  });

  it('leaves out of ln [A] and 1/[A] a concentration at or below zero, and says how many', () => {
    const runs = FADING_REFIT.runs.map((run, r) => (r === 0 ? { ...run, concentrations: run.concentrations.map((c, i) => (i === 10 ? -2e-7 : c)) } : run));
    const refit: Refit = { ...FADING_REFIT, runs };
    const reported = secondOrder.submission.reported;
    expect(lawSeries(refit, reported, 0, 'min').runs[0].points).toHaveLength(11);
    const ln = lawSeries(refit, reported, 1, 'min');
    expect(ln.runs[0].points).toHaveLength(10);
    expect(lineTexts(ln, 'your', false)).toContain('1 reading(s) at or below zero have no ln [A]');
  });

  it('says why the student’s line is missing when their k’s unit is not one of a rate constant', () => {
    const reported = { order: 1 as const, k: { value: 0.045, unit: 'furlongs' } };
    expect(lawSeries(FADING_REFIT, reported, 1, 'min').notes).toEqual(['Your line is not drawn: k in “furlongs” could not be read as a rate constant of order 1 (min⁻¹).']);
  });

  it('a rejected or refit-less result shows no table and no plot', () => {
    expect(reactionOrderReport.display({ header, settings: FADING_SETTINGS, submission: clean.submission, result: { ...clean.result, refit: null } })).toEqual({ comparison: null, plots: [] });
  });
});

describe('reaction-order described for the workspace', () => {
  const description = reactionOrderReport.description;
  it('is in the shape GET /v1/kinds answers', () => {
    expect(KindDescription.safeParse(description).success).toBe(true);
  });

  it('names in its signal fieldset only places one of the signal’s shapes has, and every one of them', () => {
    const paths = (shape: z.ZodObject, prefix = 'signal'): string[] =>
      Object.entries(shape.shape).flatMap(([key, child]) => {
        const inner = (child as z.ZodType & { unwrap?: () => z.ZodType }).unwrap?.() ?? child;
        return 'shape' in (inner as object) ? paths(inner as z.ZodObject, `${prefix}.${key}`) : [`${prefix}.${key}`];
      });
    const all = new Set([ConcentrationSignal, AbsorbanceSignal, ConductanceSignal].flatMap((s) => paths(s as unknown as z.ZodObject)));
    const fields = description.settings.form[0].fields.map((f) => f.name);
    expect(new Set(fields)).toEqual(all);
  });

  it('offers every other setting with a default in the form', () => {
    const top = new Set(description.settings.form.flatMap((g) => g.fields.map((f) => f.name.split('.')[0])));
    expect([...top].sort()).toEqual(Object.keys(Settings.shape).filter((k) => k !== 'kind').sort());
  });

  it('asks for the files and columns the CSV reader takes', () => {
    expect(description.upload.csv!.map((f) => [f.name, f.required])).toEqual([[reactionOrderCsvLayout.main, true], ...reactionOrderCsvLayout.optional.map((n) => [n, false])]);
    expect(description.upload.csv!.map((f) => f.columns)).toEqual([READINGS_COLUMNS, REPORTED_COLUMNS]);
  });
});

describe('reaction-order places in words', () => {
  const describe_ = (path: string) => reactionOrderReport.describePath(path, clean.submission);
  it('names the reported values and the runs by their labels', () => {
    expect(describe_('reported.order')).toBe('order n');
    expect(describe_('reported.k.unit')).toBe('unit of k');
    expect(describe_('runs[1].reported.halfLife')).toBe('Run “B”, half-life t_{1/2}');
    // Run A's third reading is at t = 8 min (report-fixture.ts).
    expect(describe_('runs[0].readings[2]')).toBe('Run “A”, reading 3 (t = 8 min)');
    expect(reactionOrderReport.describePath('runs[4].timeUnit', { not: 'a submission' })).toBe('Run 5, time unit');
    expect(describe_('somewhere.else')).toBe('somewhere.else');
  });
});
