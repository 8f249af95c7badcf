import type { ReportedValue } from '../../../schemas/common.ts';
import type { Estimate } from '../../../schemas/result.ts';
import type { EquilibriumRefit, Settings, Submission } from '../schemas.ts';
import type { z } from 'zod';
import { formatEstimate, formatNumber, formatPercent, formatReported, formatTolerance, prettyUnit, relativeDifference } from '../../../reports/format.ts';
import { runLabel } from './paths.ts';
import type { ValueRow } from './values-table.ts';

type EstimateValue = z.infer<typeof Estimate>;
type Block = NonNullable<Settings['equilibrium']>;

/** A fraction's reported value as a fraction (a declared percentage divided by 100), for the difference. */
function asFraction(reported: ReportedValue): number {
  return /^\s*(%|percent)\s*$/i.test(reported.unit) ? Number(reported.value) / 100 : Number(reported.value);
}

function row(quantity: string, run: string, reported: ReportedValue | undefined, ours: EstimateValue | undefined, tolerance: Parameters<typeof formatTolerance>[0], read = (r: ReportedValue) => Number(r.value)): ValueRow {
  const unit = ours?.unit === '1' ? '' : (ours?.unit ?? '');
  const written = reported ? `${formatReported(reported.value)}${reported.unit.trim() && reported.unit.trim() !== unit ? ` ${prettyUnit(reported.unit)}` : ''}` : '—';
  return {
    quantity,
    run,
    reported: written,
    refit: ours ? formatEstimate(ours.value, ours.standardError) : 'not computed',
    unit: prettyUnit(unit),
    difference: reported && ours ? formatPercent(relativeDifference(read(reported), ours.value)) : '—',
    tolerance: formatTolerance(tolerance),
  };
}

/**
 * Per run [α]_eq, x_B, K, k_f and k_r, then the mean K and k_N, k_A split: reported against our
 * refit, with the block's tolerances. A run without x_inf has no composition and no row.
 */
export function equilibriumRows(block: Block, submission: Submission, refit: EquilibriumRefit): ValueRow[] {
  const t = block.tolerances;
  const rows = refit.runs.flatMap((ours, i) => {
    if (!ours) return [];
    const run = runLabel(submission, i).replace(/^Run /, '');
    const reported = submission.runs[i]?.reported;
    return [
      row('[α]_{eq}', run, reported?.specificRotation, ours.specificRotation, t.specificRotation),
      row('x_{B}', run, reported?.xB, ours.xB, t.xB, asFraction),
      row('K', run, reported?.K, ours.K, t.K),
      row('k_{f}', run, reported?.kf, ours.kf, t.kSplit),
      row('k_{r}', run, reported?.kr, ours.kr, t.kSplit),
    ];
  });
  const mean = refit.meanK;
  if (mean) rows.push(row('mean K', 'all runs', submission.reported?.K, { value: mean.value, standardError: mean.standardError, ci95: [0, 0], unit: '1' }, t.K));
  const law: Array<[string, 'kNf' | 'kNr' | 'kAf' | 'kAr']> = [['k_{N,f}', 'kNf'], ['k_{N,r}', 'kNr'], ['k_{A,f}', 'kAf'], ['k_{A,r}', 'kAr']];
  for (const [quantity, key] of law) if (refit[key]) rows.push(row(quantity, 'all runs', submission.reported?.[key], refit[key], t.kSplit));
  return rows;
}

/** What the block is computed from, in a sentence: the pure forms, the cell and the solution, the mean K and its spread. */
export function equilibriumNote(block: Block, refit: EquilibriumRefit, whose: 'your' | 'the student’s'): string {
  const { A, B, wavelengthNm, temperatureC } = block.pureForms;
  const name = (f: typeof A) => (f.name ? ` (${f.name})` : '');
  const mean = refit.meanK;
  const spread = mean ? ` Mean K over ${mean.n} run${mean.n === 1 ? '' : 's'}: ${formatEstimate(mean.value, mean.standardError)}${mean.sd !== undefined ? `, spread (SD) ${formatNumber(mean.sd, 2)}` : ''}.` : '';
  return (
    `[α]_{eq} = α_{∞}/(l c) with l = ${block.pathLength.value} ${block.pathLength.unit} and c = ${block.concentration.value} ${block.concentration.unit}` +
    `${block.concentrationByRun ? ' (or the run’s own)' : ''}; x_{B} = ([α]_{A} − [α]_{eq})/([α]_{A} − [α]_{B}) with [α]_{A} = ${A.value}${name(A)} and [α]_{B} = ${B.value}${name(B)} ${prettyUnit(A.unit)} ` +
    `(${wavelengthNm} nm, ${temperatureC} °C); K = x_{B}/x_{A}; k_{f} = k_{obs} K/(1 + K) (A → B), k_{r} = k_{obs}/(1 + K). ` +
    `SEs by first-order propagation from ${whose} x_{∞} and k_{obs}.${spread}`
  );
}
