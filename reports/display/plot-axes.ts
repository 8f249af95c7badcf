import type { DisplayPlot } from '../../schemas/display.ts';
import { axisLabel, niceAxis, tickLabel, type AxisOptions } from '../pdf/scale.ts';

/**
 * A plot's axis for the page, ranged and ticked as the sheets' axes are: the page draws the ticks it
 * is sent and formats no number itself.
 */
export function displayAxis(label: string, values: number[], options: AxisOptions = {}): DisplayPlot['x'] {
  const axis = niceAxis(values, options);
  return { label: axisLabel(label, axis), min: axis.min, max: axis.max, ticks: axis.ticks.map((at) => ({ at, label: tickLabel(axis, at) })) };
}

const at = (line: { intercept: number; slope: number }, x: number) => line.intercept + line.slope * x;

/** Whether a line passes through the plotted area (else the page would show none of it). */
export function crosses(plot: Pick<DisplayPlot, 'x' | 'y'>, line: { intercept: number; slope: number }): boolean {
  const [a, b] = [at(line, plot.x.min), at(line, plot.x.max)];
  return Math.max(a, b) >= plot.y.min && Math.min(a, b) <= plot.y.max;
}

/** Whether a point lies on the plotted area. */
export const inside = (plot: Pick<DisplayPlot, 'x' | 'y'>, x: number, y: number) => x >= plot.x.min && x <= plot.x.max && y >= plot.y.min && y <= plot.y.max;
