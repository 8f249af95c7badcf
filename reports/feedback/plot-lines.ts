import type { LineStyle } from '../pdf/plot.ts';
import { COLOR } from '../pdf/theme.ts';

/** A straight line on a plot, in the plot's units: ours (the refit) or the student's. */
export interface Line {
  intercept: number;
  slope: number;
}

export const OUR_LINE: LineStyle = { color: COLOR.accent, width: 1.2 };
export const THEIR_LINE: LineStyle = { color: COLOR.student, width: 1.2, dash: [4, 2.5] };
