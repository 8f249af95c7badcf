import { kindFor } from './registry.ts';
import { nothingCompared, type SectionSignalCollector, type SectionSignals } from '../server/signals/section-report.ts';

/** The section's signals gathered one submission at a time (the section's latest valid submissions, as their schema read them); the kind says what to compare. */
export function sectionSignalCollector(settings: { kind: string }): SectionSignalCollector {
  const kind = kindFor(settings.kind);
  if (kind?.sectionSignals) return kind.sectionSignals(settings);
  const none = nothingCompared('signals across a section are not worked out for this kind of experiment');
  return { add: () => {}, finish: () => none };
}

/** `submissions`: the section's latest valid submissions, as their schema read them. */
export function sectionSignals(settings: { kind: string }, submissions: unknown[]): SectionSignals {
  const collector = sectionSignalCollector(settings);
  for (const submission of submissions) collector.add(submission);
  return collector.finish();
}

/** The same as one task for the worker pool: a section's comparisons take seconds, which the event loop must not wait on. */
export function sectionSignalsTask(input: { settings: { kind: string }; submissions: unknown[] }): SectionSignals {
  return sectionSignals(input.settings, input.submissions);
}
