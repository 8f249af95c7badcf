import { describe, expect, it } from 'vitest';
import { footerLine } from '../../reports/pdf/document.ts';

// Widths counted as characters, so each expected line is checked by counting (worked by hand).
const chars = (text: string) => [...text].length;

describe('the footer line', () => {
  it('prints the title whole when it fits', () => {
    // "Sheet · S-1 · Short title" is 25 characters.
    expect(footerLine('Sheet · S-1', 'Short title', chars, 25)).toBe('Sheet · S-1 · Short title');
  });

  it('cuts a long title after its last whole word that fits, with an ellipsis, keeping what comes first', () => {
    // "Sheet · S-1 · " is 14 characters; room 40 leaves 26 for the title and "…":
    // "Acid-catalysed hydrolysis…" is 26; adding " first-order" would make 38.
    expect(footerLine('Sheet · S-1', 'Acid-catalysed hydrolysis first-order runs at four concentrations', chars, 40)).toBe('Sheet · S-1 · Acid-catalysed hydrolysis…');
    // Punctuation left at the cut is dropped: "Hydrolysis:" ends a word, the line reads "Hydrolysis…".
    expect(footerLine('Sheet', 'Hydrolysis: first-order runs', chars, 20)).toBe('Sheet · Hydrolysis…');
  });

  it('leaves the title out rather than cut its first word', () => {
    expect(footerLine('Sheet · S-1', 'Supercalifragilistic words', chars, 20)).toBe('Sheet · S-1');
  });
});
