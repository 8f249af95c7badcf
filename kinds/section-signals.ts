import { kindFor } from './registry.ts';
import { nothingCompared, type SectionSignals } from '../server/signals/section-report.ts';

/** `submissions`: the section's latest valid submissions, as their schema read them; the kind says what to compare. */
export function sectionSignals(settings: { kind: string }, submissions: unknown[]): SectionSignals {
  const kind = kindFor(settings.kind);
  if (!kind?.sectionSignals) return nothingCompared('signals across a section are not worked out for this kind of experiment');
  return kind.sectionSignals(settings, submissions);
}

/** The same as one task for the worker pool: a section's comparisons take seconds, which the event loop must not wait on. */
export function sectionSignalsTask(input: { settings: { kind: string }; submissions: unknown[] }): SectionSignals {
  return sectionSignals(input.settings, input.submissions);
}
