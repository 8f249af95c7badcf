import type { ReportedValue } from '../../../schemas/common.ts';
import type { Settings, Submission } from '../../../schemas/kinds/first-order-catalysis.ts';
import type { DraftFinding } from '../draft-finding.ts';
import { sigFigProblem } from '../sig-figs.ts';

/** Presentation: every reported value rounded consistently with its uncertainty. */
export function checkSigFigs(submission: Submission, settings: Settings, drafts: DraftFinding[]): void {
  const values: Array<[string, ReportedValue | undefined]> = [
    ...submission.runs.map((r, i): [string, ReportedValue | undefined] => [`runs[${i}].reported.k`, r.reported?.k]),
    ['reported.kN', submission.reported?.kN],
    ['reported.kA', submission.reported?.kA],
  ];
  const points = settings.rubric.sigFigs;
  for (const [path, v] of values) {
    if (!v || v.uncertainty === undefined) continue;
    const problem = sigFigProblem(v.value, v.uncertainty);
    if (!problem) continue;
    drafts.push({
      code: 'sig-figs',
      detail: problem.problem,
      path,
      stage: 'reporting',
      rubricItem: 'sigFigs',
      itemKey: 'sigFigs',
      severity: points > 0 ? 'error' : 'warning',
      charge: points,
      message: `${problem.text[0].toUpperCase()}${problem.text.slice(1)}. Round the uncertainty to one or two significant figures and the value to the same decimal place.`,
    });
  }
}
