import { mkdir, writeFile } from 'node:fs/promises';
import { basename, dirname, extname, join } from 'node:path';
import type { CheckResult } from '../../schemas/result.ts';
import type { FeedbackInput, KindSettings } from '../../reports/feedback-input.ts';
import { UniqueNames } from '../../reports/file-names.ts';
import { gradebookCsv } from '../../reports/gradebook-csv.ts';
import type { Assignment } from '../checks/check.ts';
import type { WorkerPool } from '../pool/worker-pool.ts';
import { fileErrorReason, InputError } from './cli-errors.ts';
import type { CliIo } from './cli-io.ts';
import { InFlight } from './in-flight.ts';

const WRITES_IN_FLIGHT = 8;

/**
 * --out: a feedback sheet per checked result, the gradebook and the section summary. Sheets are drawn
 * in the worker pool when there is one. Returns the sheet count.
 */
export async function writeReports(
  dir: string,
  paths: { assignmentPath: string; submissionsPath: string },
  assignment: Assignment,
  submissions: unknown[],
  results: CheckResult[],
  io: CliIo,
  pool?: WorkerPool,
): Promise<number> {
  const save = async (name: string, data: string | Uint8Array) => {
    const path = join(dir, name);
    try {
      await (io.writeFile ?? ((p, d) => mkdir(dirname(p), { recursive: true }).then(() => writeFile(p, d))))(path, data);
    } catch (error) {
      throw new InputError(`cannot write ${path}: ${fileErrorReason(error)}`);
    }
  };
  const stem = (path: string) => basename(path, extname(path));
  const header = { course: 'Offline check', section: stem(paths.submissionsPath), assignment: stem(paths.assignmentPath), gradedAt: new Date() };
  const settings = assignment.settings as KindSettings;
  const names = new UniqueNames();
  const sheets: Array<{ name: string; input: FeedbackInput }> = [];
  for (const [i, result] of results.entries()) {
    const parsed = assignment.kind.submissionSchema.safeParse(submissions[i]);
    if (result.status !== 'checked' || result.studentId === null || !parsed.success) continue;
    const submission = parsed.data;
    sheets.push({ name: names.take(result.studentId), input: { header: { ...header, studentId: result.studentId, version: 1 }, settings, submission, result } });
  }
  if (pool) {
    await Promise.all(sheets.map(async ({ name, input }) => save(name, await pool.run('render-sheet', input))));
  } else {
    const { feedbackSheetOrReason } = await import('../../kinds/documents.ts');
    // Each sheet is written while the next is drawn, a few at most in flight.
    const writing = new InFlight(WRITES_IN_FLIGHT);
    for (const { name, input } of sheets) {
      const bytes = await feedbackSheetOrReason(input);
      await writing.add(() => save(name, bytes));
    }
    await writing.done();
  }
  await save('gradebook.csv', gradebookCsv(results, { assignment: header.assignment, bom: true }));
  const { sectionSummary } = await import('../../kinds/documents.ts');
  const { sectionSignals } = await import('../../kinds/section-signals.ts');
  const submissionsRead = sheets.map((s) => s.input.submission);
  await save('summary.pdf', await sectionSummary({ header, settings, results, submissions: submissionsRead, signals: sectionSignals(settings, submissionsRead) }));
  return sheets.length;
}
