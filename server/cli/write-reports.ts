import { mkdir, writeFile } from 'node:fs/promises';
import { basename, dirname, extname, join } from 'node:path';
import type { CheckResult } from '../../schemas/result.ts';
import type { FeedbackInput, KindSettings, SummaryHeader } from '../../reports/feedback-input.ts';
import { UniqueNames } from '../../reports/file-names.ts';
import { gradebookCsv } from '../../reports/gradebook-csv.ts';
import type { Assignment } from '../checks/check.ts';
import type { WorkerPool } from '../pool/worker-pool.ts';
import { withoutArrays } from '../batches/check-json-batch.ts';
import { fileErrorReason, InputError } from './cli-errors.ts';
import type { CliIo } from './cli-io.ts';
import { InFlight } from './in-flight.ts';
import { KeptLines } from './kept-lines.ts';

const WRITES_IN_FLIGHT = 8;

/** What the gradebook and the summary read of a result: no rubric items, per-reading arrays or finding messages. */
function summaryPart(result: CheckResult): CheckResult {
  const { items: _items, ...rest } = withoutArrays(result);
  return { ...rest, findings: rest.findings.map((f) => ({ ...f, message: '' })) };
}

/**
 * --out: a feedback sheet per checked result, the gradebook and the section summary, written batch by
 * batch as results come in file order. Sheets are drawn in the worker pool when there is one. Of each
 * submission only what the gradebook and summary need is kept to the end, in a temporary file, and read
 * back once the sheets are done and the pool is closed.
 */
export class ReportWriter {
  private readonly header: SummaryHeader;
  private readonly settings: KindSettings;
  private readonly names = new UniqueNames();
  private readonly writing = new InFlight(WRITES_IN_FLIGHT);
  /** Per result, in file order: the part the summary reads, and the submission as read where it has a sheet. */
  private readonly kept = new KeptLines<[CheckResult] | [CheckResult, unknown]>();
  private sheets = 0;

  constructor(
    private readonly dir: string,
    paths: { assignmentPath: string; submissionsPath: string },
    assignment: Assignment,
    private readonly io: CliIo,
    private readonly pool?: WorkerPool,
  ) {
    const stem = (path: string) => basename(path, extname(path));
    this.header = { course: 'Offline check', section: stem(paths.submissionsPath), assignment: stem(paths.assignmentPath), gradedAt: new Date() };
    this.settings = assignment.settings as KindSettings;
  }

  /** The next batch in file order: its sheets drawn and written; resolves when they are. */
  async add(results: CheckResult[], reads: unknown[]): Promise<void> {
    const sheets: Array<{ name: string; input: FeedbackInput }> = [];
    for (const [i, result] of results.entries()) {
      const read = reads[i];
      const drawn = result.status === 'checked' && result.studentId !== null && read !== undefined;
      this.kept.push(drawn ? [summaryPart(result), read] : [summaryPart(result)]);
      if (!drawn) continue;
      sheets.push({ name: this.names.take(result.studentId!), input: { header: { ...this.header, studentId: result.studentId!, version: 1 }, settings: this.settings, submission: read, result } });
    }
    this.sheets += sheets.length;
    await this.kept.flushed();
    const { pool } = this;
    if (pool) {
      await Promise.all(sheets.map(async ({ name, input }) => this.save(name, await pool.run('render-sheet', input))));
      return;
    }
    const { feedbackSheetOrReason } = await import('../../kinds/documents.ts');
    // Each sheet is written while the next is drawn, a few at most in flight.
    for (const { name, input } of sheets) {
      const bytes = await feedbackSheetOrReason(input);
      await this.writing.add(() => this.save(name, bytes));
    }
  }

  /** The gradebook and the summary, after the last batch; returns the sheet count. */
  async finish(): Promise<number> {
    await this.writing.done();
    // The summary is drawn here: the workers' memory is given back before the section is read back.
    await this.pool?.close();
    const results: CheckResult[] = [];
    const submissions: unknown[] = [];
    for await (const [result, ...read] of this.kept.drain()) {
      results.push(result);
      submissions.push(...read);
    }
    await this.save('gradebook.csv', gradebookCsv(results, { assignment: this.header.assignment, bom: true }));
    const { sectionSummary } = await import('../../kinds/documents.ts');
    const { sectionSignals } = await import('../../kinds/section-signals.ts');
    const { header, settings } = this;
    await this.save('summary.pdf', await sectionSummary({ header, settings, results, submissions, signals: sectionSignals(settings, submissions) }));
    return this.sheets;
  }

  /** Removes what was kept, after a failure. */
  async discard(): Promise<void> {
    await this.kept.discard();
  }

  private async save(name: string, data: string | Uint8Array): Promise<void> {
    const path = join(this.dir, name);
    try {
      await (this.io.writeFile ?? ((p, d) => mkdir(dirname(p), { recursive: true }).then(() => writeFile(p, d))))(path, data);
    } catch (error) {
      throw new InputError(`cannot write ${path}: ${fileErrorReason(error)}`);
    }
  }
}
