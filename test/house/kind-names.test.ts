import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { registeredKinds } from '../../kinds/registry.ts';

/**
 * A kind is a folder (kinds/<kind>/): outside it and the registry, no code names a kind. The generic
 * folders, the page's (web/) among them, are searched for every registered kind's id and for symbols
 * only one kind has (test/house/page-knows-no-kind.test.ts searches web/ for the kinds' own words too).
 * schemas/json/ is left out: the registry writes it, one file per kind named by its id.
 */
const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const GENERIC = ['server', 'reports', 'schemas', 'web'];
const NOT_SEARCHED = /^schemas\/json\//;
// The kinds' symbols (rate-law constants, the two activation plots, the catalyst), as written in code and comments.
const SYMBOLS = ['kN', 'kA', 'Arrhenius', 'Eyring', 'catalyst'];

/** What may still name a kind, and why: the list is meant to shrink, never to grow. */
const ALLOWED: Record<string, string> = {};

function filesUnder(dir: string): string[] {
  return readdirSync(join(ROOT, dir), { withFileTypes: true }).flatMap((entry) => {
    const path = `${dir}/${entry.name}`;
    return entry.isDirectory() ? filesUnder(path) : /\.(ts|js|cjs|mjs|json|html|css)$/.test(entry.name) ? [path] : [];
  });
}

/** The registry's own files (kinds/*.ts) stand above every kind; only registry.ts lists them. */
const registryFiles = () => readdirSync(join(ROOT, 'kinds')).filter((name) => name.endsWith('.ts') && name !== 'registry.ts').map((name) => `kinds/${name}`);

describe('the names of kinds', () => {
  it('appear in no generic file: only in kinds/<kind>/ and the registry', () => {
    const ids = registeredKinds().map((k) => k.kind);
    expect(ids).toEqual(expect.arrayContaining(['first-order-catalysis', 'temperature-dependence']));
    const idPattern = new RegExp(ids.map((id) => id.replace(/-/g, '[-_ ]?')).join('|'), 'i');
    const symbolPattern = new RegExp(`\\b(${SYMBOLS.join('|')})\\b`);
    const names = (text: string) => idPattern.test(text) || symbolPattern.test(text);
    const naming = [...GENERIC.flatMap(filesUnder), ...registryFiles()]
      .filter((file) => !NOT_SEARCHED.test(file))
      .filter((file) => names(readFileSync(join(ROOT, file), 'utf8')))
      .map((file) => relative(ROOT, join(ROOT, file)))
      .sort();
    expect(naming).toEqual(Object.keys(ALLOWED).sort());
  });
});
