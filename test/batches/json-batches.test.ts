import { caught } from '../support/thrown.ts';
import { describe, expect, it } from 'vitest';
import { JsonBatcher, JsonLayoutError, parseBatch } from '../../server/batches/json-batches.ts';

/** Feeds `text` in pieces of `pieceSize` bytes and parses every batch, as the command does. */
function elements(text: string, options: { pieceSize?: number; batchBytes?: number; jsonLines?: boolean } = {}) {
  const { pieceSize = 7, batchBytes = 20, jsonLines = false } = options;
  const batcher = new JsonBatcher({ jsonLines, batchBytes });
  const bytes = Buffer.from(text);
  const batches = [];
  for (let i = 0; i < bytes.length; i += pieceSize) batches.push(...batcher.push(bytes.subarray(i, i + pieceSize)));
  batches.push(...batcher.end());
  return { batches, values: batches.flatMap((b) => parseBatch(b, jsonLines)) };
}

describe('JsonBatcher', () => {
  const items = Array.from({ length: 25 }, (_, i) => ({ id: `S-${i}`, s: 'a, "quoted" ] } [ {', n: [i, [i + 0.5]], u: 'αβ\u00b0' }));

  it.each([1, 3, 7, 64, 10_000])('gives back every element of an array, in order, whatever the piece size (%i bytes)', (pieceSize) => {
    const { batches, values } = elements(JSON.stringify(items, null, 2), { pieceSize });
    expect(values).toEqual(items);
    expect(batches.length).toBeGreaterThan(5);
  });

  it('reads a single object as one element, and an empty array as none', () => {
    expect(elements(JSON.stringify(items[3])).values).toEqual([items[3]]);
    expect(elements(' [ \n ] \n').values).toEqual([]);
  });

  it('reads JSON Lines, skipping blank lines', () => {
    const text = `${items.map((x) => JSON.stringify(x)).join('\n')}\n\n`;
    expect(elements(text, { jsonLines: true }).values).toEqual(items);
  });

  it('names the line and column of a malformed element in the file', () => {
    const text = '[\n  {"a": 1},\n  {"b": 2,\n  }\n]\n';
    const error = caught(() => elements(text, { batchBytes: 1 }));
    expect(error).toBeInstanceOf(JsonLayoutError);
    expect((error as Error).message).toMatch(/at line 4 column 3$/);
  });

  it('names the line of a malformed JSON Lines record', () => {
    const error = caught(() => elements('{"a": 1}\n{"b": }\n', { jsonLines: true }));
    expect((error as Error).message).toMatch(/at line 2 column \d+$/);
  });

  it.each([
    ['[{"a": 1}', /^the file ends inside the document at line 1 column 10$/],
    ['[{"a": 1}] x', /^unexpected "x" at line 1 column 12$/],
    ['', /^no JSON value at line 1 column 1$/],
    ['[,{"a": 1}]', /^unexpected "," at line 1 column 2$/],
  ])('refuses a document whose top level is broken: %j', (text, message) => {
    const error = caught(() => elements(text));
    expect(error).toBeInstanceOf(JsonLayoutError);
    expect((error as Error).message).toMatch(message);
  });
});
