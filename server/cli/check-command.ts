import { createReadStream } from 'node:fs';
import { stat, writeFile } from 'node:fs/promises';
import { availableParallelism } from 'node:os';
import type { WorkerPool } from '../pool/worker-pool.ts';
import { WorkerTaskError } from '../pool/worker-pool.ts';
import type { CheckResult } from '../../schemas/result.ts';
import { checkJsonBatch, checkSubmissions, type CheckedBatch, type KeptParts, type ResultOutput } from '../batches/check-json-batch.ts';
import type { DrawnBatch } from '../batches/check-and-draw.ts';
import { fileErrorReason, InputError, isFileError, UsageError } from './cli-errors.ts';
import type { CliIo } from './cli-io.ts';
import { parseOptions } from './parse-options.ts';
import { InFlight } from './in-flight.ts';
import { JsonBatcher, JsonLayoutError, type JsonBatch } from '../batches/json-batches.ts';
import { readAssignment, readCsvSubmissions } from './read-input.ts';
import { renderTableRows } from '../../reports/results-table.ts';
import type { ReportWriter } from './write-reports.ts';
import { ProgressLine } from './progress-line.ts';
import { KeptLines } from './kept-lines.ts';

/**
 * `rateproof check`: grades a submissions file offline. A JSON or JSON Lines file is read as a stream
 * in batches of whole submissions; a large one is checked in a pool of worker threads, one per core,
 * and JSON output is written in the file's order as batches finish. With --out each batch's sheets are
 * written as it comes in, and only what the gradebook and summary need is kept to the end.
 */

// About 500 submissions of four 16-reading runs: big enough that a worker's round trip is cheap
// beside the checking, small enough to spread a file of a few thousand over every core.
const BATCH_BYTES = 1 << 20;
// With --out a worker keeps a batch's sheets until it has drawn them all, and a batch checked out of
// turn waits for the one before it: smaller batches, fewer at once, keep that small.
const SHEET_BATCH_BYTES = 1 << 16;
// Below this a worker's start-up (loading the checker) costs more than it saves.
const POOL_MIN_BYTES = 4 << 20;

export async function checkCommand(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseOptions(args, {
    assignment: { type: 'string' },
    reported: { type: 'string' },
    json: { type: 'boolean' },
    jsonl: { type: 'boolean' },
    arrays: { type: 'boolean' },
    out: { type: 'string' },
    workers: { type: 'string' },
    signals: { type: 'string' },
    quiet: { type: 'boolean' },
  });
  const { assignment: assignmentPath, reported: reportedPath } = values;
  if (assignmentPath === undefined || positionals.length !== 1) {
    throw new UsageError('check needs --assignment and exactly one submissions file');
  }
  if (values.json && values.jsonl) throw new UsageError('--json and --jsonl are two formats: choose one');
  if (values.arrays && !values.jsonl) throw new UsageError('--arrays goes with --jsonl');
  const workers = values.workers === undefined ? undefined : Number(values.workers);
  if (workers !== undefined && !(Number.isInteger(workers) && workers >= 0 && workers <= 64)) {
    throw new UsageError('--workers takes a whole number from 0 to 64');
  }
  const submissionsPath = positionals[0];
  const isCsv = /\.csv$/i.test(submissionsPath);
  if (reportedPath !== undefined && !isCsv) throw new UsageError('--reported goes with a CSV submissions file');

  const assignment = await readAssignment(assignmentPath, io);
  const printed: ResultOutput = values.json ? 'json' : values.jsonl ? 'jsonl' : 'table';
  const arrays = !!values.arrays;
  // --out keeps each batch's results and read submissions for its sheets; --signals the checked submissions as given.
  const keep: KeptParts | undefined = values.out !== undefined || values.signals !== undefined ? { reads: values.out !== undefined, submissions: values.signals !== undefined } : undefined;

  let pool: WorkerPool | undefined;
  let progress: ProgressLine | undefined;
  let writer: ReportWriter | undefined;
  let sink: ResultSink | undefined;
  try {
    const makeWriter = async () => {
      if (values.out !== undefined) writer = new (await import('./write-reports.ts')).ReportWriter(values.out, { assignmentPath, submissionsPath }, assignment, io, pool);
    };
    if (isCsv) {
      const submissions = await readCsvSubmissions(assignment.kind, submissionsPath, reportedPath, io);
      await makeWriter();
      sink = new ResultSink(printed, io, writer);
      await sink.add(0, checkSubmissions(assignment, submissions, { output: printed, arrays, keep }), 0);
      return await sink.finish(values, assignment.settings);
    }
    const size = await sizeOf(submissionsPath);
    const poolSize = workers ?? (size >= POOL_MIN_BYTES ? availableParallelism() : 0);
    if (poolSize > 0) {
      const { createWorkerPool, SHEET_LIMITS } = await import('../pool/worker-pool.ts');
      pool = values.out === undefined ? createWorkerPool(poolSize) : createWorkerPool(poolSize, SHEET_LIMITS);
    }
    await makeWriter();
    if (io.stderrIsTerminal && !values.quiet) progress = new ProgressLine(io.stderr, size);
    sink = new ResultSink(printed, io, writer, progress);
    const settingsJson = JSON.stringify(assignment.settings);
    const jsonLines = /\.(jsonl|ndjson)$/i.test(submissionsPath);
    const layout = { jsonLines, batchBytes: writer ? SHEET_BATCH_BYTES : BATCH_BYTES, perWorker: writer ? 1 : 2 };
    const job = (batch: JsonBatch) => ({ settingsJson, batch, jsonLines, output: printed, arrays, keep });
    const started = pool;
    const frame = writer?.frame();
    // With --out a worker draws the sheets of the batch it checked: its results and submissions stay there.
    const inPool = started && { size: started.size, run: (batch: JsonBatch) => (frame ? started.run('check-and-draw', { ...job(batch), ...frame }) : started.run('check-json-batch', job(batch))) };
    await streamBatches(submissionsPath, layout, inPool, job, sink);
    progress?.end();
    return await sink.finish(values, assignment.settings);
  } finally {
    progress?.end();
    await pool?.close();
    // After a failure: the temporary files of what the summary and the table would have read.
    await writer?.discard();
    await sink?.discard();
  }
}

/** --signals FILE: the section's signals as JSON, from the submissions the checker could read. */
async function writeSignals(path: string, settings: unknown, checked: unknown[], students: Array<{ studentId: string | null; signals: CheckResult['signals'] }>, say: boolean, io: CliIo): Promise<void> {
  const { sectionSignals } = await import('../../kinds/section-signals.ts');
  const section = sectionSignals(settings as { kind: string }, checked);
  const report = { ...section, students };
  try {
    await writeFile(path, `${JSON.stringify(report, null, 2)}\n`);
  } catch (error) {
    if (isFileError(error)) throw new InputError(`cannot write ${path}: ${fileErrorReason(error)}`);
    throw error;
  }
  if (say) {
    io.stdout(
      report.notCompared
        ? `signals: nothing compared (${report.notCompared}); written to ${path}\n`
        : `signals for review: ${report.pairs.length} pair(s) of submissions with readings that look alike, ${report.smooth.length} run(s) smoother than the instrument reads, ${students.length} student(s) with signals about their runs; written to ${path}\n`,
    );
  }
}

async function sizeOf(path: string): Promise<number> {
  try {
    return (await stat(path)).size;
  } catch (error) {
    throw new InputError(`cannot read ${path}: ${fileErrorReason(error)}`);
  }
}

/** Reads the file in batches and checks each, in this thread or the pool, at most `perWorker` per worker at once. */
async function streamBatches(
  path: string,
  { jsonLines, batchBytes, perWorker }: { jsonLines: boolean; batchBytes: number; perWorker: number },
  pool: { size: number; run: (batch: JsonBatch) => Promise<CheckedBatch | DrawnBatch> } | undefined,
  job: (batch: JsonBatch) => Parameters<typeof checkJsonBatch>[0],
  sink: ResultSink,
): Promise<void> {
  const batcher = new JsonBatcher({ jsonLines, batchBytes });
  const inFlight = new InFlight(perWorker * (pool?.size ?? 1));
  let seq = 0;
  const check = async (batch: JsonBatch) => {
    const n = seq++;
    const bytes = Buffer.byteLength(batch.text);
    if (!pool) return sink.add(n, checkJsonBatch(job(batch)), bytes);
    // A batch holds its place until its sheets are written: at most so many batches' results in memory.
    await inFlight.add(() => pool.run(batch).then((checked) => sink.add(n, checked, bytes)));
  };
  try {
    let first = true;
    for await (const piece of createReadStream(path, { highWaterMark: 1 << 20 }) as AsyncIterable<Buffer>) {
      // Editors on Windows save UTF-8 with a byte-order mark.
      const bytes = first && piece[0] === 0xef && piece[1] === 0xbb && piece[2] === 0xbf ? piece.subarray(3) : piece;
      first = false;
      for (const batch of batcher.push(bytes)) await check(batch);
    }
    for (const batch of batcher.end()) await check(batch);
    await inFlight.done();
  } catch (error) {
    await inFlight.settled();
    if (error instanceof JsonLayoutError || (error instanceof WorkerTaskError && error.taskErrorName === 'JsonLayoutError')) {
      throw new InputError(`cannot read ${path}: ${error.message}`);
    }
    if (isFileError(error)) throw new InputError(`cannot read ${path}: ${fileErrorReason(error)}`);
    throw error;
  }
}

/** Takes checked batches as they finish and prints them (and writes their sheets) in the file's order. */
class ResultSink {
  private readonly waiting = new Map<number, { batch: CheckedBatch | DrawnBatch; bytes: number }>();
  private next = 0;
  private printedAny = false;
  /** The table's rows, and each submission's details to print after them (a course's are megabytes of text: kept on disk). */
  private readonly rows: string[][] = [];
  private readonly details = new KeptLines<string>();
  private done = 0;
  private bytes = 0;
  /** For --signals: the checked submissions as given, and each student's own signals. */
  private readonly checked: unknown[] = [];
  private readonly students: Array<{ studentId: string | null; signals: CheckResult['signals'] }> = [];

  constructor(
    private readonly printed: ResultOutput,
    private readonly io: CliIo,
    private readonly writer?: ReportWriter,
    private readonly progress?: ProgressLine,
  ) {}

  /** Resolves when this batch (and any before it that were waiting for it) are printed and their sheets written. */
  async add(seq: number, batch: CheckedBatch | DrawnBatch, bytes: number): Promise<void> {
    this.waiting.set(seq, { batch, bytes });
    const taken: Array<Promise<void>> = [];
    for (let w = this.waiting.get(this.next); w; w = this.waiting.get(this.next)) {
      this.waiting.delete(this.next++);
      taken.push(this.take(w.batch, w.bytes));
    }
    await Promise.all(taken);
  }

  private async take(batch: CheckedBatch | DrawnBatch, bytes: number): Promise<void> {
    for (const { row, details } of batch.table ?? []) {
      this.rows.push(row);
      if (details) this.details.push(details);
    }
    await this.details.flushed();
    if (batch.text) {
      if (this.printed === 'json') this.io.stdout(this.printedAny ? `,\n${batch.text}` : `[\n${batch.text}`);
      else this.io.stdout(batch.text);
      this.printedAny = true;
    }
    const results = batch.results ?? [];
    for (const [i, r] of results.entries()) {
      if (batch.submissions && r.status === 'checked') this.checked.push(batch.submissions[i]);
      if (batch.submissions && (r.signals ?? []).length > 0) this.students.push({ studentId: r.studentId, signals: r.signals });
    }
    if (this.writer && 'sheets' in batch) await this.writer.addDrawn(batch);
    else if (this.writer && 'reads' in batch && batch.reads) await this.writer.add(results, batch.reads);
    this.done += batch.count;
    this.bytes += bytes;
    this.progress?.update(this.done, this.bytes);
  }

  /** After the last batch: the table or the JSON array's end, the summary and gradebook, the signals. */
  async finish(options: { out?: string; signals?: string }, settings: unknown): Promise<number> {
    const count = await this.writer?.finish();
    this.progress?.end();
    if (this.printed === 'table') await this.printTable();
    else if (this.printed === 'json') this.io.stdout(this.printedAny ? '\n]\n' : '[]\n');
    if (this.printed === 'table' && count !== undefined) this.io.stdout(`wrote ${count} feedback sheets, gradebook.csv and summary.pdf to ${options.out}\n`);
    if (options.signals !== undefined) await writeSignals(options.signals, settings, this.checked, this.students, this.printed === 'table', this.io);
    return 0;
  }

  private async printTable(): Promise<void> {
    this.io.stdout(renderTableRows(this.rows));
    let text = '';
    for await (const details of this.details.drain()) {
      text += details;
      if (text.length >= PRINTED_CHUNK) {
        this.io.stdout(text);
        text = '';
      }
    }
    this.io.stdout(`${text}\n`);
  }

  /** Removes what was kept for the table, after a failure. */
  async discard(): Promise<void> {
    await this.details.discard();
  }
}

// The table's details are printed a few pages at a time rather than in a write per submission.
const PRINTED_CHUNK = 1 << 16;
