import type { ReportedValue } from '../../schemas/common.ts';

// How a careful student rounds what they report; the generators of every kind round the same way.

/** To `figures` significant figures, as the shortest JSON number. */
export const toFigures = (value: number, figures: number): number => Number(value.toPrecision(figures));
/** To `places` decimals; an integer over a power of ten prints as exactly those digits. */
export const toPlaces = (value: number, places: number): number => Math.round(value * 10 ** places) / 10 ** places;
/** Decimal places that show `figures` significant figures of `value` (0.0000234, 2 -> 6). */
export function placesFor(value: number, figures: number): number {
  // From the rounded value, so that 0.0000996 to 2 figures (0.00010) counts its places from 1e-4.
  return figures - 1 - Math.floor(Math.log10(Math.abs(toFigures(value, figures))));
}

/** A careful student's rounding: the uncertainty to 2 significant figures, the value to its last place. */
export function reportedValue(value: number, uncertainty: number, unit: string): ReportedValue {
  return { value: toPlaces(value, placesFor(uncertainty, 2)), uncertainty: toFigures(uncertainty, 2), unit };
}
