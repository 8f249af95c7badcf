import type { Point, Submission } from '../schemas.ts';
import { fitLine } from '../../../server/engine/linear-fit.ts';
import { GAS_CONSTANT, LN_KB_OVER_H } from '../../../server/engine/physical-constants.ts';
import { ZERO_CELSIUS_K } from '../../../server/engine/temperature.ts';
import { gaussian } from '../../../server/demo/seeded-random.ts';
import { reportedValue } from '../../../server/demo/careful-rounding.ts';

/**
 * Seeded generator of invented submissions for the kind `temperature-dependence`, clean or with one
 * slip. Not measurements: E_a ~ U(50, 100) kJ/mol, A such that k at 25 °C lies between 1e-4 and
 * 1e-2 s^-1, six temperatures 15 to 40 °C (written in °C or K), each k with 1 to 3 % scatter and
 * written to 4 significant figures. The clean student fits ln k and ln(k/T) against 1/T by ordinary
 * least squares and reports E_a (its SE to 2 figures, E_a to the SE's last place), A, ΔH‡ and ΔS‡.
 */
export const temperatureSlips = ['temperature-scale', 'log-base', 'gas-constant', 'energy-unit', 'sign-flipped', 'reciprocal-scale', 'eyring-form', 'time-unit'] as const;
export type TemperatureSlip = (typeof temperatureSlips)[number];

/** Where the checker must name each slip first. */
export const slipPlace: Record<TemperatureSlip, string> = {
  'temperature-scale': 'reported.Ea',
  'log-base': 'reported.Ea',
  'gas-constant': 'reported.Ea',
  'energy-unit': 'reported.Ea',
  'sign-flipped': 'reported.Ea',
  'reciprocal-scale': 'reported.Ea',
  'eyring-form': 'reported.dH',
  'time-unit': 'reported.dS',
};

const CELSIUS = [15, 20, 25, 30, 35, 40];

export function temperatureSubmission(random: () => number, studentId: string, slip?: TemperatureSlip): Submission {
  const uniform = (low: number, high: number) => low + (high - low) * random();
  const Ea = uniform(50, 100) * 1000;
  const k298 = 10 ** uniform(-4, -2);
  const A = k298 * Math.exp(Ea / (GAS_CONSTANT * 298.15));
  const noise = uniform(0.01, 0.03);
  const inKelvin = random() < 0.5;
  // For the time-unit slip the rate constants are handed in per minute, as a timer in minutes gives them.
  const perMinute = slip === 'time-unit';
  const points: Point[] = CELSIUS.map((c) => {
    const k = A * Math.exp(-Ea / (GAS_CONSTANT * (c + ZERO_CELSIUS_K))) * (1 + noise * gaussian(random));
    return {
      label: `${c} °C`,
      temperature: inKelvin ? { value: c + ZERO_CELSIUS_K, unit: 'K' } : { value: c, unit: 'degC' },
      k: { value: Number((perMinute ? k * 60 : k).toPrecision(4)), unit: perMinute ? 'min^-1' : 's^-1' },
    };
  });

  // The student's own work, from the rate constants as written.
  const T = CELSIUS.map((c) => (slip === 'temperature-scale' ? c : c + ZERO_CELSIUS_K));
  const kPerSecond = points.map((p) => Number(p.k!.value) / (perMinute ? 60 : 1));
  const x = T.map((t) => (slip === 'reciprocal-scale' ? 1000 : 1) / t);
  const lnOf = slip === 'log-base' ? Math.log10 : Math.log;
  const R = slip === 'gas-constant' ? 1.987 : GAS_CONSTANT;
  const arrhenius = fitLine(x, kPerSecond.map((k) => lnOf(k)));
  // Eyring wants k per second: the time-unit slip takes them as written, per minute.
  const kEyring = slip === 'time-unit' ? points.map((p) => Number(p.k!.value)) : kPerSecond;
  const eyring = fitLine(x, slip === 'eyring-form' ? kEyring.map((k) => lnOf(k)) : kEyring.map((k, i) => lnOf(k / T[i])));
  const sign = slip === 'sign-flipped' ? -1 : 1;
  // Energies are computed in J/mol and written in kJ/mol; the energy-unit slip writes the joules.
  const kJ = slip === 'energy-unit' ? 1 : 1 / 1000;
  const reportedEa = -sign * arrhenius.slope * R;
  return {
    studentId,
    points,
    reported: {
      // Rounded as a careful student rounds: the SE to 2 figures, E_a to the SE's last place.
      Ea: reportedValue(reportedEa * kJ, arrhenius.seSlope * R * kJ, 'kJ mol^-1'),
      A: { value: Number(Math.exp(arrhenius.intercept).toPrecision(3)), unit: 's^-1' },
      dH: { value: Number((-sign * eyring.slope * R * kJ).toPrecision(4)), unit: 'kJ mol^-1' },
      dS: { value: Number((R * (eyring.intercept - LN_KB_OVER_H)).toPrecision(4)), unit: 'J K^-1 mol^-1' },
    },
  };
}
