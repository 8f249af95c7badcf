import type { SubmittedRun } from '../schemas.ts';
import type { DraftFinding } from '../../../server/checks/draft-finding.ts';
import { implausibleTemperature, implausibleTemperatureDraft } from '../../../server/checks/temperature-plausibility.ts';

/** A run's recorded temperature (degrees Celsius) outside 250-400 K, named with what was probably meant; it enters no fit. */
export function runTemperatureDraft(run: SubmittedRun, index: number): DraftFinding | undefined {
  if (run.temperatureC === undefined) return undefined;
  const found = implausibleTemperature(run.temperatureC, 'degC');
  if (!found) return undefined;
  return implausibleTemperatureDraft(found, `${run.temperatureC} °C`, {
    path: `runs[${index}].temperatureC`,
    stage: 'readings',
    what: `run "${run.label}"`,
    consequence: 'The temperature enters none of the fits, so nothing else changes.',
  });
}
