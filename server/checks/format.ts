/** Numbers in messages: four significant figures, enough to compare, few enough to read. */
export function fmt(value: number | null | undefined): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return String(value);
  if (value === 0) return '0';
  const a = Math.abs(value);
  if (a >= 1e-3 && a < 1e5) return String(Number(value.toPrecision(4)));
  return value.toExponential(3);
}

export function withUnit(value: number | null | undefined, unit: string | undefined): string {
  return unit ? `${fmt(value)} ${unit}` : fmt(value);
}
