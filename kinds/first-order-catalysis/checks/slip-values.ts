import { EngineError } from '../../../server/engine/engine-error.ts';
import { slopeOnly, type LineModel } from '../../../server/engine/linear-fit.ts';
import type { Candidate } from '../../../server/checks/explain.ts';
import { oneSlipCopies, type SlipKind } from '../../../server/checks/digit-slips.ts';
import { decimalsOf } from '../../../server/engine/decimal-places.ts';
import { fmt } from '../../../server/checks/format.ts';
import type { RunAnalysis } from './run-analysis.ts';

/**
 * The numbers a student would get from the run's data by each known slip of method, in the run's
 * own units: k and its standard error for each, and the ln F column for another x_inf.
 */
export interface SlipFit {
  k: Candidate;
  se: Candidate;
}

/** ln F with another x_inf at reading i; NaN where the reading is on the wrong side of it. */
export function lnFEntryWith(a: RunAnalysis, infinity: number): (i: number) => number {
  const span = a.readings[0] - infinity;
  return (i) => {
    const f = (a.readings[i] - infinity) / span;
    return f > 0 ? Math.log(f) : Number.NaN;
  };
}

/** ln F with another x_inf; NaN where the reading is on the wrong side of it. */
export function lnFWith(a: RunAnalysis, infinity: number): number[] {
  const at = lnFEntryWith(a, infinity);
  return a.readings.map((_, i) => at(i));
}

const COPY_SLIP_SAYS: Record<SlipKind, string> = {
  'transposed-digits': 'with two neighbouring digits swapped',
  'dropped-digit': 'with a digit dropped',
  'extra-digit': 'with a digit added',
  'decimal-point': 'with the decimal point moved',
  'sign-lost': 'with its sign reversed',
};

/** Where an alternative x_inf comes from, kept to put it in words only when a finding names it. */
type AlternativeSource = { from: 'last-reading' } | { from: 'run'; label: string } | { from: 'copy'; recorded: number; slip: SlipKind };

export class InfinityAlternative {
  private said: string | undefined;
  constructor(
    readonly value: number,
    /** One of dozens of copying variants: named only on a close match (see `Candidate.longShot`). */
    readonly longShot: boolean,
    private readonly source: AlternativeSource,
  ) {}

  /** The x_inf in words: dozens are tried for each run and almost none is named. */
  get detail(): string {
    return (this.said ??= this.describe());
  }

  private describe(): string {
    const s = this.source;
    if (s.from === 'last-reading') return `x_inf taken as the last reading, ${fmt(this.value)}`;
    if (s.from === 'run') return `x_inf of run "${s.label}", ${fmt(this.value)}`;
    return `x_inf taken as ${fmt(this.value)}, the recorded ${fmt(s.recorded)} ${COPY_SLIP_SAYS[s.slip]}`;
  }
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
  const out = [new InfinityAlternative(last, false, { from: 'last-reading' })];
  const seen = new Set([infinity, last]);
  const add = (value: number, longShot: boolean, source: AlternativeSource) => {
    if (!seen.has(value)) {
      seen.add(value);
      out.push(new InfinityAlternative(value, longShot, source));
    }
  };
  for (const other of all) {
    if (other.index !== a.index && other.infinity !== undefined) add(other.infinity, false, { from: 'run', label: other.label });
  }
  for (const copy of oneSlipCopies(infinity, decimalsOf(infinity))) {
    add(copy.value, copy.kind !== 'transposed-digits', { from: 'copy', recorded: infinity, slip: copy.kind });
  }
  return out;
}

export const WRONG_INFINITY = 'wrong-infinity';
const WRONG_INFINITY_CAUSES = [WRONG_INFINITY];

/** k or its SE from the refit with another x_inf: its words are read only if it explains a value. */
class AlternativeFit implements Candidate {
  readonly causes = WRONG_INFINITY_CAUSES;
  constructor(
    readonly value: number,
    readonly basis: string,
    readonly alternative: InfinityAlternative,
    readonly longShot: boolean,
  ) {}

  get detail(): string {
    return this.alternative.detail;
  }
}

// Scratch buffers for the defined (t, ln F) pairs: a slip search fits dozens of columns per run.
let pairT = new Float64Array(64);
let pairLnF = new Float64Array(64);

function reserve(n: number): void {
  if (pairT.length < n) {
    pairT = new Float64Array(2 * n);
    pairLnF = new Float64Array(2 * n);
  }
}

/** Gathers the pairs whose ln F (entry i of a column) is defined into the scratch buffers; returns how many. */
function definedPairs(t: ArrayLike<number>, lnFAt: (i: number) => number): number {
  reserve(t.length);
  let n = 0;
  for (let i = 0; i < t.length; i++) {
    const lnF = lnFAt(i);
    if (Number.isFinite(lnF)) {
      pairT[n] = t[i];
      pairLnF[n++] = lnF;
    }
  }
  return n;
}

/** The asked model fitted to the (t, ln F) pairs that are defined, ln F given entry by entry: slope and standard error. */
function fitColumn(model: LineModel, t: ArrayLike<number>, lnFAt: (i: number) => number): { slope: number; seSlope: number } {
  const n = definedPairs(t, lnFAt);
  return slopeOnly(model, pairT, pairLnF, n);
}

/** The asked model fitted to the (t, ln F) pairs of a column that are defined. */
export const fitDefined = (model: LineModel, t: ArrayLike<number>, lnF: ArrayLike<number>) => fitColumn(model, t, (i) => lnF[i]);

/** The slips of method that need no refit: the other line model, swapped axes, the half-life. */
export function methodSlipFits(a: RunAnalysis, model: LineModel): SlipFit[] {
  if (!a.transform || !a.other) return [];
  const { t, lnF } = a.transform;
  const out: SlipFit[] = [
    {
      k: { value: a.other.k.value, causes: ['fit-model'], basis: `the fit ${a.other.model === 'origin' ? 'through the origin' : 'with an intercept'}` },
      se: { value: a.other.k.standardError, causes: ['fit-model'], basis: `the standard error of the fit ${a.other.model === 'origin' ? 'through the origin' : 'with an intercept'}` },
    },
  ];
  // t regressed on ln F, the slope reported as if it were the slope of ln F on t.
  const pairs = definedPairs(t, (i) => lnF[i]);
  const swapped = slopeOnly(model, pairLnF, pairT, pairs);
  out.push({
    k: { value: -swapped.slope, causes: ['swapped-axes'], basis: 'minus the slope of t against ln F' },
    se: { value: swapped.seSlope, causes: ['swapped-axes'], basis: 'the standard error of the slope of t against ln F' },
  });
  out.push({
    k: { value: Math.LN2 / a.expected.value, causes: ['half-life-for-rate'], basis: 'the half-life ln 2/k' },
    se: { value: (Math.LN2 * a.expected.standardError) / a.expected.value ** 2, causes: ['half-life-for-rate'], basis: 'the standard error of the half-life' },
  });
  return out;
}

/** The refits with each alternative x_inf (cause `wrong-infinity`): dozens of fits, made only when needed. */
export function infinitySlipFits(a: RunAnalysis, all: RunAnalysis[], model: LineModel): SlipFit[] {
  if (!a.transform || !a.other) return [];
  const { t } = a.transform;
  const out: SlipFit[] = [];
  for (const alt of infinityAlternatives(a, all)) {
    try {
      // ln F with that x_inf is made entry by entry as it is fitted, without keeping the column.
      const fit = fitColumn(model, t, lnFEntryWith(a, alt.value));
      out.push({
        k: new AlternativeFit(-fit.slope, 'the refit with that x_inf', alt, alt.longShot),
        se: new AlternativeFit(fit.seSlope, 'the standard error of the refit with that x_inf', alt, false),
      });
    } catch (error) {
      // Too few defined points with that x_inf: not a slip a student could have fitted either.
      if (!(error instanceof EngineError)) throw error;
    }
  }
  return out;
}
