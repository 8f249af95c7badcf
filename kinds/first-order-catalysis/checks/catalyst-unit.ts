/**
 * Normality (equivalents per litre) is molarity for an acid that gives one H+ per formula unit, the
 * usual catalysts (HCl, HClO4); for H2SO4 it is twice the molarity. N, mN and uN are read as M, mM
 * and uM on that assumption, and a warning says so (common practice, no source).
 */
const NORMALITY = /^\s*([muµμ]?)N\s*$/;

/** The molar spelling a normality unit is read as, or undefined when the unit is not a normality. */
export function molarForNormality(unit: string): string | undefined {
  const m = NORMALITY.exec(unit);
  return m ? `${m[1]}M` : undefined;
}
