import type { ReportedValue } from '../../../schemas/common.ts';
import type { CheckResult } from '../../../schemas/result.ts';
import { convertEstimate } from '../../../server/checks/convert-estimate.ts';
import { scoreFindings, type DraftFinding } from '../../../server/checks/draft-finding.ts';
import { scoredResult } from '../../../server/checks/scored-result.ts';
import { checkRounding } from '../../../server/checks/sig-figs.ts';
import { EngineError } from '../../../server/engine/engine-error.ts';
import { analyseOrder, refitOf } from '../order-analysis.ts';
import type { Refit, Settings, Submission } from '../schemas.ts';
import { orderCauses } from './causes.ts';
import { checkHalfLives } from './check-half-life.ts';
import { checkK } from './check-k.ts';
import { checkOrder } from './check-order.ts';
import { readK } from './read-k.ts';
import { rubricCounts } from './rubric-counts.ts';

/** The graded k in the unit the student wrote, where it differs and is of the same kind. */
function declaredK(refit: Refit, unit: string): Refit['kDeclared'] {
  const k = refit.byOrder[refit.gradedOrder].nonlinear?.k ?? refit.byOrder[refit.gradedOrder].linear?.k;
  if (!k || unit.trim() === k.unit) return undefined;
  try {
    return convertEstimate(k, unit);
  } catch (error) {
    if (error instanceof EngineError) return undefined;
    throw error;
  }
}

export function checkReactionOrder(settings: Settings, submission: Submission): Omit<CheckResult, 'engineVersion'> {
  const analysis = analyseOrder(settings, submission.runs);
  const drafts: DraftFinding[] = [];
  const reportedOrder = submission.reported.order;
  checkOrder(settings, analysis, reportedOrder, drafts);
  const read = readK(submission.reported.k, reportedOrder, settings, drafts);
  const context = { settings, analysis, runs: submission.runs, reportedOrder };
  checkK(context, submission.reported.k, read, drafts);
  checkHalfLives(context, Number.isFinite(read.value) ? read.value : undefined, drafts);
  checkRounding(
    [['reported.k', submission.reported.k], ...submission.runs.map((run, r): [string, ReportedValue | undefined] => [`runs[${r}].reported.halfLife`, run.reported?.halfLife])],
    settings.rubric.sigFigs,
    drafts,
  );
  const findings = scoreFindings(drafts, orderCauses.systematic);
  const refit = refitOf(analysis, reportedOrder);
  const kDeclared = declaredK(refit, submission.reported.k.unit);
  return scoredResult(submission.studentId, rubricCounts(settings, submission, analysis.order !== null), findings, { ...refit, ...(kDeclared && { kDeclared }) }, []);
}
