import type { DisplayPlace, DisplayStage, KindDisplay, SubmissionDisplay } from '../../schemas/display.ts';
import type { Finding } from '../../schemas/result.ts';
import type { FeedbackInput } from '../feedback-input.ts';
import { cardCounts, countsInWords, groupFindings } from '../feedback/finding-groups.ts';
import { cardWhere, followsFromOwnText, sheetMessage, valuesAt, type DescribePath } from '../feedback/finding-text.ts';
import { printableMessage } from '../format.ts';

/**
 * The workspace's student page as the sheet would say it: the findings one card per cause under each
 * stage, places in words, numbers formatted, and the kind's table and plots. Pure: data in, data out.
 */
export interface DisplayParts {
  describe: DescribePath;
  stages: ReadonlyArray<{ id: string; title: string }>;
  /** The kind's table and plots (for a checked result). */
  kindDisplay: (input: FeedbackInput) => KindDisplay;
}

function place(f: Finding, describe: DescribePath): DisplayPlace {
  return { findingId: f.id, code: f.code, path: f.path, place: describe(f.path), values: printableMessage(valuesAt(f).replace(/^: /, '')), pointsLost: f.pointsLost };
}

function stagesOf(findings: Finding[], parts: DisplayParts): DisplayStage[] {
  const groups = groupFindings(findings);
  // The kind's stages in its order; a finding of a stage the kind no longer names still shows, last.
  const known = new Set(parts.stages.map((s) => s.id));
  const others = [...new Set(findings.map((f) => f.stage))].filter((id) => !known.has(id)).map((id) => ({ id, title: id }));
  return [...parts.stages, ...others].flatMap((stage) => {
    const cards = groups.cards.filter((c) => c.members[0].stage === stage.id);
    const follows = groups.followsFromOwn.filter((f) => f.stage === stage.id);
    if (cards.length === 0 && follows.length === 0) return [];
    return [
      {
        id: stage.id,
        title: stage.title,
        cards: cards.map((card) => ({
          severity: card.severity,
          pointsLost: card.pointsLost,
          where: cardWhere(card, parts.describe),
          codes: [card.members[0].code, ...(card.members[0].alsoCodes ?? [])].join(' + '),
          detail: card.members[0].detail ? sheetMessage(card.members[0].detail, parts.describe) : '',
          message: sheetMessage(card.members[0].message, parts.describe),
          places: card.members.map((f) => place(f, parts.describe)),
        })),
        followsFromOwn: follows.length ? { text: followsFromOwnText(follows, parts.describe), places: follows.map((f) => place(f, parts.describe)) } : null,
      },
    ];
  });
}

/** A checked result's page. */
export function checkedDisplay(input: FeedbackInput, parts: DisplayParts): SubmissionDisplay {
  const findings = input.result.findings;
  return {
    counts: countsInWords(cardCounts(findings)),
    stages: stagesOf(findings, parts),
    rejected: [],
    ...parts.kindDisplay(input),
  };
}

/** A refused submission's page: each problem's place in words, nothing else to show. */
export function rejectedDisplay(rejected: ReadonlyArray<{ path: string; message: string }>, describe: DescribePath): SubmissionDisplay {
  return { counts: null, stages: [], rejected: rejected.map((r) => ({ place: describe(r.path), path: r.path, message: sheetMessage(r.message, describe) })), comparison: null, plots: [] };
}
