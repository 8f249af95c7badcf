import type { FeedbackHeader } from './feedback-input.ts';

/**
 * File names for per-student documents: `<id>.pdf`. Ids are constrained by the schema (letters,
 * digits, `.`, `_`, `-`), but a name is made safe here anyway: any other character becomes `_`, a
 * leading dot is dropped, and a repeated name gets `-2`, `-3`, ... before its extension.
 */
// Most file systems take 255 bytes; a document name is ASCII, with room left for `-2` and the extension.
const NAME_LENGTH = 240;

export function safeFileName(name: string, extension = '.pdf'): string {
  const base = name.endsWith(extension) ? name.slice(0, -extension.length) : name;
  const safe = base.replace(/[^A-Za-z0-9._-]/g, '_').replace(/^\.+/, '').slice(0, NAME_LENGTH) || 'unnamed';
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

/** The longest part a document name keeps of each name it is made from. */
const PART_LENGTH = 60;

/**
 * One part of a document's name: runs of characters other than letters, digits, `.`, `_` and `-`
 * become one `_`, and `_`, `.`, `-` at either end are dropped. With `ascii`, accents are taken off
 * first and only ASCII letters count (for the plain `filename=`); without, any script's letters stay
 * (for RFC 6266's `filename*`).
 */
function namePart(text: string, ascii: boolean): string {
  const letters = ascii ? text.normalize('NFKD').replace(/[\u0300-\u036f]/g, '') : text.normalize('NFC');
  const unsafe = ascii ? /[^A-Za-z0-9._-]+/g : /[^\p{L}\p{N}._-]+/gu;
  const trimmed = [...letters.replace(unsafe, '_').replace(/^[._-]+|[._-]+$/g, '')];
  if (trimmed.length <= PART_LENGTH) return trimmed.join('') || 'unnamed';
  // A long part is cut after a whole word where one ends in its second half, else at the limit.
  const cut = trimmed.slice(0, PART_LENGTH + 1).join('');
  const wordEnd = cut.lastIndexOf('_');
  return (wordEnd >= PART_LENGTH / 2 ? cut.slice(0, wordEnd) : [...cut].slice(0, PART_LENGTH).join('')).replace(/[._-]+$/, '') || 'unnamed';
}

/**
 * A downloaded document's name, said by what it is for: `<course>-<section>-<assignment>-gradebook.csv`,
 * or with the student's id and version before the last word for a sheet. `ascii` is the name every
 * client can save; `unicode` keeps letters such as é, for clients that read `filename*`.
 */
export function documentName(parts: readonly string[], what: string, extension: string): { ascii: string; unicode: string } {
  const join = (ascii: boolean) => `${[...parts.map((p) => namePart(p, ascii)), what].join('-')}${extension}`;
  return { ascii: join(true), unicode: join(false) };
}

/** A student's sheet as it downloads alone and as it is named in the section's ZIP: `<course>-<section>-<assignment>-<id>-v<version>-feedback.pdf`. */
export function sheetDocumentName(header: Pick<FeedbackHeader, 'course' | 'section' | 'assignment' | 'studentId' | 'version'>): { ascii: string; unicode: string } {
  return documentName([header.course, header.section, header.assignment, header.studentId, `v${header.version}`], 'feedback', '.pdf');
}
