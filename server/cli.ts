import { mkdir, writeFile } from 'node:fs/promises';
import { basename, dirname, extname, join } from 'node:path';
import { parseArgs } from 'node:util';
import type { ParseArgsConfig } from 'node:util';
import type { CheckResult } from '../schemas/result.ts';
import type { Assignment } from './checks/check.ts';
import { checkBatch, parseAssignment, SettingsError } from './checks/check.ts';
import { parseSubmissionsCsv } from './input/csv-submissions.ts';
import type { Settings, Submission } from '../schemas/kinds/first-order-catalysis.ts';
import { renderFeedbackSheet } from '../reports/feedback-sheet.ts';
import { UniqueNames } from '../reports/file-names.ts';
import { gradebookCsv } from '../reports/gradebook-csv.ts';
import { severityCounts } from '../reports/result-summary.ts';
import { renderSectionSummary } from '../reports/section-summary.ts';

/**
 * The `rateproof` command. Process wiring (argv, streams, exit code) lives in bin/rateproof.js, so
 * everything here runs in tests against fake io.
 */

export interface CliIo {
  /** Receives whole lines, newline included. */
  stdout(text: string): void;
  stderr(text: string): void;
  readFile(path: string): Promise<string>;
  /** Writes a file, making its folder; the file system when absent. */
  writeFile?(path: string, data: string | Buffer): Promise<void>;
}

/** One subcommand: its arguments (after the subcommand's name) in, exit code out. */
type Command = (args: string[], io: CliIo) => Promise<number>;

const USAGE = `usage: rateproof check --assignment A.json SUBMISSIONS.(json|csv) [--reported R.csv] [--json] [--out DIR]
       rateproof serve
       rateproof demo

  check   grade submissions offline against an assignment's settings
          SUBMISSIONS.json holds one submission or an array of them;
          SUBMISSIONS.csv holds one row per reading, --reported the reported values
          --json prints the results as JSON instead of a table
          --out DIR writes DIR/<studentId>.pdf per checked result, DIR/gradebook.csv, DIR/summary.pdf
`;

/** Wrong arguments: the usage follows the message. */
class UsageError extends Error {}

/** A file that cannot be used: one line naming the file and the reason, then exit 2. */
class InputError extends Error {}

const commands = new Map<string, Command>([
  ['check', check],
  ['serve', serve],
  ['demo', demo],
]);

/** The invented demo section, graded on the embedded database, written to ./demo-output. */
async function demo(): Promise<number> {
  const { runDemo } = await import('./demo/run-demo.ts');
  await runDemo();
  return 0;
}

/** Serves the API until stopped; configuration comes from the environment (README). */
async function serve(): Promise<number> {
  const { serve: start } = await import('./main.ts');
  await start();
  return 0;
}

/** Runs the command line `argv` (without node and the script) and returns the exit code. */
export async function run(argv: string[], io: CliIo): Promise<number> {
  const [name, ...args] = argv;
  if (name === 'help' || name === '--help' || name === '-h') {
    io.stdout(USAGE);
    return 0;
  }
  const command = name === undefined ? undefined : commands.get(name);
  if (!command) {
    io.stderr(`${name === undefined ? '' : `rateproof: unknown command "${name}"\n`}${USAGE}`);
    return 2;
  }
  try {
    return await command(args, io);
  } catch (error) {
    if (error instanceof UsageError) io.stderr(`rateproof: ${error.message}\n${USAGE}`);
    else if (error instanceof InputError) io.stderr(`rateproof: ${error.message}\n`);
    else throw error;
    return 2;
  }
}

async function check(args: string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseOptions(args, {
    assignment: { type: 'string' },
    reported: { type: 'string' },
    json: { type: 'boolean' },
    out: { type: 'string' },
  });
  const { assignment: assignmentPath, reported: reportedPath } = values;
  if (assignmentPath === undefined || positionals.length !== 1) {
    throw new UsageError('check needs --assignment and exactly one submissions file');
  }
  const submissionsPath = positionals[0];
  const isCsv = /\.csv$/i.test(submissionsPath);
  if (reportedPath !== undefined && !isCsv) throw new UsageError('--reported goes with a CSV submissions file');

  const assignment = await readAssignment(assignmentPath, io);
  const submissions = isCsv
    ? await readCsvSubmissions(submissionsPath, reportedPath, io)
    : [await readJson(submissionsPath, io)].flat();
  const results = checkBatch(assignment, submissions);
  io.stdout(values.json ? `${JSON.stringify(results, null, 2)}\n` : renderResults(results));
  if (values.out !== undefined) {
    const count = await writeReports(values.out, { assignmentPath, submissionsPath }, assignment, submissions, results, io);
    if (!values.json) io.stdout(`wrote ${count} feedback sheets, gradebook.csv and summary.pdf to ${values.out}\n`);
  }
  return 0;
}

/** --out: a feedback sheet per checked result, the gradebook and the section summary. Returns the sheet count. */
async function writeReports(dir: string, paths: { assignmentPath: string; submissionsPath: string }, assignment: Assignment, submissions: unknown[], results: CheckResult[], io: CliIo): Promise<number> {
  const save = async (name: string, data: string | Buffer) => {
    const path = join(dir, name);
    try {
      await (io.writeFile ?? ((p, d) => mkdir(dirname(p), { recursive: true }).then(() => writeFile(p, d))))(path, data);
    } catch (error) {
      const code = (error as { code?: string }).code;
      throw new InputError(`cannot write ${path}: ${(code && fileErrors[code]) ?? (error as Error).message}`);
    }
  };
  const stem = (path: string) => basename(path, extname(path));
  const header = { course: 'Offline check', section: stem(paths.submissionsPath), assignment: stem(paths.assignmentPath), gradedAt: new Date() };
  const settings = assignment.settings as Settings;
  const names = new UniqueNames();
  const checked: Submission[] = [];
  for (const [i, result] of results.entries()) {
    const parsed = assignment.kind.submissionSchema.safeParse(submissions[i]);
    if (result.status !== 'checked' || result.studentId === null || !parsed.success) continue;
    const submission = parsed.data as Submission;
    checked.push(submission);
    await save(names.take(result.studentId), await renderFeedbackSheet({ header: { ...header, studentId: result.studentId, version: 1 }, settings, submission, result }));
  }
  await save('gradebook.csv', gradebookCsv(results, { bom: true }));
  await save('summary.pdf', await renderSectionSummary({ header, settings, results, submissions: checked }));
  return checked.length;
}

function parseOptions<const Options extends NonNullable<ParseArgsConfig['options']>>(args: string[], options: Options) {
  try {
    return parseArgs({ args, options, allowPositionals: true, strict: true });
  } catch (error) {
    throw new UsageError((error as Error).message);
  }
}

const fileErrors: Record<string, string> = {
  ENOENT: 'no such file',
  EACCES: 'permission denied',
  EISDIR: 'it is a directory',
};

async function readText(path: string, io: CliIo): Promise<string> {
  try {
    // Editors on Windows save UTF-8 with a byte-order mark, which JSON.parse refuses.
    return (await io.readFile(path)).replace(/^\uFEFF/, '');
  } catch (error) {
    const code = (error as { code?: string }).code;
    throw new InputError(`cannot read ${path}: ${(code && fileErrors[code]) ?? (error as Error).message}`);
  }
}

async function readJson(path: string, io: CliIo): Promise<unknown> {
  const text = await readText(path, io);
  try {
    return JSON.parse(text);
  } catch (error) {
    throw new InputError(`cannot read ${path}: ${withLine((error as Error).message, text)}`);
  }
}

/** JSON.parse says `at position 57`; a person editing the file wants the line and column. */
function withLine(message: string, text: string): string {
  return message.replace(/at position (\d+)/, (_, position: string) => {
    const before = text.slice(0, Number(position)).split('\n');
    return `at line ${before.length} column ${before[before.length - 1].length + 1}`;
  });
}

async function readAssignment(path: string, io: CliIo): Promise<Assignment> {
  const settings = await readJson(path, io);
  try {
    return parseAssignment(settings);
  } catch (error) {
    if (!(error instanceof SettingsError)) throw error;
    throw new InputError(`invalid assignment in ${path}: ${error.issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`);
  }
}

async function readCsvSubmissions(path: string, reportedPath: string | undefined, io: CliIo): Promise<unknown[]> {
  const readings = await readText(path, io);
  const reported = reportedPath === undefined ? undefined : await readText(reportedPath, io);
  const { submissions, rowErrors } = parseSubmissionsCsv(readings, reported);
  const [first] = rowErrors;
  if (first) {
    const file = first.file === 'readings' ? path : reportedPath;
    const more = rowErrors.length > 1 ? ` (and ${rowErrors.length - 1} more problems)` : '';
    throw new InputError(`cannot read ${file}: line ${first.row}: ${first.message}${more}`);
  }
  return submissions;
}

/** One row per submission, then each submission's findings (or reasons for rejection), one per line. */
function renderResults(results: CheckResult[]): string {
  const rows = results.map((r) => {
    const counts = severityCounts(r.findings);
    return [
      r.studentId ?? '(no id)',
      r.status === 'rejected' ? 'rejected' : `${points(r.score ?? 0)}/${points(r.maxScore)}`,
      String(counts.errors),
      String(counts.warnings),
      String(counts.infos),
      [...new Set(r.findings.map((f) => f.code))].join(', '),
    ];
  });
  const lines = alignColumns([['student', 'score', 'errors', 'warnings', 'info', 'codes'], ...rows]);
  for (const r of results) {
    const details = [
      ...r.findings.map((f) => [f.severity, f.path, f.message]),
      ...(r.rejected ?? []).map((x) => ['rejected', x.path, x.message]),
    ];
    if (details.length === 0) continue;
    lines.push('', r.studentId ?? '(no id)', ...alignColumns(details).map((line) => `  ${line}`));
  }
  return `${lines.join('\n')}\n`;
}

function points(value: number): string {
  return String(Number(value.toFixed(2)));
}

function alignColumns(rows: string[][]): string[] {
  const widths = rows[0].map((_, i) => Math.max(...rows.map((row) => row[i].length)));
  return rows.map((row) => row.map((cell, i) => cell.padEnd(widths[i])).join('  ').trimEnd());
}
