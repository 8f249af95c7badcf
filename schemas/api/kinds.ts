import { z } from 'zod';
import { Tolerance } from '../common.ts';

/**
 * What the workspace needs to know of an experiment kind to draw its settings form, upload panel and
 * signals panel, so the page itself names no kind. Labels carry the sheets' sub/superscript markup
 * (`k_{obs}`, `ΔH^{‡}`), which the page renders as sub and sup elements.
 */
const Rich = z.string();

/** One of the kind's quantities: how the documents name and write it, and the unit it is asked in by default. */
export const KindQuantity = z.object({ id: z.string(), label: z.string(), symbol: Rich, unit: z.string() });
export type KindQuantity = z.infer<typeof KindQuantity>;

const FieldBase = z.object({
  /** The setting's path in the settings: `tolerances.k`. */
  name: z.string(),
  label: Rich,
  help: z.string().optional(),
});

/** One control of the settings form, made from the kind's settings schema and its labels. */
export const FormField = z.discriminatedUnion('type', [
  FieldBase.extend({ type: z.literal('number'), default: z.number().optional(), min: z.number().optional(), max: z.number().optional(), /** Above min, not at it. */ minExclusive: z.boolean().optional(), /** Whole numbers only. */ integer: z.boolean().optional(), unit: z.string().optional(), /** May be left empty: not set. */ optional: z.boolean() }),
  FieldBase.extend({ type: z.literal('select'), default: z.string(), options: z.array(z.object({ value: z.string(), label: Rich })) }),
  FieldBase.extend({ type: z.literal('boolean'), default: z.boolean() }),
  FieldBase.extend({ type: z.literal('text'), default: z.string() }),
  /** Relative (a share of the value, shown in per cent) or absolute (in the quantity's unit, `unit`). */
  FieldBase.extend({ type: z.literal('tolerance'), default: Tolerance, unit: z.string().optional() }),
]);
export type FormField = z.infer<typeof FormField>;

/** A fieldset of the form. */
export const FormGroup = z.object({ type: z.literal('group'), label: z.string(), help: z.string().optional(), fields: z.array(FormField) });
export type FormGroup = z.infer<typeof FormGroup>;

/** A CSV file of an upload: its form field name (which the file's name is matched against), and its columns. */
export const CsvFile = z.object({ name: z.string(), required: z.boolean(), columns: z.array(z.string()), optionalColumns: z.array(z.string()) });
export type CsvFile = z.infer<typeof CsvFile>;

export const KindDescription = z.object({
  kind: z.string(),
  title: z.string(),
  quantities: z.array(KindQuantity),
  /** The settings form: every setting with a default, grouped; parts it leaves out (datasets, bands) are kept as stored. */
  settings: z.object({ form: z.array(FormGroup), note: z.string().optional() }),
  /** What the upload panel takes: a JSON batch always, and the kind's CSV files where it reads CSV. */
  upload: z.object({ json: z.literal(true), csv: z.array(CsvFile).optional() }),
  /** Each of the kind's finding codes in a few words, in the kind's order: what a TA chooses among when filtering by finding. */
  findings: z.array(z.object({ code: z.string(), label: z.string() })),
  /** The words of the signals panels: what a compared unit is called, the value compared digit by digit, and each signal code's label. */
  signals: z.object({ unit: z.string(), reportedValue: Rich, codes: z.array(z.object({ code: z.string(), label: z.string() })) }),
});
export type KindDescription = z.infer<typeof KindDescription>;

export const KindList = z.array(KindDescription);
