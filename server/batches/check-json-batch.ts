import type { CheckResult } from '../../schemas/result.ts';
import { checkAndRead } from '../checks/check.ts';
import { assignmentOfJson } from './check-settings-batch.ts';
import { parseBatch, type JsonBatch } from './json-batches.ts';
import { tableEntry, type TableEntry } from '../../reports/results-table.ts';

/** How the command prints results: a table, a JSON array, JSON Lines, or the results themselves (for --out). */
export type ResultOutput = 'table' | 'json' | 'jsonl' | 'results';

export interface CheckJsonBatchInput {
  settingsJson: string;
  batch: JsonBatch;
  jsonLines: boolean;
  output: ResultOutput;
  /** Keep the refit's per-reading arrays (ln F) in JSON Lines. */
  arrays: boolean;
}

export interface CheckedBatch {
  table?: TableEntry[];
  /** JSON: the results as array elements, indented as in the whole array; JSON Lines: one per line. */
  text?: string;
  results?: CheckResult[];
  submissions?: unknown[];
}

/** The per-reading arrays of a run's refit (whatever the kind calls them) are most of a result's size and only a plot needs them. */
function withoutArrays(result: CheckResult): CheckResult {
  const refit = result.refit as { runs?: Array<Record<string, unknown>> } | null;
  if (!refit?.runs) return result;
  return { ...result, refit: { ...refit, runs: refit.runs.map((run) => Object.fromEntries(Object.entries(run).filter(([, value]) => !Array.isArray(value)))) } };
}

/**
 * Parses one batch of a submissions file, checks it, and formats the results for output. Each result
 * is formatted as soon as it is made, so that (unless --out keeps them) it is garbage while still young.
 */
export function checkJsonBatch(input: CheckJsonBatchInput): CheckedBatch {
  const submissions = parseBatch(input.batch, input.jsonLines);
  const assignment = assignmentOfJson(input.settingsJson);
  const check = (submission: unknown) => checkAndRead(assignment, submission).result;
  const { output, arrays } = input;
  if (output === 'results') return { results: submissions.map(check), submissions };
  const format = formatterOf({ output, arrays });
  return joined(output, submissions.map((s) => format(check(s))));
}

type Formatted = TableEntry | string;

function formatterOf(input: { output: Exclude<ResultOutput, 'results'>; arrays: boolean }): (r: CheckResult) => Formatted {
  switch (input.output) {
    case 'table':
      return tableEntry;
    case 'json':
      return (r) => `  ${JSON.stringify(r, null, 2).replaceAll('\n', '\n  ')}`;
    case 'jsonl':
      return (r) => `${JSON.stringify(input.arrays ? r : withoutArrays(r))}\n`;
  }
}

function joined(output: Exclude<ResultOutput, 'results'>, items: Formatted[]): CheckedBatch {
  if (output === 'table') return { table: items as TableEntry[] };
  return { text: (items as string[]).join(output === 'json' ? ',\n' : '') };
}

/** Results as the command prints them (or keeps them, for --out). */
export function formatResults(results: CheckResult[], submissions: unknown[], input: { output: ResultOutput; arrays: boolean }): CheckedBatch {
  if (input.output === 'results') return { results, submissions };
  return joined(input.output, results.map(formatterOf({ output: input.output, arrays: input.arrays })));
}
