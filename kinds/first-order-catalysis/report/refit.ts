import { EquilibriumRefit, type Refit, type RunRefit } from '../schemas.ts';

/**
 * The result's refit in the kind's shape, or undefined (rejected result, or another kind).
 *
 * Read field by field rather than with `Refit.parse`: the checker can put a non-finite number in a
 * field the sheets do not use (a half-life interval's upper end is Infinity when k's interval reaches
 * 0; after JSON it is null), and the strict schema would then refuse the whole refit. Only what the
 * sheets draw is required: per run a k with value, standard error and unit, or why the run has none.
 */
type EstimateValue = NonNullable<Refit['runs'][number]['k']>['instructor'];

const record = (value: unknown): Record<string, unknown> | undefined =>
  typeof value === 'object' && value !== null && !Array.isArray(value) ? (value as Record<string, unknown>) : undefined;

function estimate(value: unknown): EstimateValue | undefined {
  const e = record(value);
  if (!e || typeof e.value !== 'number' || typeof e.standardError !== 'number' || typeof e.unit !== 'string') return undefined;
  if (!Number.isFinite(e.value)) return undefined;
  const ci = Array.isArray(e.ci95) && e.ci95.length === 2 ? (e.ci95 as [number, number]) : [NaN, NaN];
  return { value: e.value, standardError: e.standardError, ci95: [Number(ci[0]), Number(ci[1])], unit: e.unit };
}

function runRefit(value: unknown): RunRefit | undefined {
  const run = record(value);
  const k = record(run?.k);
  const instructor = estimate(k?.instructor);
  if (run && typeof run.notFitted === 'string') return { label: typeof run.label === 'string' ? run.label : '', model: 'exponential', notFitted: run.notFitted };
  if (!run || !instructor) return undefined;
  const model = run.model === 'intercept' || run.model === 'exponential' ? run.model : 'origin';
  const lnF = Array.isArray(run.lnF) ? run.lnF.map((v) => (typeof v === 'number' && Number.isFinite(v) ? v : null)) : undefined;
  return {
    label: typeof run.label === 'string' ? run.label : '',
    model,
    k: { instructor, declared: estimate(k?.declared) },
    lnF,
    residualSD: typeof run.residualSD === 'number' ? run.residualSD : undefined,
  };
}

export function readRefit(result: { refit: unknown }): Refit | undefined {
  const refit = record(result.refit);
  if (!refit || !Array.isArray(refit.runs)) return undefined;
  const runs = refit.runs.map(runRefit);
  if (runs.some((r) => r === undefined)) return undefined;
  const own = record(refit.fromReportedK);
  const ownKN = estimate(own?.kN);
  const ownKA = estimate(own?.kA);
  return {
    runs: runs as RunRefit[],
    kN: estimate(refit.kN),
    kA: estimate(refit.kA),
    fromReportedK: ownKN && ownKA ? { kN: ownKN, kA: ownKA } : undefined,
    // Only finite numbers are stored in it (no K from an x_B outside 0 to 1): the schema reads it whole.
    equilibrium: EquilibriumRefit.safeParse(refit.equilibrium).data,
  };
}
