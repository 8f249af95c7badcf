/**
 * F of a run's reading i, (x_i - x_last)/(x_0 - x_last): 1 at the first reading, 0 at the last, and
 * unchanged by an offset or a scale of the readings. Worked out where it is read rather than kept.
 */
export function fractionAt(x: ArrayLike<number>, i: number): number {
  const last = x[x.length - 1];
  return (x[i] - last) / (x[0] - last);
}
