import { z } from 'zod';
import { Severity } from './result.ts';

/**
 * What the workspace's student page shows, made on the server by the functions that make the sheets:
 * every number already formatted, every place in words, every plot as series with its axes. The page
 * draws what it is sent and knows no kind. Text fields carry the sheets' sub/superscript markup
 * (`k_{obs}`, `ΔH^{‡}`), which the page renders as sub and sup elements.
 */
const Rich = z.string();

const Place = z.object({
  findingId: z.string(),
  code: z.string(),
  /** The checker's path, for the TA's detail view only. */
  path: z.string(),
  place: Rich,
  /** The values behind this place where the checker gave them (`yours …, the refit …`), else empty. */
  values: Rich,
  pointsLost: z.number(),
});

const Card = z.object({
  severity: Severity,
  pointsLost: z.number(),
  /** Where the cause first shows, and how many more places. */
  where: Rich,
  /** The code, and the codes found with it: `log-base + sign-flipped`. */
  codes: z.string(),
  /** What the checker saw, where it says (`x_{∞} taken as 0.09455, …`), else empty. */
  detail: Rich,
  message: Rich,
  /** Every place, the first where the cause entered. */
  places: z.array(Place),
});

const Stage = z.object({
  id: z.string(),
  title: Rich,
  cards: z.array(Card),
  /** Values that only follow from the student's own earlier numbers at no cost: one line, not a card. */
  followsFromOwn: z.object({ text: Rich, places: z.array(Place) }).nullable(),
});

const Table = z.object({
  caption: z.string(),
  /** How the table reads (what the refit is, what the difference is). */
  note: Rich,
  /** `numeric`: a column of numbers, which never wraps inside a number. */
  columns: z.array(z.object({ header: z.string(), numeric: z.boolean() })),
  /** Cells as printed; a line break separates lines of one cell. */
  rows: z.array(z.array(Rich)),
});

const Axis = z.object({ label: Rich, min: z.number(), max: z.number(), ticks: z.array(z.object({ at: z.number(), label: z.string() })) });

const Series = z.object({
  /** Index into the plot's `groups`: series of one group (a run) share a colour. */
  group: z.number().int(),
  /** The refit's (solid lines, discs) or the student's (dashed lines, diamonds). */
  owner: z.enum(['refit', 'student']),
  /** Points [x, y] or a straight line y = intercept + slope·x, in the axes' units. */
  points: z.array(z.tuple([z.number(), z.number()])).optional(),
  line: z.object({ intercept: z.number(), slope: z.number() }).optional(),
});

const Plot = z.object({
  title: Rich,
  x: Axis,
  y: Axis,
  groups: z.array(Rich),
  series: z.array(Series),
  /** The key, drawn outside the data: a mark for each entry, in its group's colour where it has one. */
  legend: z.array(z.object({ label: Rich, mark: z.enum(['disc', 'diamond', 'line', 'dash']), group: z.number().int().optional() })),
  /** Under the plot: the lines' values, or why a line is missing. */
  notes: z.array(Rich),
});

export const SubmissionDisplay = z.object({
  /** "3 findings cost points; 2 warnings", or null when there is no checked result. */
  counts: z.string().nullable(),
  stages: z.array(Stage),
  /** Why a refused submission could not be checked, each place in words. */
  rejected: z.array(z.object({ place: Rich, path: z.string(), message: Rich })),
  comparison: Table.nullable(),
  plots: z.array(Plot),
});

export type SubmissionDisplay = z.infer<typeof SubmissionDisplay>;
export type DisplayPlot = z.infer<typeof Plot>;
export type DisplayTable = z.infer<typeof Table>;
export type DisplayStage = z.infer<typeof Stage>;
export type DisplayPlace = z.infer<typeof Place>;
/** What a kind adds to the page: its table of values and its plots. */
export interface KindDisplay {
  comparison: DisplayTable | null;
  plots: DisplayPlot[];
}
