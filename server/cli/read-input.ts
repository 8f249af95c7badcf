import type { Assignment } from '../checks/check.ts';
import type { ExperimentKind } from '../checks/experiment-kind.ts';
import { SettingsError } from '../checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { fileErrorReason, InputError } from './cli-errors.ts';
import { filePosition } from '../input/json-position.ts';
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

/**
 * Submissions from CSV files by the kind's layout: the positional file is its main file, `--reported`
 * names the optional file of that name.
 */
export async function readCsvSubmissions(kind: ExperimentKind, path: string, reportedPath: string | undefined, io: CliIo): Promise<unknown[]> {
  const layout = kind.csvLayout;
  if (!layout) throw new InputError(`the kind ${kind.kind} has no CSV layout: give the submissions as JSON`);
  const paths: Record<string, string> = { [layout.main]: path };
  if (reportedPath !== undefined) {
    if (!layout.optional.includes('reported')) throw new InputError(`the kind ${kind.kind} reads no reported-values file`);
    paths.reported = reportedPath;
  }
  const files: Record<string, string> = {};
  for (const [name, file] of Object.entries(paths)) files[name] = await readText(file, io);
  const { submissions, rowErrors } = await layout.read(files);
  const [first] = rowErrors;
  if (first) {
    const more = rowErrors.length > 1 ? ` (and ${rowErrors.length - 1} more problems)` : '';
    throw new InputError(`cannot read ${paths[first.file] ?? first.file}: line ${first.row}: ${first.message}${more}`);
  }
  return submissions;
}
