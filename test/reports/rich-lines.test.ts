import { describe, expect, it } from 'vitest';
import { createDocument } from '../../reports/pdf/document.ts';
import { richLines, unbreakablePieces } from '../../reports/pdf/rich-lines.ts';

// Hand-written pieces: where a reader expects a line may break, and where not.
describe('line breaking of running text', () => {
  it('keeps a quantity whole: number, ± and ×, its unit and the unit’s powers', () => {
    expect(unbreakablePieces('the refit (87.2 kJ mol⁻¹) and 1.9 × 10⁻⁷ s⁻¹, 0.03 ± 0.002 M')).toEqual(['the', 'refit', '(87.2 kJ mol⁻¹)', 'and', '1.9 × 10⁻⁷ s⁻¹,', '0.03 ± 0.002 M']);
  });

  it('never breaks inside markup', () => {
    expect(unbreakablePieces('x_{a b} then k_{obs}')).toEqual(['x_{a b}', 'then', 'k_{obs}']);
  });

  it('wraps at the other spaces, and cuts a word longer than a line', () => {
    const doc = createDocument({ title: 'lines', date: new Date(0) });
    const lines = richLines(doc, `Your value matches the refit (87.2 kJ mol⁻¹) with the sign reversed ${'x'.repeat(80)}`, 120, 9, false, true);
    expect(lines.length).toBeGreaterThan(3);
    expect(lines.some((l) => l.includes('(87.2 kJ mol⁻¹)'))).toBe(true);
    expect(lines.join('').replace(/ /g, '')).toBe(`Yourvaluematchestherefit(87.2kJmol⁻¹)withthesignreversed${'x'.repeat(80)}`);
  });
});
