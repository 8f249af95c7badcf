import { createReadStream } from 'node:fs';
import { stat, writeFile } from 'node:fs/promises';
import { availableParallelism } from 'node:os';
import { checkBatch } from '../checks/check.ts';
import type { WorkerPool } from '../pool/worker-pool.ts';
import { WorkerTaskError } from '../pool/worker-pool.ts';
import type { CheckResult } from '../../schemas/result.ts';
import { checkJsonBatch, formatResults, type CheckedBatch, type ResultOutput } from '../batches/check-json-batch.ts';
import { fileErrorReason, InputError, isFileError, UsageError } from './cli-errors.ts';
import type { CliIo } from './cli-io.ts';
import { parseOptions } from './parse-options.ts';
import { InFlight } from './in-flight.ts';
import { JsonBatcher, JsonLayoutError, type JsonBatch } from '../batches/json-batches.ts';
import { readAssignment, readCsvSubmissions } from './read-input.ts';
import { renderTable, type TableEntry } from '../../reports/results-table.ts';

/**
 * `rateproof check`: grades a submissions file offline. A JSON or JSON Lines file is read as a stream
 * in batches of whole submissions; a large one is checked in a pool of worker threads, one per core,
 * and JSON output is written in the file's order as batches finish.
 */

// About 500 submissions of four 16-reading runs: big enough that a worker's round trip is cheap
// beside the checking, small enough to spread a file of a few thousand over every core.
const BATCH_BYTES = 1 << 20;
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
  // Reports and signals need every result and submission kept until the end.
  const output: ResultOutput = values.out !== undefined || values.signals !== undefined ? 'results' : printed;
  const sink = new ResultSink(printed, !!values.arrays, io);

  let pool: WorkerPool | undefined;
  try {
    if (isCsv) {
      const submissions = await readCsvSubmissions(assignment.kind, submissionsPath, reportedPath, io);
      sink.add(0, formatResults(checkBatch(assignment, submissions), submissions, { output, arrays: !!values.arrays }));
    } else {
      const size = await sizeOf(submissionsPath);
      const poolSize = workers ?? (size >= POOL_MIN_BYTES ? availableParallelism() : 0);
      if (poolSize > 0) pool = (await import('../pool/worker-pool.ts')).createWorkerPool(poolSize);
      const settingsJson = JSON.stringify(assignment.settings);
      const jsonLines = /\.(jsonl|ndjson)$/i.test(submissionsPath);
      await streamBatches(submissionsPath, jsonLines, pool, (batch) => ({ settingsJson, batch, jsonLines, output, arrays: !!values.arrays }), sink);
    }
    if (output !== 'results') {
      sink.finish();
      return 0;
    }
    const results = sink.results;
    const count = values.out === undefined ? undefined : await (await import('./write-reports.ts')).writeReports(values.out, { assignmentPath, submissionsPath }, assignment, sink.submissions, results, io, pool);
    sink.print(results);
    sink.finish();
    if (printed === 'table' && count !== undefined) io.stdout(`wrote ${count} feedback sheets, gradebook.csv and summary.pdf to ${values.out}\n`);
    if (values.signals !== undefined) await writeSignals(values.signals, assignment.settings, sink.submissions, results, printed === 'table', io);
    return 0;
  } finally {
    await pool?.close();
  }
}

/** --signals FILE: the section's signals as JSON, from the submissions the checker could read. */
async function writeSignals(path: string, settings: unknown, submissions: unknown[], results: CheckResult[], say: boolean, io: CliIo): Promise<void> {
  const { sectionSignals } = await import('../../kinds/section-signals.ts');
  const checked = submissions.filter((_, i) => results[i]?.status === 'checked');
  const section = sectionSignals(settings as { kind: string }, checked);
  // Each student's own signals (per run and per submission) beside the section's.
  const students = results.flatMap((r) => ((r.signals ?? []).length > 0 ? [{ studentId: r.studentId, signals: r.signals }] : []));
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

/** Reads the file in batches and checks each, in this thread or the pool, at most two per worker at once. */
async function streamBatches(
  path: string,
  jsonLines: boolean,
  pool: WorkerPool | undefined,
  job: (batch: JsonBatch) => Parameters<typeof checkJsonBatch>[0],
  sink: ResultSink,
): Promise<void> {
  const batcher = new JsonBatcher({ jsonLines, batchBytes: BATCH_BYTES });
  const inFlight = new InFlight(2 * (pool?.size ?? 1));
  let seq = 0;
  const check = async (batch: JsonBatch) => {
    const n = seq++;
    if (!pool) return sink.add(n, checkJsonBatch(job(batch)));
    await inFlight.add(() => pool.run('check-json-batch', job(batch)).then((checked) => sink.add(n, checked)));
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

/** Takes checked batches as they finish and prints them in the file's order. */
class ResultSink {
  private readonly waiting = new Map<number, CheckedBatch>();
  private next = 0;
  private printedAny = false;
  private readonly table: TableEntry[] = [];
  readonly results: CheckResult[] = [];
  readonly submissions: unknown[] = [];

  constructor(
    private readonly printed: ResultOutput,
    private readonly arrays: boolean,
    private readonly io: CliIo,
  ) {}

  add(seq: number, batch: CheckedBatch): void {
    this.waiting.set(seq, batch);
    for (let b = this.waiting.get(this.next); b; b = this.waiting.get(this.next)) {
      this.waiting.delete(this.next++);
      this.take(b);
    }
  }

  private take(batch: CheckedBatch): void {
    if (batch.results) {
      this.results.push(...batch.results);
      this.submissions.push(...(batch.submissions ?? []));
    }
    if (batch.table) this.table.push(...batch.table);
    if (batch.text) {
      if (this.printed === 'json') this.io.stdout(this.printedAny ? `,\n${batch.text}` : `[\n${batch.text}`);
      else this.io.stdout(batch.text);
      this.printedAny = true;
    }
  }

  /** With --out the results were kept: print them now in the chosen format. */
  print(results: CheckResult[]): void {
    this.take(formatResults(results, [], { output: this.printed, arrays: this.arrays }));
  }

  finish(): void {
    if (this.printed === 'table') this.io.stdout(renderTable(this.table));
    else if (this.printed === 'json') this.io.stdout(this.printedAny ? '\n]\n' : '[]\n');
  }
}
