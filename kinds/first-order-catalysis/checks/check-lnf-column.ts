import type { Settings, SubmittedRun } from '../schemas.ts';
import type { FindingCode } from '../schemas.ts';
import { likelyCause } from '../../../server/checks/cause-text.ts';
import { firstOrderCauses } from './causes.ts';
import { slipBetween } from '../../../server/checks/digit-slips.ts';
import type { DraftFinding } from '../../../server/checks/draft-finding.ts';
import { LN10 } from '../../../server/checks/explain.ts';
import { fmt } from '../../../server/checks/format.ts';
import { withinTolerance } from '../../../server/checks/tolerance.ts';
import type { RunAnalysis } from './run-analysis.ts';
import { infinityAlternatives, lnFEntryWith, lnFWith, WRONG_INFINITY, type InfinityAlternative } from './slip-values.ts';

/** The student's ln F column as numbers (NaN where blank), and whether a slip made it differ from ours. */
export interface LnFColumn {
  values: number[];
  wrong: boolean;
}

/** A column a slip makes: a base column (ours, or with another x_inf), its sign flipped or not, over 1 or ln 10. */
interface Scaling {
  sign: 1 | -1;
  divisor: number;
}

interface ColumnVariant extends Scaling {
  base: number[];
  causes: FindingCode[];
  alternative?: InfinityAlternative;
}

// Both slips at once only on our own column: three causes are past what a finding names.
const SCALINGS: Array<Scaling & { causes: FindingCode[]; alone?: true }> = [
  { sign: 1, divisor: 1, causes: [] },
  { sign: 1, divisor: LN10, causes: ['log-base'] },
  { sign: -1, divisor: 1, causes: ['sign-flipped'] },
  { sign: -1, divisor: LN10, causes: ['sign-flipped', 'log-base'], alone: true },
];

const ALTERNATIVE_SCALINGS = SCALINGS.filter((s) => !s.alone);

const scaled = (v: number, s: Scaling) => (s.sign * v) / s.divisor;

/**
 * The columns made by the common slips (log10, a flipped sign, another x_inf, and pairs of them) that
 * match the student's at every filled entry. Dozens of x_inf are tried: one is looked at only where its
 * entry at `probe` (an entry the student filled) matches there in some scaling.
 */
function matchingVariants(a: RunAnalysis, all: RunAnalysis[], student: number[], settings: Settings): ColumnVariant[] {
  const out: ColumnVariant[] = [];
  const tryBase = (base: number[], alternative?: InfinityAlternative) => {
    for (const s of alternative ? ALTERNATIVE_SCALINGS : SCALINGS) {
      if (!matches(student, base, s, settings)) continue;
      out.push({ base, sign: s.sign, divisor: s.divisor, causes: alternative ? [WRONG_INFINITY, ...s.causes] : s.causes, alternative });
    }
  };
  tryBase(a.transform!.lnF);
  const probe = student.findIndex((v, i) => i > 0 && Number.isFinite(v));
  for (const alternative of infinityAlternatives(a, all)) {
    if (probe >= 0) {
      const entry = lnFEntryWith(a, alternative.value)(probe);
      if (!ALTERNATIVE_SCALINGS.some((s) => entryMatches(student[probe], scaled(entry, s), settings))) continue;
    }
    tryBase(lnFWith(a, alternative.value), alternative);
  }
  return out;
}

/** A filled entry against the variant's. */
const entryMatches = (s: number, v: number, settings: Settings) => Number.isFinite(v) && withinTolerance(s, v, settings.tolerances.lnF);

/** Every entry the student filled matches the variant (a blank only where the variant is undefined too). */
function matches(student: number[], variant: number[], scaling: Scaling, settings: Settings): boolean {
  return student.every((s, i) => {
    const v = scaled(variant[i], scaling);
    return Number.isNaN(s) ? !Number.isFinite(v) || i === 0 : entryMatches(s, v, settings);
  });
}

/** Sum of squared differences over the entries both columns have. */
function distance(student: number[], variant: ColumnVariant): number {
  return student.reduce((sum, s, i) => {
    const v = scaled(variant.base[i], variant);
    return Number.isFinite(s) && Number.isFinite(v) ? sum + (s - v) ** 2 : sum;
  }, 0);
}

export function checkLnFColumn(run: SubmittedRun, a: RunAnalysis, all: RunAnalysis[], settings: Settings, drafts: DraftFinding[]): LnFColumn | undefined {
  const path = `${a.path}.reported.lnF`;
  const column = run.reported?.lnF;
  const points = settings.rubric.lnF;
  const common = { stage: 'run' as const, rubricItem: 'lnF', itemKey: `lnF@${a.path}` };
  // Without x_inf there is no ln F to make: no column is asked for, and none is checked.
  if (a.infinity === undefined) return undefined;
  if (!column) {
    if (points > 0) {
      drafts.push({ ...common, code: 'missing-value', path, severity: 'error', charge: points, message: `The ln F column of run "${a.label}" is missing.` });
    }
    return undefined;
  }
  if (!a.transform) return undefined;
  if (column.length !== a.readings.length) {
    drafts.push({
      ...common,
      code: 'unexplained',
      path,
      severity: 'error',
      charge: points,
      message: `The ln F column of run "${a.label}" has ${column.length} entries for ${a.readings.length} readings, so it cannot be compared row by row. Please give one ln F per reading.`,
    });
    return { values: column.map((v) => (v === null ? Number.NaN : Number(v))), wrong: true };
  }
  const values = column.map((v) => (v === null ? Number.NaN : Number(v)));
  const ours = a.transform.lnF;
  // Most columns are right: the slip variants are made only for one that is not.
  if (matches(values, ours, SCALINGS[0], settings)) return { values, wrong: false };
  // The fewest causes, then the closest column: x_inf variants a few thousandths apart can both pass.
  const found = matchingVariants(a, all, values, settings).sort((x, y) => x.causes.length - y.causes.length || distance(values, x) - distance(values, y))[0];
  if (found && found.causes.length === 0) return { values, wrong: false };
  if (found) {
    const [code, ...also] = found.causes;
    const detail = found.alternative?.detail;
    const j = values.findIndex((v, i) => i > 0 && Number.isFinite(v));
    drafts.push({
      ...common,
      code,
      alsoCodes: also.length ? also : undefined,
      detail,
      path,
      reported: values[j],
      expected: ours[j],
      severity: 'error',
      charge: points,
      message:
        `The ln F column of run "${a.label}" differs from ln F computed from your readings throughout ` +
        `(at t = ${fmt(a.times[j])}: ${fmt(values[j])} against ${fmt(ours[j])}). ${likelyCause(firstOrderCauses, found.causes, detail ? [detail] : [])}`,
    });
    return { values, wrong: true };
  }
  // No column-wide slip: name the entries that are off, each a slip of its own.
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (Number.isNaN(v) ? i === 0 : withinTolerance(v, ours[i], settings.tolerances.lnF)) continue;
    const slip = Number.isNaN(v) ? undefined : slipBetween(ours[i], v, 4);
    drafts.push({
      ...common,
      code: Number.isNaN(v) ? 'missing-value' : 'unexplained',
      detail: slip,
      path: `${path}[${i}]`,
      reported: Number.isNaN(v) ? null : v,
      expected: ours[i],
      severity: 'error',
      charge: points,
      message: Number.isNaN(v)
        ? `ln F at t = ${fmt(a.times[i])} in run "${a.label}" is blank; from your readings it is ${fmt(ours[i])}.`
        : `ln F at t = ${fmt(a.times[i])} in run "${a.label}" is ${fmt(v)}; from your readings it is ${fmt(ours[i])}.` +
          (slip ? ` It looks like a copying slip (${slip.replace('-', ' ')}), a guess to check.` : ' Please recompute this entry.'),
    });
  }
  return { values, wrong: true };
}
