import type { Assignment } from '../checks/check.ts';
import { parseAssignment, SettingsError } from '../checks/check.ts';
import { fileErrorReason, InputError } from './cli-errors.ts';
import { filePosition } from './json-batches.ts';
import type { CliIo } from './cli-io.ts';

export async function readText(path: string, io: CliIo): Promise<string> {
  try {
    // Editors on Windows save UTF-8 with a byte-order mark, which JSON.parse refuses.
    return (await io.readFile(path)).replace(/^\uFEFF/, '');
  } catch (error) {
    throw new InputError(`cannot read ${path}: ${fileErrorReason(error)}`);
  }
}

export async function readJson(path: string, io: CliIo): Promise<unknown> {
  const text = await readText(path, io);
  try {
    return JSON.parse(text);
  } catch (error) {
    throw new InputError(`cannot read ${path}: ${filePosition((error as Error).message, text)}`);
  }
}

export async function readAssignment(path: string, io: CliIo): Promise<Assignment> {
  const settings = await readJson(path, io);
  try {
    return parseAssignment(settings);
  } catch (error) {
    if (!(error instanceof SettingsError)) throw error;
    throw new InputError(`invalid assignment in ${path}: ${error.issues.map((i) => `${i.path}: ${i.message}`).join('; ')}`);
  }
}

export async function readCsvSubmissions(path: string, reportedPath: string | undefined, io: CliIo): Promise<unknown[]> {
  const { parseSubmissionsCsv } = await import('../input/csv-submissions.ts');
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
