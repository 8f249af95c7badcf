import type { ReportedValue } from '../../../schemas/common.ts';
import type { Settings, Submission } from '../schemas.ts';
import type { DraftFinding } from '../../../server/checks/draft-finding.ts';
import { checkRounding } from '../../../server/checks/sig-figs.ts';

/** Presentation: every reported value rounded consistently with its uncertainty. */
export function checkSigFigs(submission: Submission, settings: Settings, drafts: DraftFinding[]): void {
  const values: Array<[string, ReportedValue | undefined]> = [
    ...submission.runs.map((r, i): [string, ReportedValue | undefined] => [`runs[${i}].reported.k`, r.reported?.k]),
    ['reported.kN', submission.reported?.kN],
    ['reported.kA', submission.reported?.kA],
  ];
  checkRounding(values, settings.rubric.sigFigs, drafts);
}
