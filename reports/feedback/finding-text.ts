import type { Finding } from '../../schemas/result.ts';
import { formatNumber, formatPoints, prettyUnit, printableMessage } from '../format.ts';
import type { FindingCard } from './finding-groups.ts';

/**
 * A finding's words as the sheet and the workspace print them: the checker's message with its numbers
 * and units formatted and every place it names in words, never as a path.
 */

/** A finding's place in words (the kind's), with sub/superscript markup. */
export type DescribePath = (path: string) => string;

// A place in a submission as the checker writes it: `runs[0].reported.k`, `points[2].k.unit`, `reported.<quantity>`.
const PATH = /\b(?:(?:runs|points)\[\d+\](?:\.[A-Za-z]+(?:\[\d+\])*)*|reported\.[A-Za-z]+(?:\.[A-Za-z]+)*)/g;

/** A checker message as a sheet or the page prints it: numbers, units and symbols formatted (sub/superscript markup), and any place it names in words. */
export function sheetMessage(message: string, describe: DescribePath): string {
  return printableMessage(message).replace(PATH, (path) => describe(path));
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
export const cardCodes = (f: Finding): string => [f.code, ...(f.alsoCodes ?? [])].join(' + ') + (f.detail ? ` (${printableMessage(f.detail)})` : '');

/** The one line for values that follow from the student's own earlier numbers at no cost. */
export function followsFromOwnText(findings: Finding[], place: DescribePath): string {
  const places = findings.map((f) => place(f.path));
  const list = places.length === 1 ? places[0] : `${places.slice(0, -1).join(', ')} and ${places[places.length - 1]}`;
  const verb = places.length === 1 ? 'follows' : 'follow';
  return `Follows from your own numbers: ${list} ${verb} correctly from your own earlier values, so the method earns its points; the difference was scored where it entered.`;
}
