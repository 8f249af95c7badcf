import type { Order, Refit, Settings, Submission } from '../schemas.ts';
import type { KindResult } from '../../../reports/feedback-input.ts';
import { convertUnit } from '../../../reports/units.ts';
import { kUnitOfOrder, lawK, refitOf } from './refit.ts';

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

function checked(results: Results, submissions: readonly Submission[] | undefined): Array<{ refit: Refit; submission?: Submission }> {
  const byId = new Map((submissions ?? []).map((s) => [s.studentId, s] as const));
  return results.flatMap((r) => {
    const refit = r.status === 'checked' ? refitOf(r) : undefined;
    return refit ? [{ refit, submission: r.studentId === null ? undefined : byId.get(r.studentId) }] : [];
  });
}

export function classOrders(results: Results, submissions: readonly Submission[] | undefined): ClassOrders {
  const counts: ClassOrders = { named: [0, 0, 0, 0], reported: [0, 0, 0], agreeing: 0 };
  for (const { refit, submission } of checked(results, submissions)) {
    counts.named[refit.order ?? 3] += 1;
    if (!submission) continue;
    counts.reported[submission.reported.order] += 1;
    if (refit.order === submission.reported.order) counts.agreeing += 1;
  }
  return counts;
}

export function classK(settings: Settings, results: Results, submissions: readonly Submission[] | undefined): ClassK[] {
  const students = checked(results, submissions);
  return ([0, 1, 2] as const).flatMap((order) => {
    const unit = students.map((s) => kUnitOfOrder(s.refit, order)).find((u) => u !== undefined);
    if (unit === undefined) return [];
    const values: ClassK = { order, unit, refit: [], reported: [], unreadable: 0 };
    for (const { refit, submission } of students) {
      const ours = refit.order === order ? lawK(refit.byOrder[order]) : undefined;
      const inUnit = ours && convertUnit(ours.value, ours.unit, unit);
      if (inUnit !== undefined) values.refit.push(inUnit);
      const theirs = submission?.reported.order === order ? submission.reported.k : undefined;
      if (!theirs) continue;
      const read = convertUnit(Number(theirs.value), theirs.unit, unit);
      if (read === undefined) values.unreadable += 1;
      else values.reported.push(read);
    }
    return values.refit.length + values.reported.length + values.unreadable > 0 ? [values] : [];
  });
}
