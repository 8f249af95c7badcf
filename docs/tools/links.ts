import { existsSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative } from 'node:path';

/** A heading's anchor as GitHub makes it: lower case, punctuation dropped, spaces as hyphens. */
export function slug(heading: string): string {
  return heading
    .trim()
    .toLowerCase()
    .replace(/[^\p{L}\p{N}\s_-]/gu, '')
    .replace(/\s/g, '-');
}

/** Text outside fenced code blocks and inline code, where a link can be a link. */
function prose(markdown: string): string {
  return markdown.replace(/^```[\s\S]*?^```/gm, '').replace(/`[^`\n]*`/g, '');
}

/** The anchors of a Markdown file's headings, a repeated one numbered as GitHub does (`-1`, `-2`). */
export function anchorsOf(markdown: string): Set<string> {
  const seen = new Map<string, number>();
  const anchors = new Set<string>();
  for (const match of markdown.replace(/^```[\s\S]*?^```/gm, '').matchAll(/^#{1,6}\s+(.+)$/gm)) {
    const base = slug(match[1]);
    const n = seen.get(base) ?? 0;
    seen.set(base, n + 1);
    anchors.add(n === 0 ? base : `${base}-${n}`);
  }
  return anchors;
}

/** The relative link targets of a Markdown text (links and images), without external URLs. */
export function relativeLinks(markdown: string): string[] {
  return [...prose(markdown).matchAll(/!?\[[^\]]*\]\(([^)\s]+)(?:\s+"[^"]*")?\)/g)]
    .map((m) => m[1])
    .filter((target) => !/^[a-z][a-z0-9+.-]*:/i.test(target));
}

/** Each relative link of `file` (a path from `root`) that leads nowhere: no such file, or no such heading. */
export function brokenLinks(root: string, file: string): string[] {
  const text = readFileSync(join(root, file), 'utf8');
  return relativeLinks(text).flatMap((target) => {
    const [path, anchor] = target.split('#');
    const resolved = path === '' ? join(root, file) : join(root, dirname(file), decodeURI(path));
    if (!existsSync(resolved)) return [`${file}: ${target} (no file ${relative(root, resolved)})`];
    if (anchor === undefined) return [];
    if (statSync(resolved).isDirectory() || !resolved.endsWith('.md')) return [`${file}: ${target} (an anchor into a file that has no headings)`];
    return anchorsOf(readFileSync(resolved, 'utf8')).has(anchor) ? [] : [`${file}: ${target} (no heading #${anchor})`];
  });
}
