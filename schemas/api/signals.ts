import { z } from 'zod';

/** Two runs of two students whose readings match cell by cell, and how. */
export const RunMatch = z.object({ runs: z.tuple([z.number(), z.number()]), relation: z.enum(['identical', 'offset', 'scaled', 'edited']), matchingCells: z.number(), cells: z.number() });
export type RunMatch = z.infer<typeof RunMatch>;

/** Signals across a section, for review: pairs of look-alike readings, and runs smoother than the instrument reads. */
export const SectionSignals = z.object({
  /** Why nothing was compared, when nothing was: the class was handed one dataset, or the kind has no runs. */
  notCompared: z.string().optional(),
  /** Pairs of submissions whose readings look alike, and the students linked when more than two share. */
  pairs: z.array(z.object({ students: z.tuple([z.string(), z.string()]), runs: z.array(RunMatch), sameReportedK: z.array(z.tuple([z.number(), z.number()])) })),
  groups: z.array(z.array(z.string())),
  /** Runs whose readings scatter no more than rounding alone, where the section's scatter several times more. */
  smooth: z.array(z.object({ studentId: z.string(), run: z.number(), label: z.string(), residualSD: z.number(), step: z.number(), sectionMedianSD: z.number(), instrumentNoise: z.number().optional() })),
});
export type SectionSignals = z.infer<typeof SectionSignals>;
