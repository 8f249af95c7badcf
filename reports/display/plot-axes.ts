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

/**
 * The values an axis spans: the data's always, the student's only while within the data's span of
 * it, so that a value off by a factor of 60 does not flatten the data to a stripe.
 */
export function nearValues(data: number[], theirs: number[]): number[] {
  const finite = data.filter(Number.isFinite);
  const [low, high] = [Math.min(...finite), Math.max(...finite)];
  const span = high - low || 1;
  return [...finite, ...theirs.filter((y) => y > low - span && y < high + span)];
}

const at = (line: { intercept: number; slope: number }, x: number) => line.intercept + line.slope * x;

/** Whether a line passes through the plotted area (else the page would show none of it). */
export function crosses(plot: Pick<DisplayPlot, 'x' | 'y'>, line: { intercept: number; slope: number }): boolean {
  const [a, b] = [at(line, plot.x.min), at(line, plot.x.max)];
  return Math.max(a, b) >= plot.y.min && Math.min(a, b) <= plot.y.max;
}

/** Whether a point lies on the plotted area. */
export const inside = (plot: Pick<DisplayPlot, 'x' | 'y'>, x: number, y: number) => x >= plot.x.min && x <= plot.x.max && y >= plot.y.min && y <= plot.y.max;
