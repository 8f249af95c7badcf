/**
 * File names for per-student documents: `<id>.pdf`. Ids are constrained by the schema (letters,
 * digits, `.`, `_`, `-`), but a name is made safe here anyway: any other character becomes `_`, a
 * leading dot is dropped, and a repeated name gets `-2`, `-3`, ... before its extension.
 */
export function safeFileName(name: string, extension = '.pdf'): string {
  const base = name.endsWith(extension) ? name.slice(0, -extension.length) : name;
  const safe = base.replace(/[^A-Za-z0-9._-]/g, '_').replace(/^\.+/, '').slice(0, 100) || 'unnamed';
  return `${safe}${extension}`;
}

/** Hands out each name once: the second `S-001.pdf` becomes `S-001-2.pdf`. */
export class UniqueNames {
  private readonly taken = new Set<string>();

  take(name: string, extension = '.pdf'): string {
    const safe = safeFileName(name, extension);
    const stem = safe.slice(0, -extension.length);
    let candidate = safe;
    for (let n = 2; this.taken.has(candidate.toLowerCase()); n++) candidate = `${stem}-${n}${extension}`;
    this.taken.add(candidate.toLowerCase());
    return candidate;
  }
}
