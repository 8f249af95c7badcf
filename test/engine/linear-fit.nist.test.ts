import { describe, expect, it } from 'vitest';
import { fitLine, fitThroughOrigin, type LineFit } from '../../server/engine/linear-fit.ts';
import { listedSums, lre, readStrd, sha256Of } from '../support/nist-strd.ts';

// Certified values: NIST Statistical Reference Datasets (StRD), Linear Least Squares Regression,
// datasets Norris (straight line), NoInt1 and NoInt2 (line through the origin). The files are kept
// in test/reference/nist-strd/ as NIST publishes them.
const MIN_LRE = 12;

function lreTable(fit: LineFit, name: string, withIntercept: boolean): Record<string, number> {
  const { certified } = readStrd(name);
  const table: Record<string, number> = {
    B1: lre(fit.slope, certified.params.B1.estimate),
    'sd(B1)': lre(fit.seSlope, certified.params.B1.sd),
    'residual SD': lre(fit.residualSD, certified.residualSD),
    'R-squared': lre(fit.rSquared, certified.rSquared),
  };
  if (withIntercept) {
    table.B0 = lre(fit.intercept, certified.params.B0.estimate);
    table['sd(B0)'] = lre(fit.seIntercept, certified.params.B0.sd);
  }
  return table;
}

describe('straight-line fits against NIST StRD certified values', () => {
  it('reads the datasets byte for byte as published (SHA-256 as listed beside them)', () => {
    const sums = listedSums();
    expect(Object.keys(sums).sort()).toEqual(['NoInt1', 'NoInt2', 'Norris']);
    for (const [name, sum] of Object.entries(sums)) expect(sha256Of(name)).toBe(sum);
  });

  it('Norris (y = B0 + B1 x, 36 observations): LRE >= 12 on every certified value', () => {
    const { x, y } = readStrd('Norris');
    const fit = fitLine(x, y);
    const table = lreTable(fit, 'Norris', true);
    console.log('Norris LRE', table);
    expect(fit.dof).toBe(34);
    for (const value of Object.values(table)) expect(value).toBeGreaterThanOrEqual(MIN_LRE);
  });

  it.each(['NoInt1', 'NoInt2'])('%s (y = B1 x): LRE >= 12 on every certified value, uncentred R-squared', (name) => {
    const { x, y } = readStrd(name);
    const fit = fitThroughOrigin(x, y);
    const table = lreTable(fit, name, false);
    console.log(`${name} LRE`, table);
    expect(fit.dof).toBe(x.length - 1);
    for (const value of Object.values(table)) expect(value).toBeGreaterThanOrEqual(MIN_LRE);
  });
});
