import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { Readings } from '../schemas/readings.ts';
import { jsonSchemas } from '../kinds/json-schemas.ts';

// The schema the fast path stands for, written out as the contract states it.
const Reading = z.tuple([z.number(), z.number()]);
const exactRows = z
  .array(Reading)
  .min(3, 'at least 3 readings')
  .max(1000)
  .superRefine((rows, ctx) => {
    for (let i = 1; i < rows.length; i++) {
      const [t, x] = rows[i];
      const [tBefore, xBefore] = rows[i - 1];
      if (t < tBefore) ctx.addIssue({ code: 'custom', path: [i, 0], message: `time ${t} comes before the time above it, ${tBefore}` });
      else if (t === tBefore && x !== xBefore) ctx.addIssue({ code: 'custom', path: [i, 0], message: `time ${t} is repeated with a different reading` });
    }
  });

const issues = (result: { success: boolean; error?: z.ZodError }) => (result.error?.issues ?? []).map((i) => ({ path: i.path, message: i.message }));
const rows = (n: number) => Array.from({ length: n }, (_, i) => [i, 20 - i * 0.5]);

describe('readings: the fast path reads exactly what the tuple schema reads', () => {
  const cases: Array<[string, unknown]> = [
    ['plain rows', rows(16)],
    ['a row repeated exactly', [...rows(5), [4, 18]]],
    ['a time given as text', rows(5).map((r, i) => (i === 2 ? ['2', r[1]] : r))],
    ['a missing reading', rows(5).map((r, i) => (i === 3 ? [r[0]] : r))],
    ['a row of three', rows(5).map((r, i) => (i === 1 ? [...r, 0] : r))],
    ['a time going back', rows(5).map((r, i) => (i === 4 ? [1.5, r[1]] : r))],
    ['a time repeated with another reading', [...rows(5), [4, 17]]],
    ['too few rows', rows(2)],
    ['too many rows', rows(1001)],
    ['not an array', { t: 1 }],
    ['a row that is an object', [...rows(4), { t: 5, x: 1 }]],
    ['a reading of null', rows(5).map((r, i) => (i === 0 ? [0, null] : r))],
  ];
  it.each(cases)('%s', (_, value) => {
    const exact = exactRows.safeParse(value);
    const fast = Readings.safeParse(value);
    expect(fast.success).toBe(exact.success);
    if (exact.success) expect(fast.data).toEqual(exact.data);
    else expect(issues(fast)).toEqual(issues(exact));
  });

  it('is written in JSON Schema as the tuple schema, not as a transform', () => {
    const submission = jsonSchemas()['first-order-catalysis.submission.schema.json'] as { properties: { runs: { items: { properties: { readings: unknown } } } } };
    const { $schema: _, ...exactJson } = z.toJSONSchema(exactRows, { io: 'input' }) as Record<string, unknown>;
    expect(submission.properties.runs.items.properties.readings).toEqual(exactJson);
  });
});
