import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { isStorableText } from '../schemas/common.ts';
import { jsonSchemas } from '../kinds/json-schemas.ts';

describe('exported JSON Schema', () => {
  it.each(Object.entries(jsonSchemas()))('%s is what the zod schemas give (run `npm run schemas` after a change)', (name, schema) => {
    const committed = JSON.parse(readFileSync(new URL(`../schemas/json/${name}`, import.meta.url), 'utf8'));
    expect(committed).toEqual(JSON.parse(JSON.stringify(schema)));
  });
});

describe('storable text', () => {
  it.each([
    ['plain text', 'min^-1', true],
    ['a micro sign', 'µM', true],
    ['a pair of surrogates (an emoji)', 'run \ud83d\ude00', true],
    ['a NUL character', 'run\u0000B', false],
    ['a high surrogate alone', 'M \ud800', false],
    ['a low surrogate alone', '\udc00 M', false],
    ['two high surrogates', '\ud83d\ud83d\ude00', false],
  ])('%s: %s', (_, text, storable) => {
    expect(isStorableText(text)).toBe(storable);
  });
});
