import { describe, expect, it } from 'vitest';

// The page's modules are plain JavaScript typed for the browser (tsconfig.web.json): loaded by address, typed here by hand.
const page = (file: string) => import(new URL(`../../web/js/${file}`, import.meta.url).href);
const { fieldWords } = (await page('student-submit.js')) as { fieldWords: (path: string) => string };
const { parseBlock } = (await page('value-grid.js')) as { parseBlock: (text: string) => string[][] };

/**
 * The students' hand-in page reads what a spreadsheet puts on the clipboard and names a refused
 * field in words. Expected values hand-worked from the inputs.
 */
describe('a pasted block', () => {
  it('splits on tabs when it holds one, with CRLF line ends, and trims each cell', () => {
    expect(parseBlock('run\tt\tx\r\n0.05 M\t0\t 23.305\r\n0.05 M\t1\t22.931')).toEqual([
      ['run', 't', 'x'],
      ['0.05 M', '0', '23.305'],
      ['0.05 M', '1', '22.931'],
    ]);
  });

  it('splits on commas otherwise, a quoted cell keeping its comma, line break and doubled quote', () => {
    expect(parseBlock('a,"b, c",d\n"say ""x""","two\nlines",')).toEqual([
      ['a', 'b, c', 'd'],
      ['say "x"', 'two\nlines', ''],
    ]);
  });

  it('keeps a decimal comma inside a tab-separated block as part of its cell', () => {
    expect(parseBlock('0,05\t1,5')).toEqual([['0,05', '1,5']]);
  });
});

describe('a refused field in words', () => {
  it('counts from 1 and names each list by one of its items', () => {
    expect(fieldWords('runs[0].readings[2][0]')).toBe('run 1, reading 3, item 1');
    expect(fieldWords('body.quantities[1].value')).toBe('quantity 2, value');
    expect(fieldWords('reported.kA')).toBe('reported, kA');
  });

  it('leaves a path without lists as it is, and the body itself as nothing to name', () => {
    expect(fieldWords('studentId')).toBe('studentId');
    expect(fieldWords('body')).toBe('');
  });
});
