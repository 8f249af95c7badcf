import type { Candidate } from '../../../server/checks/explain.ts';
import { EngineError } from '../../../server/engine/engine-error.ts';
import { convert } from '../../../server/engine/units.ts';
import { fitLinearLaw, type LawOrder } from '../integrated-laws.ts';
import { kUnitOf, type OrderAnalysis } from '../order-analysis.ts';
import { meanOfRunLines } from '../run-lines.ts';
import type { Settings } from '../schemas.ts';
import type { SignalLine } from '../signal-conversion.ts';
import type { AcceptedK } from './accepted-k.ts';

/** A k a slip of method gives, with the standard error that goes with it. */
export type SlipK = Candidate & { se: number };

/** A slip of the Beer-Lambert law that only scales [A] (by `scale`): k of order n scales by scale^(1 - n). */
interface ScalingSlip {
  code: string;
  detail: string;
  scale: number;
}

/** A slip that bends [A]: the concentrations it gives, reading by reading. */
interface BendingSlip {
  code: string;
  detail: string;
  concentration(reading: number): number;
}

function absorbanceOf(settings: Settings) {
  const signal = settings.signal;
  if (signal.type !== 'absorbance') return undefined;
  return { signal, epsilon: convert(signal.molarAbsorptivity.value, signal.molarAbsorptivity.unit, 'M^-1 cm^-1'), path: convert(signal.pathLength.value, signal.pathLength.unit, 'cm') };
}

const differs = (a: number, b: number) => Math.abs(a - b) > 1e-9 * Math.abs(b);

export function scalingSlips(settings: Settings): ScalingSlip[] {
  const a = absorbanceOf(settings);
  if (!a) return [];
  const { signal, epsilon, path } = a;
  const slips: ScalingSlip[] = [];
  // [A] = (A - A_inf) / (epsilon l): l left out makes [A] l times too large.
  if (differs(path, 1)) slips.push({ code: 'path-length', detail: `l left out (taken as 1 cm, not ${path} cm)`, scale: path });
  if (differs(signal.pathLength.value, path)) slips.push({ code: 'path-length', detail: `l = ${signal.pathLength.value} ${signal.pathLength.unit} read as ${signal.pathLength.value} cm`, scale: path / signal.pathLength.value });
  if (differs(signal.molarAbsorptivity.value, epsilon)) {
    slips.push({ code: 'absorptivity-unit', detail: `ε = ${signal.molarAbsorptivity.value} ${signal.molarAbsorptivity.unit} read as ${signal.molarAbsorptivity.value} M^-1 cm^-1`, scale: epsilon / signal.molarAbsorptivity.value });
  }
  return slips;
}

/** The slips that bend [A], with absorbance settings: A_inf not subtracted, and T or %T taken for A. */
export function bendingSlips(settings: Settings, line: SignalLine): BendingSlip[] {
  if (!absorbanceOf(settings)) return [];
  const slips: BendingSlip[] = [];
  if (line.offset !== 0) slips.push({ code: 'end-absorbance', detail: `A_∞ = ${line.offset} not subtracted`, concentration: (x) => x / line.perMolar });
  // T = 10^-A, and %T = 100 T (the definition of absorbance, A = -log10 T).
  slips.push({ code: 'transmittance', detail: 'T = 10^-A used as the absorbance', concentration: (x) => 10 ** -x / line.perMolar });
  slips.push({ code: 'transmittance', detail: '%T = 100 × 10^-A used as the absorbance', concentration: (x) => (100 * 10 ** -x) / line.perMolar });
  return slips;
}

/**
 * The k (and its SE) the student's law (`order`) gives from concentrations read with each Beer-Lambert slip, in
 * the instructor's unit for that order. A scaling slip scales each accepted k (`accepted`), and is
 * named before a decimal shift of the same size, which its settings explain; a first-order k it leaves
 * as it is. A bending slip is refitted by the linear form, as a spreadsheet would fit it.
 */
export function signalSlipKs(settings: Settings, analysis: OrderAnalysis, readings: ReadonlyArray<ReadonlyArray<readonly [number, number]>>, order: LawOrder, accepted: AcceptedK): SlipK[] {
  const scaled: SlipK[] =
    order === 1
      ? []
      : scalingSlips(settings).flatMap((slip) => {
          const f = slip.scale ** (1 - order);
          return accepted.values.map((k, i) => ({ value: k * f, se: accepted.standardErrors[i] * f, causes: [slip.code], basis: `k from [A] with ${slip.detail}`, detail: slip.detail }));
        });
  const bent = bendingSlips(settings, analysis.line).flatMap((slip) => {
    const runs = analysis.runs.map((run, r) => ({ t: run.series.t, c: readings[r].map(([, x]) => slip.concentration(x)) }));
    const basis = `k from [A] with ${slip.detail}`;
    const mean = meanOfRunLines(order, runs, analysis.time);
    try {
      const pooled = fitLinearLaw(order, runs, kUnitOf(order, analysis.time)).k;
      // T rises as A falls, so its line gives k of the wrong sign, which a student drops without thinking of it as a slip.
      const signed = (v: number) => (slip.code === 'transmittance' ? Math.abs(v) : v);
      return [pooled, ...(mean ? [mean] : [])].map((k) => ({ value: signed(k.value), se: k.standardError, causes: [slip.code], basis, detail: slip.detail, closestWins: true }));
    } catch (error) {
      // A slip whose [A] has no line (every ln undefined, say) is a slip this student did not make.
      if (error instanceof EngineError) return [];
      throw error;
    }
  });
  return [...scaled, ...bent];
}
