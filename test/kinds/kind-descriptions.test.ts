import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { kindDescriptions, kindFor } from '../../kinds/registry.ts';
import { settingsForm } from '../../reports/display/settings-form.ts';
import { KindList } from '../../schemas/api/kinds.ts';
import { LATE_POLICY_DEFAULT, LatePolicy, Tolerance } from '../../schemas/common.ts';
import * as catalysisCsv from '../../kinds/first-order-catalysis/csv.ts';
import * as temperatureCsv from '../../kinds/temperature-dependence/csv.ts';
import * as orderCsv from '../../kinds/reaction-order/csv.ts';

/** The columns each kind's CSV reader requires, by file, as the readers declare them. */
const READERS: Record<string, Record<string, readonly string[]>> = {
  'first-order-catalysis': { readings: catalysisCsv.READINGS_COLUMNS, reported: catalysisCsv.REPORTED_COLUMNS },
  'temperature-dependence': { points: temperatureCsv.POINT_COLUMNS, reported: temperatureCsv.REPORTED_COLUMNS },
  'reaction-order': { readings: orderCsv.READINGS_COLUMNS, reported: orderCsv.REPORTED_COLUMNS },
};

describe('the kinds as the page is told of them', () => {
  it('describes every registered kind in the shape GET /v1/kinds answers', async () => {
    const kinds = await kindDescriptions();
    expect(kinds.map((k) => k.kind)).toEqual(['first-order-catalysis', 'temperature-dependence', 'reaction-order']);
    expect(KindList.safeParse(kinds).success).toBe(true);
  });

  it('asks for the files the kind’s CSV layout reads, with the columns its reader requires', async () => {
    for (const kind of await kindDescriptions()) {
      const layout = kindFor(kind.kind)!.csvLayout!;
      expect(kind.upload.csv?.map((f) => [f.name, f.required])).toEqual([[layout.main, true], ...layout.optional.map((name) => [name, false])]);
      for (const file of kind.upload.csv ?? []) expect(file.columns).toEqual(READERS[kind.kind][file.name]);
    }
  });

  it('words every signal code the kind’s checker declares, and no other, in its order', async () => {
    for (const kind of await kindDescriptions()) expect(kind.signals.codes.map((c) => c.code)).toEqual([...kindFor(kind.kind)!.signalCodes]);
  });

  it('offers in each form every setting of the kind with a default, except those kept as stored', async () => {
    // Hand-listed: the settings a TA edits through the API only.
    const kept: Record<string, string[]> = { 'first-order-catalysis': ['classDataset', 'reference', 'equilibrium'], 'temperature-dependence': ['reference'], 'reaction-order': [] };
    for (const kind of await kindDescriptions()) {
      const top = new Set(kind.settings.form.flatMap((g) => g.fields.map((f) => f.name.split('.')[0])));
      const shape = Object.keys((kindFor(kind.kind)!.settingsSchema as unknown as z.ZodObject).shape).filter((key) => key !== 'kind' && !kept[kind.kind].includes(key));
      expect([...top].sort()).toEqual(shape.sort());
    }
  });

  it('ends every kind’s form with the one “Late work” group, the same in each', async () => {
    const kinds = await kindDescriptions();
    const lateGroups = kinds.map((kind) => kind.settings.form.filter((g) => g.label === 'Late work'));
    // Hand-written from LatePolicy: a choice of three policies (grade by default) and points from 0, 0 by default.
    for (const groups of lateGroups) {
      expect(groups).toHaveLength(1);
      expect(groups[0].fields.map((f) => [f.name, f.type, f.default])).toEqual([['late.policy', 'select', 'grade'], ['late.points', 'number', 0]]);
      expect(groups[0].fields[0].type === 'select' && groups[0].fields[0].options.map((o) => o.value)).toEqual(['grade', 'deduct', 'hold']);
    }
    expect(new Set(lateGroups.map((g) => JSON.stringify(g))).size).toBe(1);
    for (const kind of kinds) expect(kind.settings.form.at(-1)?.label).toBe('Late work');
  });
});

describe('a settings form made from a settings schema', () => {
  const Settings = z.object({
    kind: z.literal('invented'),
    fit: z.enum(['ordinary', 'weighted']).default('weighted'),
    model: z.enum(['a', 'b']),
    step: z.number().positive().max(1).default(0.5),
    noise: z.number().nonnegative().optional(),
    units: z.object({ k: z.string().default('s^-1') }).default({ k: 's^-1' }),
    tolerances: z.object({ k: Tolerance.default({ relative: 0.02 }) }).default({ k: { relative: 0.02 } }),
    strict: z.boolean().default(true),
    dataset: z.array(z.number()).optional(),
    late: LatePolicy.default(LATE_POLICY_DEFAULT),
  });
  const words = { fit: { label: 'Fit', options: { ordinary: 'OLS' } }, model: 'Model', step: 'Step', noise: 'Noise', 'units.k': 'k', 'tolerances.k': { label: 'k', unit: 's^-1' }, strict: 'Strict' };
  const groups = [{ label: 'All', keys: ['fit', 'model', 'step', 'noise', 'units', 'tolerances', 'strict'] }];

  it('gives each setting its control, default and bounds (hand-written from the schema above)', () => {
    const [group, late] = settingsForm(Settings, { groups, words, kept: ['dataset'] });
    expect(late.label).toBe('Late work');
    expect(group.fields).toEqual([
      { name: 'fit', label: 'Fit', type: 'select', default: 'weighted', options: [{ value: 'ordinary', label: 'OLS' }, { value: 'weighted', label: 'weighted' }] },
      { name: 'model', label: 'Model', type: 'select', default: 'a', options: [{ value: 'a', label: 'a' }, { value: 'b', label: 'b' }] },
      { name: 'step', label: 'Step', type: 'number', default: 0.5, min: 0, minExclusive: true, max: 1, optional: false },
      { name: 'noise', label: 'Noise', type: 'number', min: 0, optional: true },
      { name: 'units.k', label: 'k', type: 'text', default: 's^-1' },
      { name: 'tolerances.k', label: 'k', type: 'tolerance', default: { relative: 0.02 }, unit: 's^-1' },
      { name: 'strict', label: 'Strict', type: 'boolean', default: true },
    ]);
  });

  it('refuses a setting neither in the form nor kept, and a field without words', () => {
    expect(() => settingsForm(Settings, { groups, words, kept: [] })).toThrow('settings neither in the form nor kept: dataset');
    const { strict: _, ...without } = words;
    expect(() => settingsForm(Settings, { groups, words: without, kept: ['dataset'] })).toThrow('no label for the setting strict');
  });
});
