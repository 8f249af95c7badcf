import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { fillMarkers, sectionsIn } from './markers.ts';
import { generatedSections } from './sections.ts';

export const repoRoot = fileURLToPath(new URL('../../', import.meta.url));

/** README.md and every Markdown file under docs/, as paths from the repository's root. */
export function markdownFiles(): string[] {
  const under = (dir: string): string[] =>
    readdirSync(join(repoRoot, dir), { withFileTypes: true }).flatMap((entry) => {
      const path = `${dir}/${entry.name}`;
      if (entry.isDirectory()) return under(path);
      return entry.name.endsWith('.md') ? [path] : [];
    });
  return ['README.md', ...under('docs')].map((p) => relative(repoRoot, join(repoRoot, p)));
}

export interface Regenerated {
  file: string;
  current: string;
  fresh: string;
}

/** Each Markdown file with generated parts, as it is and as the generators would write it. */
export async function regenerate(): Promise<Regenerated[]> {
  const files = markdownFiles()
    .map((file) => ({ file, current: readFileSync(join(repoRoot, file), 'utf8') }))
    .filter(({ current }) => sectionsIn(current).length > 0);
  const sections = await generatedSections();
  return files.map(({ file, current }) => ({ file, current, fresh: fillMarkers(current, sections, file) }));
}
