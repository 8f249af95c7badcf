import { ZERO_CELSIUS_K } from '../engine/temperature.ts';
import type { DraftFinding } from './draft-finding.ts';

/**
 * Kinetics in a teaching lab runs between a cold bath and a boiling one: 250 to 400 K (common
 * practice, no source). A temperature outside that, once read in its declared unit, is a slip of
 * entry; where reading it in the other unit puts it inside, that reading is what was probably meant.
 */
export const PLAUSIBLE_KELVIN = { min: 250, max: 400 } as const;

export type TemperatureUnit = 'K' | 'degC';

export interface ImplausibleTemperature {
  /** Kelvin as declared (may be at or below absolute zero). */
  asDeclared: number;
  /** Kelvin as probably meant, where reading the number in the other unit makes it plausible. */
  meant?: number;
  /** What was probably meant, in words, or why no reading is plausible. */
  says: string;
}

/** A temperature to the hundredth, as 273.15 is written: 4 figures would print 298.15 K as 298.1. */
export const inKelvin = (kelvin: number) => String(Number(kelvin.toFixed(2)));
const plausible = (kelvin: number) => kelvin >= PLAUSIBLE_KELVIN.min && kelvin <= PLAUSIBLE_KELVIN.max;

/** Undefined for a plausible temperature; else what it reads as and what was probably meant. */
export function implausibleTemperature(value: number, unit: TemperatureUnit): ImplausibleTemperature | undefined {
  const asDeclared = unit === 'K' ? value : value + ZERO_CELSIUS_K;
  if (plausible(asDeclared)) return undefined;
  const asOther = unit === 'K' ? value + ZERO_CELSIUS_K : value;
  if (plausible(asOther)) {
    const says = unit === 'K' ? `probably ${inKelvin(value)} °C was meant, which is ${inKelvin(asOther)} K` : `probably ${inKelvin(value)} K was meant (${inKelvin(value - ZERO_CELSIUS_K)} °C)`;
    return { asDeclared, meant: asOther, says };
  }
  return { asDeclared, says: 'neither kelvin nor degrees Celsius make it a temperature a kinetics run is done at' };
}

/** The warning (no points) that names an implausible temperature and what was probably meant. */
export function implausibleTemperatureDraft(found: ImplausibleTemperature, written: string, where: { path: string; stage: string; what: string; consequence: string }): DraftFinding {
  return {
    code: 'temperature-implausible',
    path: where.path,
    stage: where.stage,
    severity: 'warning',
    charge: 0,
    message:
      `The temperature of ${where.what} is written as ${written}, which is ${inKelvin(found.asDeclared)} K: outside ${PLAUSIBLE_KELVIN.min}-${PLAUSIBLE_KELVIN.max} K, ` +
      `where a kinetics run is done; ${found.says}. ${where.consequence} Please check the number and its unit.`,
  };
}
