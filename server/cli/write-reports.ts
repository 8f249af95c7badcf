import { mkdir, writeFile } from 'node:fs/promises';
import { basename, dirname, extname, join } from 'node:path';
import type { CheckResult } from '../../schemas/result.ts';
import type { FeedbackInput, KindSettings, SummaryHeader } from '../../reports/feedback-input.ts';
import { UniqueNames } from '../../reports/file-names.ts';
import type { Assignment } from '../checks/check.ts';
import type { WorkerPool } from '../pool/worker-pool.ts';
import { sheetParts, type KeptResult } from '../batches/sheet-parts.ts';
import type { DrawnBatch } from '../batches/check-and-draw.ts';
import type { SectionFilesInput } from '../batches/section-files.ts';
import { fileErrorReason, InputError } from './cli-errors.ts';
import type { CliIo } from './cli-io.ts';
import { InFlight } from './in-flight.ts';
import { KeptLines } from './kept-lines.ts';

const WRITES_IN_FLIGHT = 8;

/**
 * --out: a feedback sheet per checked result, the gradebook and the section summary, written batch by
 * batch as results come in file order. With a pool, the worker that checked a batch draws its sheets
 * (`checkAndDraw`), so that results and submissions stay there; without, they are drawn here. Of each
 * result only what the gradebook and summary read, and each checked submission, go to a temporary file
 * as they come; once the sheets are done and the pool is closed they are read back one at a time into
 * the gradebook's rows, the summary's running totals and the section's signals (`sectionFiles`; in a
 * worker of its own after a pool), and let go. Nothing grows with the file in memory but those totals.
 */
export class ReportWriter {
  private readonly header: SummaryHeader;
  private readonly settings: KindSettings;
  private readonly names = new UniqueNames();
  private readonly writing = new InFlight(WRITES_IN_FLIGHT);
  /** Per result, in file order: the part the summary reads, and the submission as read where it has a sheet. */
  private readonly kept = new KeptLines<KeptResult>();
  private sheets = 0;
  private results = 0;

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

  /** What a worker needs to draw the sheets of a batch it checks (`checkAndDraw`). */
  frame(): { header: SummaryHeader; settings: KindSettings } {
    return { header: this.header, settings: this.settings };
  }

  /** The next batch in file order, checked in this thread: its sheets drawn and written; resolves when they are. */
  async add(results: CheckResult[], reads: unknown[]): Promise<void> {
    const sheets: Array<{ name: string; input: FeedbackInput }> = [];
    for (const [i, result] of results.entries()) {
      const { kept, input } = sheetParts(this.header, this.settings, result, reads[i]);
      this.kept.push(kept);
      this.results += 1;
      if (input) sheets.push({ name: this.names.take(input.header.studentId), input });
    }
    this.sheets += sheets.length;
    await this.kept.flushed();
    const { feedbackSheetOrReason } = await import('../../kinds/documents.ts');
    // Each sheet is written while the next is drawn, a few at most in flight.
    for (const { name, input } of sheets) {
      const bytes = await feedbackSheetOrReason(input);
      await this.writing.add(() => this.save(name, bytes));
    }
  }

  /** The next batch in file order, checked and drawn in a worker: its sheets written; resolves when they are. */
  async addDrawn(batch: DrawnBatch): Promise<void> {
    this.kept.pushLines(batch.kept);
    this.results += batch.count;
    this.sheets += batch.sheets.length;
    await this.kept.flushed();
    await Promise.all(batch.sheets.map(({ studentId, bytes }) => this.save(this.names.take(studentId), bytes)));
  }

  /** The gradebook and the summary, after the last batch; returns the sheet count. */
  async finish(): Promise<number> {
    await this.writing.done();
    // The section is read back once the sheets' workers have given their memory back.
    await this.pool?.close();
    const input: SectionFilesInput = { path: await this.kept.written(), header: this.header, settings: this.settings };
    const { gradebook, summary } = this.pool ? await sectionFilesInWorker(input, this.results) : await (await import('../batches/section-files.ts')).sectionFiles(input);
    await this.save('gradebook.csv', gradebook);
    await this.save('summary.pdf', summary);
    await this.kept.discard();
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

/**
 * The gradebook and summary of a long file in a worker of their own, its heap bounded: in the command's
 * thread the signals' comparison of 20,000 submissions let the heap grow by some 90 MB of garbage before
 * it was collected; a bound makes V8 collect sooner. The bound is far above what the read-back holds
 * (about 5 kB a submission at most), so that it never stops a run.
 */
async function sectionFilesInWorker(input: SectionFilesInput, results: number): Promise<{ gradebook: string; summary: Uint8Array }> {
  const { createWorkerPool } = await import('../pool/worker-pool.ts');
  const worker = createWorkerPool(1, { maxOldGenerationSizeMb: Math.max(512, Math.ceil(results / 50)), maxYoungGenerationSizeMb: 16 });
  try {
    return await worker.run('section-files', input);
  } finally {
    await worker.close();
  }
}
