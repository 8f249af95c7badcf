import { jsonErrorPosition } from './json-error-position.ts';

/** Where in a JSON file something is, as a person editing it counts: 1-based line and column. */
export const at = (line: number, column: number) => `at line ${line} column ${column}`;

/**
 * JSON.parse says `at position 57`, or for an unexpected token quotes the text around it; a person
 * editing the file wants the reason, the line and the column.
 */
export function filePosition(message: string, text: string, start: { line: number; column: number } = { line: 1, column: 1 }, skip = 0): string {
  const stated = /^(.*?) in JSON at position (\d+)/.exec(message);
  const reason = stated ? stated[1] : message.replace(/, (".*"|\.\.\.".*") is not valid JSON$/s, '');
  const position = stated ? Number(stated[2]) : jsonErrorPosition(text);
  if (position < 0) return reason;
  const before = text.slice(skip, Math.max(skip, position)).split('\n');
  const last = before[before.length - 1].length;
  return `${reason} ${at(start.line + before.length - 1, before.length === 1 ? start.column + last : last + 1)}`;
}

/**
 * The 1-based line on which each element of a top-level JSON array starts (none for any other
 * value), so that a problem with submission 3 of a file can name its line. One pass over text that
 * JSON.parse has already accepted: only strings and nesting need following.
 */
export function arrayElementLines(text: string): number[] {
  const lines: number[] = [];
  let [line, depth, inString, expectValue] = [1, 0, false, false];
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (c === '\n') line++;
    if (inString) {
      if (c === '\\') i++;
      else if (c === '"') inString = false;
      continue;
    }
    if (c === ' ' || c === '\t' || c === '\r' || c === '\n') continue;
    if (depth === 0 && c !== '[') return [];
    if (depth === 1 && expectValue && c !== ']') {
      lines.push(line);
      expectValue = false;
    }
    if (c === '"') inString = true;
    else if (c === '[' || c === '{') {
      depth++;
      if (depth === 1) expectValue = true;
    } else if (c === ']' || c === '}') depth--;
    else if (c === ',' && depth === 1) expectValue = true;
  }
  return lines;
}
