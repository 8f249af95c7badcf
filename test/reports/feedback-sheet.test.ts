import { beforeAll, describe, expect, it } from 'vitest';
import { checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { INVENTED_NOTE, LIKELY_CAUSES_NOTE } from '../../reports/feedback-input.ts';
import { feedbackSheet } from '../../kinds/documents.ts';
import { formatNumber, formatPoints, printableMessage } from '../../reports/format.ts';
import { readRefit } from '../../kinds/first-order-catalysis/report/refit.ts';
import { plainRich } from '../../reports/pdf/rich-text.ts';
import { firstOrderCatalysisReport } from '../../kinds/first-order-catalysis/report/report.ts';
import { feedbackInput, section, type Section, type Student } from './fixtures.ts';
import { folded, pageCount, pdfFonts, pdfText } from '../support/pdf-reading.ts';

// Invented data: the seeded generator's section, one clean student and one slip each.
let s: Section;
const student = (id: string): Student => s.students.find((x) => x.submission.studentId === id)!;

beforeAll(() => {
  s = section(7, [undefined, 'log-base', 'suspect-reading', 'concentration-unit'], { reference: true });
});

async function render(id: string, invented = true) {
  const pdf = await feedbackSheet(feedbackInput(s.settings, student(id), invented));
  const text = await pdfText(pdf);
  return { pdf, text, flat: folded(text) };
}

describe('feedbackSheet', () => {
  it('prints the id, the score, the refit values as formatted, and the likely-cause note', async () => {
    const { result } = student('S-002');
    const { pdf, text, flat } = await render('S-002');
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    expect(text).toContain('S-002');
    expect(flat).toContain(`${formatPoints(result.score!)} / ${formatPoints(result.maxScore)}`);
    const refit = readRefit(result)!;
    expect(text).toContain(formatNumber(refit.runs[0].k!.instructor.value));
    expect(text).toContain(formatNumber(refit.kA!.value));
    expect(flat).toContain(folded(LIKELY_CAUSES_NOTE));
  });

  it('prints every finding in the checker’s words, with its severity in text', async () => {
    const { result } = student('S-002');
    const { flat } = await render('S-002');
    // A log-base slip: the first run's ln F column carries the message; the k_obs values that follow from
    // it at no cost are named in one line, not as cards (hand-read from the slip the generator makes).
    const cards = result.findings.filter((x) => x.code !== 'carried-forward');
    // Hand-read from the slip: log10 in each of the 4 runs' columns, one finding a column; and the
    // student's k_A, ours divided by ln 10, below the reference band's 0.1 M^-1 min^-1: a warning.
    expect(Number(student('S-002').submission.reported!.kA!.value)).toBeLessThan(0.1);
    expect(cards.map((f) => [f.code, f.path])).toEqual([...[0, 1, 2, 3].map((i) => ['log-base', `runs[${i}].reported.lnF`]), ['implausible', 'reported.kA']]);
    for (const f of cards) {
      const place = plainRich(firstOrderCatalysisReport.describePath(f.path, student('S-002').submission));
      expect(flat.includes(folded(plainRich(printableMessage(f.message)).slice(0, 60))) || flat.includes(place)).toBe(true);
    }
    expect(flat).toContain('log10');
    expect(flat).toContain('Error · ');
    expect(flat).toMatch(/Follows from your own numbers: Run “[^”]+”, kobs/);
    expect(flat).toMatch(/−1 point/);
  });

  it('groups findings by stage and names the rubric items the score is made of', async () => {
    const { flat } = await render('S-004');
    expect(flat).toMatch(/Rate law: k ?N and k ?A/);
    expect(flat).toContain('mM');
    expect(flat).toMatch(/Standard error of k ?A/);
    expect(flat).toMatch(/Rubric item Worth Available Lost Earned/);
  });

  it('renders Greek letters, superscripts, subscripts, the minus and degree signs in an embedded DejaVu font', async () => {
    const { pdf, text } = await render('S-002');
    for (const symbol of ['α', '∞', '⁻¹', '±', '°C', '\u2212']) expect(text).toContain(symbol);
    expect(text).toMatch(/k\s?obs/);
    const fonts = pdfFonts(pdf);
    expect(fonts.map((f) => f.name.replace(/^[A-Z]{6}\+/, '')).sort()).toEqual(['DejaVuSans', 'DejaVuSans-Bold']);
    for (const font of fonts) expect(font).toMatchObject({ embedded: true });
  });

  it('draws residuals where a reading looks suspect, and only there', async () => {
    const suspect = await render('S-003');
    expect(suspect.flat).toContain('Residuals where a reading looks suspect');
    expect(suspect.flat).toMatch(/reading \d+: /);
    expect((await render('S-001')).flat).not.toContain('Residuals where');
  });

  it('labels invented data in the footer of every page, and only when told', async () => {
    const invented = await render('S-002');
    const pages = await pageCount(invented.pdf);
    expect(pages).toBeGreaterThan(1);
    expect(invented.flat.split(INVENTED_NOTE).length - 1).toBe(pages);
    expect(invented.flat).toContain(`page ${pages} of ${pages}`);
    expect((await render('S-002', false)).flat).not.toContain(INVENTED_NOTE);
  });

  it('reads a result that went through JSON (non-finite numbers became null)', async () => {
    const { submission, result } = student('S-002');
    const refit = structuredClone(result.refit) as { runs: Array<Record<string, unknown>> };
    refit.runs[0].halfLife = { value: 20, standardError: 1, ci95: [18, Infinity], unit: 'min' };
    const roundTripped = JSON.parse(JSON.stringify({ ...result, refit }));
    const text = await pdfText(await feedbackSheet(feedbackInput(s.settings, { submission, result: roundTripped })));
    expect(text).toContain(formatNumber(readRefit(result)!.runs[0].k!.instructor.value));
    expect(folded(text)).toContain('ln F against t, run by run');
  });

  it('gives the same bytes for the same input', async () => {
    const input = feedbackInput(s.settings, student('S-003'));
    expect((await feedbackSheet(input)).equals(await feedbackSheet(structuredClone(input)))).toBe(true);
  });

  it('renders sheets concurrently with the same bytes as one at a time (fonts and caches are shared)', async () => {
    const inputs = s.students.map((x) => feedbackInput(s.settings, x));
    const together = await Promise.all(inputs.map((input) => feedbackSheet(input)));
    for (const [i, input] of inputs.entries()) expect(together[i].equals(await feedbackSheet(input))).toBe(true);
  });

  it('explains a rejected submission instead of scoring it', async () => {
    const broken = { ...structuredClone(student('S-001').submission), studentId: 'S-099' };
    broken.runs[0].readings = broken.runs[0].readings.slice(0, 2);
    const result = checkSubmission(parseAssignment(s.settings), broken);
    expect(result.status).toBe('rejected');
    const pdf = await feedbackSheet({ ...feedbackInput(s.settings, { submission: broken, result }), invented: true });
    const flat = folded(await pdfText(pdf));
    expect(flat).toContain('S-099');
    expect(flat).toContain('Not checked');
    expect(result.rejected![0].path).toBe('runs[0].readings');
    expect(flat).toContain(`Run “${broken.runs[0].label}”, readings`);
    expect(flat).toContain(plainRich(printableMessage(result.rejected![0].message)));
    expect(flat).toContain(folded(LIKELY_CAUSES_NOTE));
  });

  it('renders a class-dataset assignment with the intercept model and a transcription slip', async () => {
    const other = section(11, ['transcription'], { classDataset: true, fitModel: 'intercept' });
    const { settings, students } = other;
    const pdf = await feedbackSheet(feedbackInput(settings, students[0]));
    const flat = folded(await pdfText(pdf));
    expect(students[0].result.findings.map((f) => f.code)).toContain('transcription');
    expect(flat).toContain('Readings match the class data');
    expect(flat).toContain('with an intercept');
    for (const f of students[0].result.findings) expect(flat).toContain(folded(plainRich(printableMessage(f.message)).slice(0, 60)));
  });

  it('prints a long assignment title whole in the header, wrapped, not cut', async () => {
    const input = feedbackInput(s.settings, student('S-001'));
    // Invented title, long enough to need three lines in its column.
    const title = 'Acid-catalysed first-order kinetics of an invented ester hydrolysis, four catalyst concentrations, polarimetry';
    const text = folded(await pdfText(await feedbackSheet({ ...input, header: { ...input.header, assignment: title } })));
    expect(text).toContain(title);
    expect(text.split('\f')[0]).not.toMatch(/polarimetry…|hydrolysis…/);
  });

  it('names the places of a time-unit slip in every run in words, on one card (hand-made result)', async () => {
    const { submission, result } = student('S-001');
    // Invented: the same cause at two runs, charged at the first and counted once at the second, as the checker scores a habit.
    const slip = (run: number, points: number) => ({
      id: `time-unit@runs[${run}].reported.k`, code: 'time-unit', stage: 'run', path: `runs[${run}].reported.k`, severity: 'error' as const, pointsLost: points,
      reported: 0.0005, expected: 0.03, unit: 'min^-1',
      message: `k_obs is 0.0005 min^-1; the refit gives 0.03 min^-1 (5e-4 min^-1).${points === 0 ? ' Counted once: the same likely cause was already scored at runs[0].reported.k.' : ''}`,
    });
    const findings = [slip(0, 2), slip(1, 0)];
    const pdf = await feedbackSheet({ ...feedbackInput(s.settings, student('S-001')), result: { ...result, findings } });
    const text = folded(await pdfText(pdf));
    expect(text.match(/Error · /g)).toHaveLength(1);
    expect(text).toContain(`Error · ${firstOrderCatalysisReport.describePath('runs[0].reported.k', submission).replace(/_\{([^}]*)\}/g, '$1')} and 1 more place`);
    expect(text).toContain(`${plainRich(firstOrderCatalysisReport.describePath('runs[1].reported.k', submission))}: yours`);
    expect(text).toContain('(5 × 10⁻⁴ min⁻¹).');
    expect(text).toContain('1 finding cost points');
    expect(text).not.toMatch(/runs\[|reported\.[a-z]/);
  });
});
