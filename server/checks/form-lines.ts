/**
 * The words of a form check: what was read from a submission, in plain lines, the same way in every
 * kind. Counts and lists only: never a grade, a finding or a judgement on a value.
 */

/** `a`, `a and b`, `a, b and c`. */
export function wordList(words: readonly string[]): string {
  return words.length <= 1 ? (words[0] ?? '') : `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`;
}

/** `1 run`, `3 runs`. */
export function counted(n: number, one: string, many = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
}

/**
 * Units read and the readings in each: `4 runs read, 16 readings each`, `3 runs read: 16, 15 and 16
 * readings`, `1 run read, 7 readings`.
 */
export function readingsLine(readings: readonly number[], unit = 'run'): string {
  const read = `${counted(readings.length, unit)} read`;
  if (readings.length === 0) return read;
  if (readings.length === 1) return `${read}, ${counted(readings[0], 'reading')}`;
  if (readings.every((n) => n === readings[0])) return `${read}, ${readings[0]} readings each`;
  return `${read}: ${wordList(readings.map(String))} readings`;
}

const unitsNumbered = (unit: string, positions: readonly number[]) => `${positions.length === 1 ? unit : `${unit}s`} ${wordList(positions.map((i) => String(i + 1)))}`;

/**
 * A value each unit (run, temperature) may carry, by position from 1: `k reported for every run`,
 * `k missing for run 3`, `k missing for runs 1 and 3`, `k not reported for any run`. `null`: the
 * value does not apply to that unit (the error of a k not given), which the line then leaves out:
 * `the standard error of k reported for runs 1, 2 and 4`.
 */
export function perUnitLine(name: string, present: ReadonlyArray<boolean | null>, unit = 'run', verb = 'reported'): string {
  const applies = present.flatMap((p, i) => (p === null ? [] : [i]));
  const missing = applies.filter((i) => !present[i]);
  const all = applies.length === present.length;
  if (missing.length === 0) return all ? `${name} ${verb} for ${present.length === 1 ? `the ${unit}` : `every ${unit}`}` : `${name} ${verb} for ${unitsNumbered(unit, applies)}`;
  if (missing.length === applies.length) return `${name} not ${verb} for any ${unit}`;
  return `${name} missing for ${unitsNumbered(unit, missing)}`;
}

/** A reported value as a form holds it: absent, or present with or without its uncertainty. */
export interface FormValue {
  name: string;
  value?: { uncertainty?: unknown } | undefined;
}

/**
 * Values reported once for the whole submission: `k_N and k_A reported with standard errors`, `k_N
 * and k_A reported`, `not reported: k_A, the standard error of k_N`. Values marked `optional` are
 * named only when given.
 */
export function reportedLines(values: ReadonlyArray<FormValue & { optional?: boolean }>): string[] {
  const given = values.filter((v) => v.value !== undefined);
  const lines: string[] = [];
  if (given.length > 0) {
    const withErrors = given.every((v) => v.value?.uncertainty !== undefined);
    const errors = !withErrors ? '' : given.length === 1 ? ' with its standard error' : ' with standard errors';
    lines.push(`${wordList(given.map((v) => v.name))} reported${errors}`);
  }
  const withoutError = given.filter((v) => v.value?.uncertainty === undefined).map((v) => v.name);
  const missing = values.filter((v) => v.value === undefined && !v.optional).map((v) => v.name);
  if (withoutError.length > 0) missing.push(`the standard ${withoutError.length === 1 ? 'error' : 'errors'} of ${wordList(withoutError)}`);
  if (missing.length > 0) lines.push(`not reported: ${wordList(missing)}`);
  return lines;
}
