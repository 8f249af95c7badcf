import { EngineError } from '../../engine/engine-error.ts';
import { fitLine, fitThroughOrigin, type LineModel } from '../../engine/linear-fit.ts';
import type { Candidate } from '../explain.ts';
import { decimalsOf, oneSlipCopies, type SlipKind } from '../digit-slips.ts';
import { fmt } from '../format.ts';
import type { RunAnalysis } from './run-analysis.ts';

/**
 * The numbers a student would get from the run's data by each known slip of method, in the run's
 * own units: k and its standard error for each, and the ln F column for another x_inf.
 */
export interface SlipFit {
  k: Candidate;
  se: Candidate;
}

/** ln F with another x_inf; NaN where the reading is on the wrong side of it. */
export function lnFWith(a: RunAnalysis, infinity: number): number[] {
  const span = a.readings[0] - infinity;
  return a.readings.map((x) => {
    const f = (x - infinity) / span;
    return f > 0 ? Math.log(f) : Number.NaN;
  });
}

const COPY_SLIP_SAYS: Record<SlipKind, string> = {
  'transposed-digits': 'with two neighbouring digits swapped',
  'dropped-digit': 'with a digit dropped',
  'extra-digit': 'with a digit added',
  'decimal-point': 'with the decimal point moved',
  'sign-lost': 'with its sign reversed',
};

export interface InfinityAlternative {
  value: number;
  detail: string;
  /** One of dozens of copying variants: named only on a close match (see `Candidate.longShot`). */
  longShot: boolean;
}

/**
 * x_inf values a student might have used by mistake: the last reading, another run's x_inf, or the
 * recorded x_inf copied with one slip (6.35 read as 6.53, 10.873 as 10.73). The swap of two
 * neighbouring digits is the common copying slip; the other variants are many, so a k is laid to
 * them only when it matches one closely (a whole ln F column matches only the right one anyway).
 */
export function infinityAlternatives(a: RunAnalysis, all: RunAnalysis[]): InfinityAlternative[] {
  const infinity = a.infinity;
  if (infinity === undefined) return [];
  const last = a.readings[a.readings.length - 1];
  const out: InfinityAlternative[] = [{ value: last, detail: `x_inf taken as the last reading, ${fmt(last)}`, longShot: false }];
  const add = (value: number, detail: string, longShot: boolean) => {
    if (value !== infinity && !out.some((o) => o.value === value)) out.push({ value, detail, longShot });
  };
  for (const other of all) {
    if (other.index !== a.index && other.infinity !== undefined) add(other.infinity, `x_inf of run "${other.label}", ${fmt(other.infinity)}`, false);
  }
  for (const copy of oneSlipCopies(infinity, decimalsOf(infinity))) {
    add(copy.value, `x_inf taken as ${fmt(copy.value)}, the recorded ${fmt(infinity)} ${COPY_SLIP_SAYS[copy.kind]}`, copy.kind !== 'transposed-digits');
  }
  return out;
}

function fitModel(model: LineModel, x: number[], y: number[]) {
  return model === 'origin' ? fitThroughOrigin(x, y) : fitLine(x, y);
}

/** The asked model fitted to (t, ln F) pairs that are defined. */
export function fitDefined(model: LineModel, t: number[], lnF: number[]) {
  const keep = lnF.map((v, i) => (Number.isFinite(v) ? i : -1)).filter((i) => i >= 0);
  return fitModel(model, keep.map((i) => t[i]), keep.map((i) => lnF[i]));
}

export function slipFits(a: RunAnalysis, all: RunAnalysis[], model: LineModel): SlipFit[] {
  if (!a.transform || !a.other) return [];
  const { t, lnF } = a.transform;
  const out: SlipFit[] = [
    {
      k: { value: a.other.k.value, causes: ['fit-model'], basis: `the fit ${a.other.model === 'origin' ? 'through the origin' : 'with an intercept'}` },
      se: { value: a.other.k.standardError, causes: ['fit-model'], basis: `the standard error of the fit ${a.other.model === 'origin' ? 'through the origin' : 'with an intercept'}` },
    },
  ];
  // t regressed on ln F, the slope reported as if it were the slope of ln F on t.
  const defined = lnF.map((_, i) => i).filter((i) => Number.isFinite(lnF[i]));
  const swapped = fitModel(model, defined.map((i) => lnF[i]), defined.map((i) => t[i]));
  out.push({
    k: { value: -swapped.slope, causes: ['swapped-axes'], basis: 'minus the slope of t against ln F' },
    se: { value: swapped.seSlope, causes: ['swapped-axes'], basis: 'the standard error of the slope of t against ln F' },
  });
  out.push({
    k: { value: Math.LN2 / a.expected.value, causes: ['half-life-for-rate'], basis: 'the half-life ln 2/k' },
    se: { value: (Math.LN2 * a.expected.standardError) / a.expected.value ** 2, causes: ['half-life-for-rate'], basis: 'the standard error of the half-life' },
  });
  for (const alt of infinityAlternatives(a, all)) {
    try {
      const fit = fitDefined(model, t, lnFWith(a, alt.value));
      out.push({
        k: { value: -fit.slope, causes: ['wrong-infinity'], detail: alt.detail, basis: 'the refit with that x_inf', longShot: alt.longShot },
        se: { value: fit.seSlope, causes: ['wrong-infinity'], detail: alt.detail, basis: 'the standard error of the refit with that x_inf' },
      });
    } catch (error) {
      // Too few defined points with that x_inf: not a slip a student could have fitted either.
      if (!(error instanceof EngineError)) throw error;
    }
  }
  return out;
}
