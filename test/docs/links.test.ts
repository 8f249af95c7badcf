import { mkdtempSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { anchorsOf, brokenLinks, relativeLinks, slug } from '../../docs/tools/links.ts';
import { markdownFiles, repoRoot } from '../../docs/tools/regenerate.ts';

describe('links in the README and docs/', () => {
  it('every relative link leads to a file that exists, and every anchor to a heading in it', () => {
    const broken = markdownFiles().flatMap((file) => brokenLinks(repoRoot, file));
    expect(broken).toEqual([]);
  });

  it('the README is a front page: under 10 KB, linking into docs/', () => {
    const files = markdownFiles();
    expect(files).toContain('docs/api.md');
    // Common practice, no source: the project's own limit for its front page.
    expect(statSync(`${repoRoot}README.md`).size).toBeLessThan(10 * 1024);
  });
});

describe('how links and anchors are read (hand-written cases, as GitHub renders them)', () => {
  it('makes anchors from headings as GitHub does', () => {
    expect(slug("Changing an assignment's settings: PUT and PATCH")).toBe('changing-an-assignments-settings-put-and-patch');
    expect(slug('The `check` command')).toBe('the-check-command');
    expect(slug('Overrides: the books of a result')).toBe('overrides-the-books-of-a-result');
    expect([...anchorsOf('# A\n## Tests\n```\n# not a heading\n```\n### Tests\n')]).toEqual(['a', 'tests', 'tests-1']);
  });

  it('finds links and images outside code, and leaves external ones out', () => {
    const text = 'See [a](a.md#x) and ![p](p.png "title"), [web](https://example.org), `[no](code.md)`\n```\n[no](block.md)\n```\n';
    expect(relativeLinks(text)).toEqual(['a.md#x', 'p.png']);
  });

  it('names a link to a missing file and one to a missing heading', () => {
    const root = mkdtempSync(join(tmpdir(), 'rateproof-links-'));
    writeFileSync(join(root, 'a.md'), '[ok](b.md#y) [gone](c.md) [no heading](b.md#x) [here](#a)\n# A\n');
    writeFileSync(join(root, 'b.md'), '# Y\n');
    expect(brokenLinks(root, 'a.md')).toEqual(['a.md: c.md (no file c.md)', 'a.md: b.md#x (no heading #x)']);
  });
});
