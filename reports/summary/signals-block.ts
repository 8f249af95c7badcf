import type { CheckResult } from '../../schemas/result.ts';
import type { SectionSignals } from '../../server/signals/section-report.ts';
import { formatNumber } from '../format.ts';
import { paragraph, sectionHeading, type Doc } from '../pdf/document.ts';
import { drawTable } from '../pdf/table.ts';
import { COLOR, SIZE } from '../pdf/theme.ts';

/** A signal's place in a student's submission, in words (sub/superscript markup allowed: the table draws it). */
type Signalled = Pick<CheckResult, 'studentId' | 'signals'>;

export type SignalPlace = (path: string, studentId: string | null) => string;

const RELATION = { identical: 'the same', offset: 'shifted by a constant', scaled: 'rescaled', edited: 'a few cells changed' } as const;

/** Each student's signals about the measurement (per run and per submission), one row per student. */
function drawStudentSignals(doc: Doc, results: Signalled[], place: SignalPlace): void {
  const rows = results.filter((r) => (r.signals ?? []).length > 0);
  if (rows.length === 0) {
    paragraph(doc, 'No signals about how any student’s runs were measured.');
    return;
  }
  paragraph(doc, 'How the runs were measured: each student’s signals, with the places they concern (the workspace gives the evidence).');
  drawTable(
    doc,
    [
      { header: 'Student', weight: 1.1 },
      { header: 'Signals', weight: 4.2 },
    ],
    rows.map((r) => [r.studentId ?? '—', (r.signals ?? []).map((s) => `${s.code} (${place(s.path, r.studentId)})`).join(', ')]),
    { zebra: true, keepRows: 4 },
  );
}

/** The section's signals for review: prompts to look and ask, never findings. */
export function drawSignals(doc: Doc, signals: SectionSignals | undefined, results: Signalled[], place: SignalPlace): void {
  sectionHeading(doc, 'For review: how the data were measured, and patterns across the section', 90);
  paragraph(doc, 'Prompts to look and ask the students, not findings: no points depend on them and nothing here reaches a student.', { size: SIZE.small, color: COLOR.muted });
  drawStudentSignals(doc, results, place);
  if (!signals) return;
  if (signals.notCompared) {
    paragraph(doc, `Nothing was compared: ${signals.notCompared}.`);
    return;
  }
  if (signals.pairs.length === 0 && signals.smooth.length === 0) {
    paragraph(doc, 'No readings that look alike between submissions, and no run smoother than the instrument reads.');
    return;
  }
  if (signals.pairs.length > 0) {
    paragraph(doc, 'Readings that look alike: separate measurements agree in shape but not reading by reading.');
    drawTable(
      doc,
      [
        { header: 'Students', weight: 1.6 },
        { header: 'Matching runs', weight: 1.1, align: 'right' },
        { header: 'How they match', weight: 2.6 },
        { header: 'k written alike', weight: 1.1, align: 'right' },
      ],
      signals.pairs.map((p) => [p.students.join(' and '), String(p.runs.length), [...new Set(p.runs.map((r) => RELATION[r.relation]))].join(', ') || '—', String(p.sameReportedK.length)]),
      { zebra: true, keepRows: 4 },
    );
    if (signals.groups.length > 0) paragraph(doc, `Shared by more than two: ${signals.groups.map((g) => g.join(', ')).join('; ')}.`, { size: SIZE.small });
  }
  if (signals.smooth.length > 0) {
    paragraph(doc, 'Runs smoother than the instrument reads: scatter about the curve no larger than rounding to the display step alone gives.');
    drawTable(
      doc,
      [
        { header: 'Student', weight: 1.3 },
        { header: 'Run', weight: 1.3 },
        { header: 'Scatter', weight: 1, align: 'right' },
        { header: 'Display step', weight: 1, align: 'right' },
        { header: 'Section median', weight: 1.2, align: 'right' },
      ],
      signals.smooth.map((r) => [r.studentId, r.label, formatNumber(r.residualSD, 2), formatNumber(r.step, 1), formatNumber(r.sectionMedianSD, 2)]),
      { zebra: true, keepRows: 4 },
    );
  }
}
