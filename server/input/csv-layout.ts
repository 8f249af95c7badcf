/**
 * How an experiment kind reads its submissions from CSV files: the file every upload has (`main`),
 * the files it may add, and the reading itself. A layout checks only the files' structure (columns,
 * field counts, agreement within a run); the kind's schema then validates every value.
 */
export interface CsvRowError {
  /** The file's field name, e.g. `readings`. */
  file: string;
  /** 1-based line in that file. */
  row: number;
  message: string;
}

export interface CsvSubmissions {
  submissions: unknown[];
  /** Where each submission starts: the 1-based line of its first row in the main file. */
  lines: number[];
  rowErrors: CsvRowError[];
}

export interface CsvLayout {
  main: string;
  optional: readonly string[];
  /** Text by field name in, submission-shaped plain objects out; no file I/O. */
  read(files: Readonly<Record<string, string>>): Promise<CsvSubmissions>;
}

/** What is wrong with a set of file names for this layout (none when they fit). */
export function layoutProblems(layout: CsvLayout, names: readonly string[]): Array<{ path: string; message: string }> {
  const known = [layout.main, ...layout.optional];
  const problems = names.filter((n) => !known.includes(n)).map((n) => ({ path: n, message: `expected a file field named ${known.join(' or ')}` }));
  if (!names.includes(layout.main)) problems.push({ path: layout.main, message: `a ${layout.main} file is required` });
  return problems;
}
