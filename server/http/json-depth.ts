/**
 * How deeply a JSON text nests arrays and objects, read from the text before it is parsed. Every body
 * the API reads nests a few levels (a batch: array, submission, runs, run, readings, reading); a body
 * nested thousands deep is refused, since copying or hashing it would exhaust the stack.
 */
export const MAX_JSON_DEPTH = 64;

export function jsonDepth(text: string): number {
  let depth = 0;
  let deepest = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (inString) {
      if (c === 0x5c) i++;
      else if (c === 0x22) inString = false;
    } else if (c === 0x22) inString = true;
    else if (c === 0x5b || c === 0x7b) {
      if (++depth > deepest) deepest = depth;
    } else if (c === 0x5d || c === 0x7d) depth--;
  }
  return deepest;
}
