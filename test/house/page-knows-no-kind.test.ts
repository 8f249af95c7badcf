import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { kindDescriptions } from '../../kinds/registry.ts';

/**
 * The page draws every kind from GET /v1/kinds: no file under web/ names a kind, its quantities or
 * their symbols. The words searched for are the registered kinds' own (ids, quantity ids of more than
 * one letter, symbols with markup) and the first kinds' vocabulary, written out by hand.
 */
const WEB = fileURLToPath(new URL('../../web', import.meta.url));

function filesUnder(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => (entry.isDirectory() ? filesUnder(join(dir, entry.name)) : [join(dir, entry.name)]));
}

// Hand-written: words of the two first kinds that a kind-blind page has no reason to hold.
const VOCABULARY = ['first-order-catalysis', 'temperature-dependence', 'catalyst', 'lnF', 'ln F', 'Arrhenius', 'Eyring', 'kobs', 'k_obs', 'x_inf'];

async function forbiddenWords(): Promise<string[]> {
  const kinds = await kindDescriptions();
  const own = kinds.flatMap((k) => [k.kind, ...k.quantities.map((q) => q.id).filter((id) => id.length > 1), ...k.quantities.map((q) => q.symbol).filter((s) => /[_^]\{/.test(s))]);
  return [...new Set([...VOCABULARY, ...own])];
}

/** Whole words only, so `kN` is not found inside `unknown`. */
const wordPattern = (word: string) => new RegExp(`(?<![A-Za-z0-9])${word.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}(?![A-Za-z0-9])`);

describe('the page knows no kind', () => {
  it('searches for the registered kinds’ ids and symbols among its words', async () => {
    const words = await forbiddenWords();
    // From the kinds' descriptions: their ids, `kN`, `Ea`, and symbols such as k_{obs}.
    expect(words).toEqual(expect.arrayContaining(['first-order-catalysis', 'temperature-dependence', 'kN', 'kA', 'Ea', 'dH', 'dS', 'k_{obs}', 'E_{a}']));
  });

  it('finds none of them in any file under web/', async () => {
    const words = await forbiddenWords();
    const found = filesUnder(WEB).flatMap((file) => {
      const text = readFileSync(file, 'utf8');
      return words.filter((w) => wordPattern(w).test(text)).map((w) => `${file.slice(WEB.length + 1)}: ${w}`);
    });
    expect(found).toEqual([]);
  });

  it('would find a kind’s symbol where one is written (the search bites)', () => {
    expect(wordPattern('kN').test("const SYMBOLS = { kN: 'k_{N}' };")).toBe(true);
    expect(wordPattern('kN').test('an unknown kind')).toBe(false);
    expect(wordPattern('k_{obs}').test('label: `k_{obs}`')).toBe(true);
  });
});
