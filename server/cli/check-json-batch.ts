import type { CheckResult } from '../../schemas/result.ts';
import { checkSettingsBatch } from '../checks/check-settings-batch.ts';
import { parseBatch, type JsonBatch } from './json-batches.ts';
import { tableEntry, type TableEntry } from './results-table.ts';

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

/** The per-reading arrays are most of a result's size and only a plot needs them. */
function withoutArrays(result: CheckResult): CheckResult {
  const refit = result.refit as { runs?: Array<Record<string, unknown>> } | null;
  if (!refit?.runs) return result;
  return { ...result, refit: { ...refit, runs: refit.runs.map(({ lnF: _lnF, ...run }) => run) } };
}

/** Parses one batch of a submissions file, checks it, and formats the results for output. */
export function checkJsonBatch(input: CheckJsonBatchInput): CheckedBatch {
  const submissions = parseBatch(input.batch, input.jsonLines);
  const checked = checkSettingsBatch({ settingsJson: input.settingsJson, submissions });
  return formatResults(checked.map((c) => c.result), submissions, input);
}

/** Results as the command prints them (or keeps them, for --out). */
export function formatResults(results: CheckResult[], submissions: unknown[], input: { output: ResultOutput; arrays: boolean }): CheckedBatch {
  switch (input.output) {
    case 'table':
      return { table: results.map(tableEntry) };
    case 'json':
      return { text: results.map((r) => `  ${JSON.stringify(r, null, 2).replaceAll('\n', '\n  ')}`).join(',\n') };
    case 'jsonl':
      return { text: results.map((r) => `${JSON.stringify(input.arrays ? r : withoutArrays(r))}\n`).join('') };
    case 'results':
      return { results, submissions };
  }
}
