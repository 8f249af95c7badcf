import type { Settings, Submission } from '../schemas.ts';
import { convert } from '../../../server/engine/units.ts';
import { slipMatch } from '../../../server/checks/cause-tolerance.ts';
import { checkValue } from '../../../server/checks/check-value.ts';
import { roundingOf } from '../../../server/checks/rounding-rule.ts';
import type { DraftFinding } from '../../../server/checks/draft-finding.ts';
import { RATE_CONSTANT_FACTORS } from '../../../server/checks/explain.ts';
import { readReported } from '../../../server/checks/reported-number.ts';
import { temperatureCauses } from './causes.ts';
import type { TemperatureAnalysis } from './refit.ts';

/**
 * The k reported for each point given as a run, against our refit of its readings (the exponential
 * fit, or either ln F line where x_inf was measured). Returns each such point's k as the student has
 * it, per second, for what follows from it.
 */
export function checkRunKs(submission: Submission, analysis: TemperatureAnalysis, settings: Settings, drafts: DraftFinding[]): Map<number, number> {
  const theirs = new Map<number, number>();
  for (const run of analysis.runs) {
    const point = submission.points[run.index];
    const path = `points[${run.index}].run.reported.k`;
    const what = `k of the run at ${point.label}`;
    const itemKey = `k@points[${run.index}]`;
    const reported = point.run?.reported?.k;
    const charge = settings.rubric.k;
    if (!reported) {
      if (charge > 0) drafts.push({ code: 'missing-value', path, stage: 'runs', rubricItem: 'k', itemKey, severity: 'error', charge, message: `The ${what} is missing.` });
      continue;
    }
    const unit = run.k.unit;
    const read = readReported(reported, 'first-order-rate', unit, unit, { path, what, stage: 'runs' }, drafts);
    checkValue(
      {
        what: `The ${what}`,
        path,
        stage: 'runs',
        rubricItem: 'k',
        itemKey,
        charge,
        reported: read.value,
        unit,
        expected: run.k.value,
        alsoRight: run.alsoRight,
        factors: RATE_CONSTANT_FACTORS,
        causes: temperatureCauses,
        tolerance: settings.tolerances.k,
        causeTolerance: () => slipMatch(reported.value, read.value, settings.tolerances.k),
        rounding: roundingOf(reported.value, read.uncertainty, run.k.standardError, settings.rubric.sigFigs),
      },
      drafts,
    );
    if (read.value > 0) theirs.set(run.index, convert(read.value, unit, 's^-1'));
  }
  return theirs;
}
