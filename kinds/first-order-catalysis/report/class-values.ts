import type { Refit, Settings, Submission } from '../schemas.ts';
import type { CheckResult } from '../../../schemas/result.ts';
import type { KindResult } from '../../../reports/feedback-input.ts';
import { readRefit } from './refit.ts';
import { convertUnit } from '../../../reports/units.ts';

/**
 * The section's k_N and k_A, in the instructor's units: our refit of each student's data, and (when
 * the submissions are given) the values the students reported. A reported value whose unit is not
 * read here is left out and counted.
 */
export interface ClassValues {
  quantity: 'kN' | 'kA' | 'K';
  /** What one mark stands for: a student, or (for K) one run of a student. */
  per?: string;
  unit: string;
  refit: number[];
  reported: number[];
  /** Reported values left out because their unit could not be read. */
  unreadable: number;
  band?: { min: number; max: number };
}

const QUANTITIES = ['kN', 'kA'] as const;

/** A reported value as the summary reads it: converted, or not readable in the unit asked for. */
type Read = { value: number } | 'unreadable';

/** What the summary keeps of a checked result: its refit's k_N and k_A in the instructor's units, and each run's K. */
interface CheckedValues {
  studentId: string | null;
  kN: number | undefined;
  kA: number | undefined;
  K: number[];
}

/** What it keeps of a submission: the reported k_N and k_A, converted, and each run's reported K. */
interface ReportedValues {
  kN: Read | undefined;
  kA: Read | undefined;
  K: Read[];
}

/**
 * The class's values gathered one result and one submission at a time, each reduced to the numbers the
 * summary draws. A result is matched to the first submission given of its student, as the summary
 * reads them; the matching waits for the end, so results and submissions may come in any order.
 */
export class ClassTotals {
  private readonly checked: CheckedValues[] = [];
  private readonly reported = new Map<string, ReportedValues>();

  constructor(private readonly settings: Settings) {}

  addResult(result: KindResult<Refit> | CheckResult): void {
    if (result.status !== 'checked') return;
    const refit = readRefit(result as CheckResult);
    const inUnit = (quantity: (typeof QUANTITIES)[number]) => {
      const estimate = refit?.[quantity];
      return estimate && convertUnit(estimate.value, estimate.unit, this.settings.units[quantity]);
    };
    const K: number[] = [];
    for (const run of refit?.equilibrium?.runs ?? []) if (run?.K) K.push(run.K.value);
    this.checked.push({ studentId: result.studentId, kN: inUnit('kN'), kA: inUnit('kA'), K });
  }

  addSubmission(submission: Submission): void {
    if (this.reported.has(submission.studentId)) return;
    const inUnit = (quantity: (typeof QUANTITIES)[number]): Read | undefined => {
      const reported = submission.reported?.[quantity];
      if (!reported) return undefined;
      const theirs = convertUnit(Number(reported.value), reported.unit, this.settings.units[quantity]);
      return theirs === undefined ? 'unreadable' : { value: theirs };
    };
    const K: Read[] = [];
    for (const run of submission.runs ?? []) {
      const reported = run.reported?.K;
      if (!reported) continue;
      const value = Number(reported.value);
      K.push(Number.isFinite(value) ? { value } : 'unreadable');
    }
    this.reported.set(submission.studentId, { kN: inUnit('kN'), kA: inUnit('kA'), K });
  }

  /** k_N and k_A, refitted and reported, each against its reference band. */
  values(): ClassValues[] {
    const { settings } = this;
    return QUANTITIES.map((quantity) => {
      const unit = settings.units[quantity];
      const values: ClassValues = { quantity, unit, refit: [], reported: [], unreadable: 0 };
      for (const checked of this.checked) {
        const ours = checked[quantity];
        if (ours !== undefined) values.refit.push(ours);
        const theirs = checked.studentId === null ? undefined : this.reported.get(checked.studentId)?.[quantity];
        if (theirs === 'unreadable') values.unreadable += 1;
        else if (theirs) values.reported.push(theirs.value);
      }
      const band = settings.reference?.[quantity];
      if (band) {
        const min = convertUnit(band.min, band.unit, unit);
        const max = convertUnit(band.max, band.unit, unit);
        if (min !== undefined && max !== undefined) values.band = { min: Math.min(min, max), max: Math.max(min, max) };
      }
      return values;
    });
  }

  /** K run by run: each checked result's refit, and each run's K as its student reported it. */
  constants(): ClassValues {
    const values: ClassValues = { quantity: 'K', per: 'run', unit: '', refit: [], reported: [], unreadable: 0 };
    for (const checked of this.checked) {
      for (const K of checked.K) values.refit.push(K);
      const theirs = checked.studentId === null ? undefined : this.reported.get(checked.studentId);
      for (const K of theirs?.K ?? []) {
        if (K === 'unreadable') values.unreadable += 1;
        else values.reported.push(K.value);
      }
    }
    return values;
  }
}

function totalsOf(settings: Settings, results: readonly CheckResult[], submissions: readonly Submission[] | undefined): ClassTotals {
  const totals = new ClassTotals(settings);
  for (const result of results) totals.addResult(result);
  for (const submission of submissions ?? []) totals.addSubmission(submission);
  return totals;
}

export function classValues(settings: Settings, results: readonly CheckResult[], submissions: readonly Submission[] | undefined): ClassValues[] {
  return totalsOf(settings, results, submissions).values();
}
