// One-off: dumps what the checker and the documents make of generated submissions of both kinds, so
// that a move of files can be shown to change nothing (run before and after, diff the two files).
import { writeFileSync } from 'node:fs';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { feedbackSheet, sectionSummary } from '../../kinds/documents.ts';
import { sectionSignals } from '../../kinds/section-signals.ts';
import { reportFor } from '../../kinds/registry.ts';
import { checkAndRead } from '../../server/checks/check.ts';
import { cleanCase, slipCase, slipCodes } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { temperatureSlips, temperatureSubmission } from '../../kinds/temperature-dependence/demo/submission-generator.ts';
import { pdfText } from './pdf-reading.ts';

const N = 2000;
const SHEETS = 30;
const header = { course: 'C', section: 'S', assignment: 'A', version: 1, gradedAt: '2026-01-01T00:00:00Z', released: true };

async function main(out: string) {
  const dump: Record<string, unknown[]> = { first: [], temperature: [], sheets: [], summaries: [] };
  const firstCases = Array.from({ length: N }, (_, i) => (i % 3 === 0 ? cleanCase(i) : slipCase(slipCodes[i % slipCodes.length], i)));
  const temperatureSettings = parseAssignment({ kind: 'temperature-dependence' });
  const random = seededRandom(4242);
  const temperatureCases = Array.from({ length: N }, (_, i) => ({
    settings: { kind: 'temperature-dependence' } as unknown,
    submission: temperatureSubmission(random, `S-${i}`, i % 3 === 0 ? undefined : temperatureSlips[i % temperatureSlips.length]) as unknown,
  }));
  for (const [name, cases] of [['first', firstCases], ['temperature', temperatureCases]] as const) {
    const section: { settings: unknown; submission: unknown; result: unknown }[] = [];
    for (const [i, c] of (cases as { settings: unknown; submission: unknown }[]).entries()) {
      const assignment = name === 'temperature' ? temperatureSettings : parseAssignment(c.settings);
      const { result, read } = checkAndRead(assignment, c.submission);
      dump[name].push(result);
      if (i < SHEETS) {
        const input = { header: { ...header, studentId: result.studentId ?? '?' }, settings: assignment.settings as { kind: string }, submission: read, result };
        dump.sheets.push(await pdfText(await feedbackSheet(input)));
        dump.sheets.push((await reportFor(input.settings.kind)).display(input));
      }
      section.push({ settings: assignment.settings, submission: read, result });
    }
    // A section: the clean cases of the first ten settings' kind share nothing, so take all under the first settings.
    const settings = section[0].settings as { kind: string };
    const same = section.filter((s) => JSON.stringify(s.settings) === JSON.stringify(settings)).slice(0, 40);
    const submissions = same.map((s) => s.submission);
    const signals = sectionSignals(settings, submissions);
    dump.summaries.push(signals);
    dump.summaries.push(await pdfText(await sectionSummary({ header: { course: 'C', section: 'S', assignment: 'A', gradedAt: '2026-01-01T00:00:00Z' }, settings, results: same.map((s) => s.result as never), submissions, signals })));
  }
  writeFileSync(out, JSON.stringify(dump, null, 1));
}

await main(process.argv[2]);
