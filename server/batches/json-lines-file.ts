import { createReadStream } from 'node:fs';
import { createInterface } from 'node:readline';

/** The values of a file of JSON lines, one at a time: the text and the values are never all in memory together. */
export async function* jsonLinesOf<T>(path: string): AsyncGenerator<T> {
  for await (const line of createInterface({ input: createReadStream(path), crlfDelay: Infinity })) yield JSON.parse(line) as T;
}
