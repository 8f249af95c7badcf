import type { Estimate } from '../../../schemas/result.ts';
import type { z } from 'zod';
import type { Order, OrderFit, Refit } from '../schemas.ts';

export type EstimateValue = z.infer<typeof Estimate>;

/**
 * The result's refit where it has this kind's shape (a refused result has none). Read, not parsed:
 * after JSON a standard error or an interval's end that was not finite is null, which the strict
 * schema would refuse, and the documents only need to print a dash for it.
 */
export function refitOf(result: { refit: unknown }): Refit | undefined {
  const refit = result.refit as Partial<Refit> | null;
  return refit && Array.isArray(refit.byOrder) && Array.isArray(refit.runs) && typeof refit.gradedOrder === 'number' ? (refit as Refit) : undefined;
}

/** A law's k: from its fit to the concentrations where there is one, else from its straight line. */
export function lawK(fit: OrderFit | undefined): EstimateValue | undefined {
  return fit?.nonlinear?.k ?? fit?.linear?.k ?? undefined;
}

/** The k the student's k was graded against: the graded order's, in the student's unit where the checker converted it. */
export function gradedK(refit: Refit): EstimateValue | undefined {
  return refit.kDeclared ?? lawK(refit.byOrder[refit.gradedOrder]);
}

/** The unit of an order's k in the instructor's units (M^(1−n) per time unit), as the refit writes it. */
export function kUnitOfOrder(refit: Refit, order: Order): string | undefined {
  return lawK(refit.byOrder[order])?.unit;
}

/** A standard error that survived JSON, or undefined. */
export const finiteOrUndefined = (value: number | null | undefined): number | undefined => (typeof value === 'number' && Number.isFinite(value) ? value : undefined);
