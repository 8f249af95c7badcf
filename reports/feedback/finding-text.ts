import type { Finding } from '../../schemas/result.ts';
import { formatNumber, formatPoints, prettyUnit, printableMessage } from '../format.ts';
import type { FindingCard } from './finding-groups.ts';

/**
 * A finding's words as the sheet and the workspace print them: the checker's message with its numbers
 * and units formatted and every place it names in words, never as a path.
 */

/** A finding's place in words (the kind's), with sub/superscript markup. */
export type DescribePath = (path: string) => string;

// A place in a submission as the checker writes it: `runs[0].reported.k`, `points[2].k.unit`, `reported.kN`.
const PATH = /\b(?:(?:runs|points)\[\d+\](?:\.[A-Za-z]+(?:\[\d+\])*)*|reported\.[A-Za-z]+(?:\.[A-Za-z]+)*)/g;

/** A place in words for running text (which has no sub/superscripts): `k_{obs}` reads `k_obs`, as the messages write it; `ΔH^{‡}` reads `ΔH‡`. */
export const placeInProse = (describe: DescribePath, path: string) =>
  describe(path)
    .replace(/\^\{([^}]*)\}/g, '$1')
    .replace(/_\{([^}]*)\}/g, '_$1');

/** No line break inside a number: the spaces either side of × and ± do not break (U+00A0). */
export const keepNumbersWhole = (text: string): string => text.replace(/ ([±×]) /g, '\u00a0$1\u00a0');

/** A checker message as the sheet prints it: numbers and units formatted, and any place it names in words. */
export function sheetMessage(message: string, describe: DescribePath): string {
  return keepNumbersWhole(printableMessage(message.replace(PATH, (path) => placeInProse(describe, path))));
}

// The symbols the checker's messages write in plain text, as the sheets' markup writes them.
const PROSE_SYMBOLS = /\b([kxE])_(obs|N|A|a|inf|0|t)\b/g;

/**
 * A checker message for a page, which has sub/superscripts in running text: as the sheet prints it,
 * with places and symbols in markup (`k_obs` → `k_{obs}`, `x_inf` → `x_{∞}`).
 */
export function richMessage(message: string, describe: DescribePath): string {
  const marked = (text: string) => text.replace(PROSE_SYMBOLS, (_, base: string, sub: string) => `${base}_{${sub === 'inf' ? '∞' : sub}}`);
  // Places are put in after the symbols, so that markup in a place is not read twice.
  const parts = message.split(PATH);
  const places = message.match(PATH) ?? [];
  return keepNumbersWhole(printableMessage(parts.map((part, i) => marked(part) + (i < places.length ? describe(places[i]) : '')).join('')));
}

/** The values behind a further place of a card, where the checker gave them. */
export function valuesAt(f: Finding): string {
  if (typeof f.reported !== 'number' || typeof f.expected !== 'number') return '';
  const unit = f.unit ? ` ${prettyUnit(f.unit)}` : '';
  return `: yours ${formatNumber(f.reported)}${unit}, the refit ${formatNumber(f.expected)}${unit}`;
}

export const pointsWord = (points: number) => `${formatPoints(points)} ${points === 1 ? 'point' : 'points'}`;

export function pointsText(points: number): string {
  return points > 0 ? `−${pointsWord(points)}` : 'no points lost';
}

/** A card's headline place: where the cause first shows, and how many more places. */
export function cardWhere(card: FindingCard, describe: DescribePath): string {
  const [first, ...others] = card.members;
  return others.length === 0 ? describe(first.path) : `${describe(first.path)} and ${others.length} more ${others.length === 1 ? 'place' : 'places'}`;
}

/** The code, the codes found with it, and its detail: `log-base + sign-flipped (transposed-digits)`. */
export const cardCodes = (f: Finding): string => [f.code, ...(f.alsoCodes ?? [])].join(' + ') + (f.detail ? ` (${f.detail})` : '');

/** The one line for values that follow from the student's own earlier numbers at no cost. */
export function followsFromOwnText(findings: Finding[], place: DescribePath): string {
  const places = findings.map((f) => place(f.path));
  const list = places.length === 1 ? places[0] : `${places.slice(0, -1).join(', ')} and ${places[places.length - 1]}`;
  const verb = places.length === 1 ? 'follows' : 'follow';
  return `Follows from your own numbers: ${list} ${verb} correctly from your own earlier values, so the method earns its points; the difference was scored where it entered.`;
}
