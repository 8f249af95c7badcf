import { feedbackSheet } from '../../kinds/documents.ts';
import { slipCodes } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { feedbackInput, section } from '../reports/fixtures.ts';

/**
 * Feedback sheets rendered per second on one core (the event loop; rendering is synchronous work
 * between awaits): a section of 40 invented students, a third clean and the rest with one slip each,
 * checked beforehand so that only rendering is timed. Target >= 100 sheets/s; printed, not asserted.
 */
const STUDENTS = 40;
const SECONDS = 3;

export async function benchPdfs(): Promise<{ pdfsPerSecond: number; millisecondsPerPdf: number; meanKilobytes: number; pagesNote: string }> {
  const slips = Array.from({ length: STUDENTS }, (_, i) => (i % 3 === 0 ? undefined : slipCodes.filter((c) => c !== 'transcription')[i % (slipCodes.length - 1)]));
  const { settings, students } = section(2024, slips, { reference: true });
  const inputs = students.map((s) => feedbackInput(settings, s));
  for (const input of inputs.slice(0, 5)) await feedbackSheet(input); // warm-up (font parsing, JIT)

  let count = 0;
  let bytes = 0;
  const start = process.hrtime.bigint();
  while (process.hrtime.bigint() - start < BigInt(SECONDS * 1e9)) {
    const pdf = await feedbackSheet(inputs[count % inputs.length]);
    bytes += pdf.length;
    count += 1;
  }
  const seconds = Number(process.hrtime.bigint() - start) / 1e9;
  return {
    pdfsPerSecond: count / seconds,
    millisecondsPerPdf: (seconds / count) * 1000,
    meanKilobytes: bytes / count / 1024,
    pagesNote: `${STUDENTS} students, 4 runs x 16 readings, all plots`,
  };
}
