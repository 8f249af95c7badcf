import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { jsonSchemas } from '../schemas/json-schemas.ts';

describe('exported JSON Schema', () => {
  it.each(Object.entries(jsonSchemas()))('%s is what the zod schemas give (run `npm run schemas` after a change)', (name, schema) => {
    const committed = JSON.parse(readFileSync(new URL(`../schemas/json/${name}`, import.meta.url), 'utf8'));
    expect(committed).toEqual(JSON.parse(JSON.stringify(schema)));
  });
});
