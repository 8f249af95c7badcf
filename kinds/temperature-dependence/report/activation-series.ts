import type { Refit, Submission } from '../schemas.ts';
import { GAS_CONSTANT, LN_KB_OVER_H } from '../../../server/engine/physical-constants.ts';
import type { Line } from '../../../reports/feedback/plot-lines.ts';
import { convertUnit } from '../../../reports/units.ts';

/**
 * What the sheet's Arrhenius and Eyring plots show, against x = 1000 K / T: the refitted points, our
 * line and the student's line from their reported values. Arrhenius: ln(k / s⁻¹) = ln A − E_a/(R T),
 * so the slope is −E_a/(1000 R). Eyring: ln(k/T) = ln(k_B/h) + ΔS‡/R − ΔH‡/(R T), k per second.
 */
export interface ActivationSeries {
  points: Array<{ x: number; y: number }>;
  ourLine: Line;
  theirLine?: Line;
  /** Why the student's line is missing. */
  note?: string;
}

type Reported = NonNullable<Submission['reported']>;
const value = (v: Reported['Ea']) => (v === undefined ? NaN : Number(v.value));

function theirs(line: () => Line | undefined, given: boolean, names: string): Pick<ActivationSeries, 'theirLine' | 'note'> {
  if (!given) return { note: `Your line is not drawn: ${names} not reported.` };
  const theirLine = line();
  return theirLine && Number.isFinite(theirLine.intercept) && Number.isFinite(theirLine.slope) ? { theirLine } : { note: `Your line is not drawn: the value or unit of ${names} could not be read here.` };
}

export function arrheniusSeries(refit: Refit, reported: Submission['reported']): ActivationSeries | undefined {
  const lnA = Math.log(convertUnit(refit.A.value, refit.A.unit, 's^-1') ?? NaN);
  const Ea = convertUnit(refit.Ea.value, refit.Ea.unit, 'J mol^-1');
  if (!Number.isFinite(lnA) || Ea === undefined) return undefined;
  const line = (ea: number, a: number): Line => ({ intercept: Math.log(a), slope: -ea / (1000 * GAS_CONSTANT) });
  return {
    points: refit.points.map((p) => ({ x: 1000 / p.temperatureK, y: Math.log(p.kPerSecond) })),
    ourLine: line(Ea, Math.exp(lnA)),
    ...theirs(
      () => {
        const ea = convertUnit(value(reported!.Ea), reported!.Ea!.unit, 'J mol^-1');
        const a = convertUnit(value(reported!.A), reported!.A!.unit, 's^-1');
        return ea === undefined || a === undefined || !(a > 0) ? undefined : line(ea, a);
      },
      reported?.Ea !== undefined && reported?.A !== undefined,
      'E_{a} or A',
    ),
  };
}

export function eyringSeries(refit: Refit, reported: Submission['reported']): ActivationSeries | undefined {
  const dH = convertUnit(refit.dH.value, refit.dH.unit, 'J mol^-1');
  const dS = convertUnit(refit.dS.value, refit.dS.unit, 'J K^-1 mol^-1');
  if (dH === undefined || dS === undefined) return undefined;
  const line = (h: number, s: number): Line => ({ intercept: LN_KB_OVER_H + s / GAS_CONSTANT, slope: -h / (1000 * GAS_CONSTANT) });
  return {
    points: refit.points.map((p) => ({ x: 1000 / p.temperatureK, y: Math.log(p.kPerSecond / p.temperatureK) })),
    ourLine: line(dH, dS),
    ...theirs(
      () => {
        const h = convertUnit(value(reported!.dH), reported!.dH!.unit, 'J mol^-1');
        const s = convertUnit(value(reported!.dS), reported!.dS!.unit, 'J K^-1 mol^-1');
        return h === undefined || s === undefined ? undefined : line(h, s);
      },
      reported?.dH !== undefined && reported?.dS !== undefined,
      'ΔH‡ or ΔS‡',
    ),
  };
}
