import type { Order, Refit, Settings, Submission } from '../schemas.ts';
import type { KindResult } from '../../../reports/feedback-input.ts';
import { convertUnit } from '../../../reports/units.ts';
import { lawK, refitOf, type EstimateValue } from './refit.ts';

/**
 * The section's orders and k: how many students' data name each order (or cannot tell) beside the
 * order each reported; and for each order the refit k of the students whose data name it, and the
 * reported k of those who reported it, in the order's unit. A reported k whose unit is not read there
 * is left out and counted.
 */
export interface ClassOrders {
  /** By order 0, 1, 2, then 'cannot tell'. */
  named: [number, number, number, number];
  reported: [number, number, number];
  /** Students whose reported order is the one their data name. */
  agreeing: number;
}

export interface ClassK {
  order: Order;
  unit: string;
  refit: number[];
  reported: number[];
  unreadable: number;
}

type Results = ReadonlyArray<KindResult<Refit>>;

/** What the summary keeps of a checked result: the order its data name, and each order's k as refitted. */
interface NamedOrder {
  studentId: string | null;
  order: Refit['order'];
  k: [EstimateValue | undefined, EstimateValue | undefined, EstimateValue | undefined];
}

/**
 * The class's orders and k gathered one result and one submission at a time, each reduced to what the
 * summary reads. A result is matched to the last submission given of its student; the matching waits
 * for the end, so results and submissions may come in any order.
 */
export class ClassTotals {
  private readonly named: NamedOrder[] = [];
  private readonly reported = new Map<string, Submission['reported']>();

  addResult(r: KindResult<Refit>): void {
    const refit = r.status === 'checked' ? refitOf(r) : undefined;
    if (refit) this.named.push({ studentId: r.studentId, order: refit.order, k: [lawK(refit.byOrder[0]), lawK(refit.byOrder[1]), lawK(refit.byOrder[2])] });
  }

  addSubmission(submission: Submission): void {
    this.reported.set(submission.studentId, submission.reported);
  }

  private checked(): Array<{ named: NamedOrder; reported?: Submission['reported'] }> {
    return this.named.map((named) => ({ named, reported: named.studentId === null ? undefined : this.reported.get(named.studentId) }));
  }

  orders(): ClassOrders {
    const counts: ClassOrders = { named: [0, 0, 0, 0], reported: [0, 0, 0], agreeing: 0 };
    for (const { named, reported } of this.checked()) {
      counts.named[named.order ?? 3] += 1;
      if (!reported) continue;
      counts.reported[reported.order] += 1;
      if (named.order === reported.order) counts.agreeing += 1;
    }
    return counts;
  }

  ks(): ClassK[] {
    const students = this.checked();
    return ([0, 1, 2] as const).flatMap((order) => {
      const unit = students.map((s) => s.named.k[order]?.unit).find((u) => u !== undefined);
      if (unit === undefined) return [];
      const values: ClassK = { order, unit, refit: [], reported: [], unreadable: 0 };
      for (const { named, reported } of students) {
        const ours = named.order === order ? named.k[order] : undefined;
        const inUnit = ours && convertUnit(ours.value, ours.unit, unit);
        if (inUnit !== undefined) values.refit.push(inUnit);
        const theirs = reported?.order === order ? reported.k : undefined;
        if (!theirs) continue;
        const read = convertUnit(Number(theirs.value), theirs.unit, unit);
        if (read === undefined) values.unreadable += 1;
        else values.reported.push(read);
      }
      return values.refit.length + values.reported.length + values.unreadable > 0 ? [values] : [];
    });
  }
}

function totalsOf(results: Results, submissions: readonly Submission[] | undefined): ClassTotals {
  const totals = new ClassTotals();
  for (const result of results) totals.addResult(result);
  for (const submission of submissions ?? []) totals.addSubmission(submission);
  return totals;
}

export function classOrders(results: Results, submissions: readonly Submission[] | undefined): ClassOrders {
  return totalsOf(results, submissions).orders();
}

export function classK(_settings: Settings, results: Results, submissions: readonly Submission[] | undefined): ClassK[] {
  return totalsOf(results, submissions).ks();
}
