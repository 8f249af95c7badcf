import { fileURLToPath } from 'node:url';
import { cruise, type ICruiseResult, type IViolation } from 'dependency-cruiser';
import extractDepcruiseOptions from 'dependency-cruiser/config-utl/extract-depcruise-options';
import { describe, expect, it } from 'vitest';

/**
 * The import map's rules (.dependency-cruiser.cjs): no circles, each layer importing only those below
 * it. The expected count of violations, zero, is the rule itself; the fixture shows the rules bite.
 */
const ROOT = fileURLToPath(new URL('../..', import.meta.url));

/** Violations in the tree at `baseDir`; the config says which of its folders are cruised. */
async function violationsIn(baseDir: string): Promise<IViolation[]> {
  const options = await extractDepcruiseOptions(`${ROOT}/.dependency-cruiser.cjs`);
  const { output } = await cruise(['.'], { ...options, validate: true, baseDir });
  return (output as ICruiseResult).summary.violations;
}

const described = (violations: IViolation[]) =>
  violations.map((v) => `${v.rule.name}: ${v.from} -> ${v.to}${v.cycle ? ` (circle: ${v.cycle.map((c) => c.name).join(' -> ')})` : ''}`);

describe('the import map', () => {
  it('has no circle and no import running back up a layer', async () => {
    const violations = await violationsIn(ROOT);
    if (violations.length > 0) console.log(described(violations).join('\n'));
    expect(described(violations)).toEqual([]);
  });

  it('refuses a checker that imports a report, and the circle it closes (a fixture made to break both rules)', async () => {
    const fixture = fileURLToPath(new URL('fixtures/back-up', import.meta.url));
    const rules = new Set((await violationsIn(fixture)).map((v) => v.rule.name));
    expect([...rules].sort()).toEqual(['checks-know-no-documents', 'no-circular', 'reports-draw-results-only']);
  });
});
