import type { CheckResult } from '../../schemas/result.ts';
import { checkAndRead, type Assignment } from '../checks/check.ts';
import { assignmentOfJson } from './check-settings-batch.ts';
import { parseBatch, type JsonBatch } from './json-batches.ts';
import { tableEntry, type TableEntry } from '../../reports/results-table.ts';

/** How the command prints results: a table, a JSON array, or JSON Lines. */
export type ResultOutput = 'table' | 'json' | 'jsonl';

/** What a batch keeps beside its printed form, for the command's files (--out, --signals). */
export interface KeptParts {
  /** The results, and each submission as the kind's schema read it (undefined where it could not). */
  reads: boolean;
  /** The submissions as the file gave them. */
  submissions: boolean;
}

export interface CheckJsonBatchInput {
  settingsJson: string;
  batch: JsonBatch;
  jsonLines: boolean;
  output: ResultOutput;
  /** Keep the refit's per-reading arrays (ln F) in JSON Lines. */
  arrays: boolean;
  keep?: KeptParts;
}

export interface CheckedBatch {
  /** Submissions in the batch. */
  count: number;
  table?: TableEntry[];
  /** JSON: the results as array elements, indented as in the whole array; JSON Lines: one per line. */
  text?: string;
  /** With `keep`: every result, and with `keep.reads` each submission as read. */
  results?: CheckResult[];
  reads?: unknown[];
  submissions?: unknown[];
}

/** The per-reading arrays of a run's refit (whatever the kind calls them) are most of a result's size and only a plot needs them. */
export function withoutArrays(result: CheckResult): CheckResult {
  const refit = result.refit as { runs?: Array<Record<string, unknown>> } | null;
  if (!refit?.runs) return result;
  return { ...result, refit: { ...refit, runs: refit.runs.map(withoutArrayFields) } };
}

// A plain loop, not entries/filter/fromEntries: this runs for every line of `--jsonl`, and the three
// arrays per run it made were 3-4 % of the command's time in a profile. Key order stays the same.
function withoutArrayFields(run: Record<string, unknown>): Record<string, unknown> {
  const kept: Record<string, unknown> = {};
  for (const key in run) if (!Array.isArray(run[key])) kept[key] = run[key];
  return kept;
}

/**
 * Parses one batch of a submissions file, checks it, and formats the results for output. Each result
 * is formatted as soon as it is made, so that (unless it is kept) it is garbage while still young.
 */
export function checkJsonBatch(input: CheckJsonBatchInput): CheckedBatch {
  return checkSubmissions(assignmentOfJson(input.settingsJson), parseBatch(input.batch, input.jsonLines), input);
}

/** Checks submissions, each parsed once, and formats the results as printed (and keeps what `keep` asks for). */
export function checkSubmissions(assignment: Assignment, submissions: unknown[], input: { output: ResultOutput; arrays: boolean; keep?: KeptParts }): CheckedBatch {
  const format = formatterOf(input);
  const { keep } = input;
  const count = submissions.length;
  if (!keep) return { count, ...joined(input.output, submissions.map((s) => format(checkAndRead(assignment, s).result))) };
  const results: CheckResult[] = [];
  const reads: unknown[] = [];
  const printed = submissions.map((s) => {
    const { result, read } = checkAndRead(assignment, s);
    results.push(result);
    reads.push(read);
    return format(result);
  });
  return { count, ...joined(input.output, printed), results, ...(keep.reads ? { reads } : {}), ...(keep.submissions ? { submissions } : {}) };
}

type Formatted = TableEntry | string;

function formatterOf(input: { output: ResultOutput; arrays: boolean }): (r: CheckResult) => Formatted {
  switch (input.output) {
    case 'table':
      return tableEntry;
    case 'json':
      return (r) => `  ${JSON.stringify(r, null, 2).replaceAll('\n', '\n  ')}`;
    case 'jsonl':
      return (r) => `${JSON.stringify(input.arrays ? r : withoutArrays(r))}\n`;
  }
}

function joined(output: ResultOutput, items: Formatted[]): Pick<CheckedBatch, 'table' | 'text'> {
  if (output === 'table') return { table: items as TableEntry[] };
  return { text: (items as string[]).join(output === 'json' ? ',\n' : '') };
}
