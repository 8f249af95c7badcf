/**
 * Where a JSON text first goes wrong, for the error messages V8 gives without a position ("Unexpected
 * token '}', ... is not valid JSON"). A plain recursive-descent reader of RFC 8259's grammar, run only
 * after JSON.parse has failed.
 */
export function jsonErrorPosition(text: string): number {
  let i = 0;
  const space = () => {
    while (i < text.length && ' \t\n\r'.includes(text[i])) i++;
  };
  const fail = (): never => {
    throw i;
  };
  const literal = (word: string) => {
    if (text.startsWith(word, i)) i += word.length;
    else fail();
  };
  const string = () => {
    i++;
    while (i < text.length && text[i] !== '"') {
      if (text.charCodeAt(i) < 0x20) fail();
      if (text[i] === '\\') {
        i++;
        if (text[i] === 'u') {
          if (!/^[0-9a-fA-F]{4}$/.test(text.slice(i + 1, i + 5))) fail();
          i += 4;
        } else if (!'"\\/bfnrt'.includes(text[i] ?? '')) fail();
      }
      i++;
    }
    if (i >= text.length) fail();
    i++;
  };
  const number = () => {
    const match = /^-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][-+]?\d+)?/.exec(text.slice(i, i + 400));
    if (!match) fail();
    i += match![0].length;
  };
  const value = (): void => {
    space();
    const c = text[i];
    if (c === '{') members('}', () => {
      space();
      if (text[i] !== '"') fail();
      string();
      space();
      if (text[i] !== ':') fail();
      i++;
      value();
    });
    else if (c === '[') members(']', value);
    else if (c === '"') string();
    else if (c === 't') literal('true');
    else if (c === 'f') literal('false');
    else if (c === 'n') literal('null');
    else number();
    space();
  };
  const members = (close: string, member: () => void) => {
    i++;
    space();
    if (text[i] === close) {
      i++;
      return;
    }
    for (;;) {
      member();
      space();
      if (text[i] === ',') i++;
      else if (text[i] === close) {
        i++;
        return;
      } else fail();
    }
  };
  try {
    value();
    if (i < text.length) fail();
    return -1;
  } catch (position) {
    if (typeof position === 'number') return position;
    throw position;
  }
}
