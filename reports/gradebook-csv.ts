import type { CheckResult } from '../schemas/result.ts';
import { causeCounts, mainErrorCodes } from './result-summary.ts';

/**
 * The section's gradebook as CSV: one row per result, then one per roster student who has not
 * submitted (status `not-submitted`, or `withdrawn`; no score), so that no student drops out of a
 * gradebook silently. A withdrawn student who submitted has status `withdrawn` too, with the score
 * and counts of their work kept: it was graded before they left, and what becomes of it is the
 * instructor's decision, which a blank cell would take away. A student whose latest version is late
 * and held until a TA accepts it has status `held`, its score kept: it is not final, and a TA must see
 * it to accept it.
 *
 * Columns: student_id, score, max_score, status, causes_costing_points, warnings, infos (the three
 * counted as the feedback sheet and the results page count them, `causeCounts`: one per likely cause,
 * so a slip repeated in four values and charged once counts 1; warnings and infos are those that cost
 * nothing, values that merely follow from the student's own numbers among the infos), main_codes (the
 * codes of the errors that cost points, most costly first, `;`-joined), assignment (its title, the same on
 * every row, so that gradebooks pasted together still say which is which; last, so that the columns
 * before it stay where they were). A rejected result has an empty score.
 *
 * - RFC 4180: fields with a comma, a double quote, CR or LF are quoted, quotes doubled; lines end CRLF.
 * - UTF-8; with `bom: true` a byte-order mark first, which Excel needs to read UTF-8.
 * - Formula injection: a spreadsheet runs a cell that starts with `=`, `+`, `-`, `@`, tab or CR as a
 *   formula. Every text cell (student_id, status, main_codes, assignment) that starts with one of them gets a
 *   leading `'`, which spreadsheets show as text. Number cells are written by us from numbers and are
 *   never prefixed: a negative number stays a number (-2 is data, not a formula). No cell of ours is
 *   negative today, but a prefixed number would stop being one in every spreadsheet.
 */
export interface GradebookOptions {
  /** The assignment's title, written on every row. */
  assignment: string;
  bom?: boolean;
  /** Roster students with no submission, and whether each has withdrawn. */
  notSubmitted?: ReadonlyArray<{ studentId: string; withdrawn: boolean }>;
  /** Students who submitted and have since withdrawn. */
  withdrawn?: ReadonlySet<string>;
  /** Students whose latest version is late and held until a TA accepts it. */
  held?: ReadonlySet<string>;
}

export const GRADEBOOK_COLUMNS = ['student_id', 'score', 'max_score', 'status', 'causes_costing_points', 'warnings', 'infos', 'main_codes', 'assignment'] as const;

const FORMULA_START = /^[=+\-@\t\r]/;

/** A text cell made safe to open in a spreadsheet. */
export function neutraliseText(text: string): string {
  return FORMULA_START.test(text) ? `'${text}` : text;
}

/** RFC 4180 quoting. */
function quote(field: string): string {
  return /[",\r\n]/.test(field) ? `"${field.replace(/"/g, '""')}"` : field;
}

type Cell = { text: string } | { number: number | null };

function cellText(cell: Cell): string {
  if ('text' in cell) return quote(neutraliseText(cell.text));
  // Numbers as the shortest round-trip text, at most 2 decimals for points.
  return cell.number === null ? '' : String(Number(cell.number.toFixed(2)));
}

type Marked = Pick<GradebookOptions, 'withdrawn' | 'held'>;

// Withdrawn first: what becomes of a withdrawn student's work is decided apart from any late hold.
function statusOf(result: CheckResult, { withdrawn, held }: Marked): string {
  if (result.studentId !== null && withdrawn?.has(result.studentId)) return 'withdrawn';
  if (result.studentId !== null && held?.has(result.studentId)) return 'held';
  return result.status;
}

function row(result: CheckResult, marked: Marked): Cell[] {
  const counts = causeCounts(result.findings);
  return [
    { text: result.studentId ?? '' },
    { number: result.status === 'checked' ? result.score : null },
    { number: result.maxScore },
    { text: statusOf(result, marked) },
    { number: counts.costingPoints },
    { number: counts.warnings },
    { number: counts.notes },
    { text: mainErrorCodes(result.findings).join(';') },
  ];
}

function notSubmittedRow(student: { studentId: string; withdrawn: boolean }): Cell[] {
  const status = student.withdrawn ? 'withdrawn' : 'not-submitted';
  return [{ text: student.studentId }, { number: null }, { number: null }, { text: status }, { number: 0 }, { number: 0 }, { number: 0 }, { text: '' }];
}

/**
 * The gradebook made one result at a time, each row's text kept as it comes (some 80 characters a
 * student), so that a long file's results need not all be held until it is written.
 */
export class GradebookRows {
  private readonly lines: string[] = [GRADEBOOK_COLUMNS.join(',')];
  private readonly assignment: Cell;

  constructor(private readonly options: GradebookOptions) {
    this.assignment = { text: options.assignment };
  }

  add(result: CheckResult): void {
    this.lines.push(this.line(row(result, this.options)));
  }

  /** The whole file: the rows so far, then the roster students without a submission. */
  text(): string {
    const lines = [...this.lines, ...(this.options.notSubmitted ?? []).map((student) => this.line(notSubmittedRow(student)))];
    return `${this.options.bom ? '\uFEFF' : ''}${lines.join('\r\n')}\r\n`;
  }

  private line(cells: Cell[]): string {
    return [...cells, this.assignment].map(cellText).join(',');
  }
}

export function gradebookCsv(results: readonly CheckResult[], options: GradebookOptions): string {
  const rows = new GradebookRows(options);
  for (const result of results) rows.add(result);
  return rows.text();
}
