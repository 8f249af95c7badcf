import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';

/**
 * `npm ci` warns (EBADENGINE) for every installed package whose `engines.node` range the running Node
 * does not satisfy; npm decides with semver's `satisfies`, prereleases included (npm-install-checks,
 * github.com/npm/npm-install-checks, lib/index.js `checkEngine`). Run on each Node the suite runs on
 * (20, 22, 24), this says `npm ci` warns of nothing there. The two packages whose newest releases want
 * Node 22 are held back for their one parent each by `overrides` (docs/operations.md, Node versions).
 */
const lock = JSON.parse(readFileSync(new URL('../../package-lock.json', import.meta.url), 'utf8')) as {
  packages: Record<string, { version?: string; engines?: { node?: string } | string[] }>;
};
const satisfies = createRequire(import.meta.url)('semver/functions/satisfies') as (version: string, range: string, options: { includePrerelease: boolean }) => boolean;

describe('the Node engines of the locked packages', () => {
  it(`are all satisfied by this Node (${process.version}): npm ci prints no engine warning`, () => {
    const unmet = Object.entries(lock.packages)
      .filter(([path, p]) => path && p.engines && !Array.isArray(p.engines) && p.engines.node)
      .filter(([, p]) => !satisfies(process.version, (p.engines as { node: string }).node, { includePrerelease: true }))
      .map(([path, p]) => `${path.replace(/^.*node_modules\//, '')}@${p.version} wants node ${(p.engines as { node: string }).node}`);
    expect(unmet).toEqual([]);
  });
});
