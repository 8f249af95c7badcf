import type { Order } from '../schemas.ts';

/**
 * The three integrated rate laws as the documents draw them, with k defined by −d[A]/dt = k[A]^n:
 * order 0, [A] = [A]_0 − k t; order 1, ln [A] = ln [A]_0 − k t; order 2, 1/[A] = 1/[A]_0 + k t.
 * `slope` is the sign k has as the straight line's slope; `y` turns [A] in M into the line's y
 * (undefined where the law's form has no value: ln and 1/x of a concentration at or below zero).
 */
export interface LawWords {
  order: Order;
  /** What is plotted against t, in markup. */
  plotted: string;
  yLabel: string;
  slope: 1 | -1;
  y(concentration: number): number | undefined;
  /** The half-life formula, in markup. */
  halfLife: string;
}

const positive = (f: (c: number) => number) => (c: number) => (c > 0 ? f(c) : undefined);

export const LAWS: Record<Order, LawWords> = {
  0: { order: 0, plotted: '[A]', yLabel: '[A] / M', slope: -1, y: (c) => c, halfLife: '[A]_{0}/(2k)' },
  1: { order: 1, plotted: 'ln [A]', yLabel: 'ln([A] / M)', slope: -1, y: positive(Math.log), halfLife: 'ln 2/k' },
  2: { order: 2, plotted: '1/[A]', yLabel: '1/[A] / M⁻¹', slope: 1, y: positive((c) => 1 / c), halfLife: '1/(k[A]_{0})' },
};

/** The plot's title: `Order 1: ln [A] against t`. */
export const lawTitle = (order: Order): string => `Order ${order}: ${LAWS[order].plotted} against t`;
