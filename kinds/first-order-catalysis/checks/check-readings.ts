import type { RunData, Settings, SubmittedRun } from '../schemas.ts';
import type { DraftFinding } from '../../../server/checks/draft-finding.ts';
import { fmt } from '../../../server/checks/format.ts';
import { molarForNormality } from './catalyst-unit.ts';
import { findSuspectReading, poolScatters, robustScatter, runScatter, type SuspectReading } from './suspect-readings.ts';
import { compareTables, type TableSlip } from '../../../server/checks/transcription.ts';
import type { RunAnalysis } from './run-analysis.ts';

const slipWords: Record<string, string> = {
  'transposed-digits': 'two neighbouring digits swapped',
  'dropped-digit': 'a digit left out',
  'extra-digit': 'a digit added',
  'decimal-point': 'the decimal point moved',
  'sign-lost': 'the sign changed',
  other: 'a difference that is not a single copying slip',
};

/** The class run a student's run is a copy of: the same label, else the same position. */
function classRunFor(run: SubmittedRun, index: number, classRuns: RunData[]): RunData | undefined {
  return classRuns.find((c) => c.label === run.label) ?? classRuns[index];
}

function transcriptionDraft(slip: TableSlip, a: RunAnalysis, charge: number): DraftFinding {
  const common = { code: 'transcription' as const, stage: 'readings' as const, rubricItem: 'readings', itemKey: `readings@${a.path}`, severity: 'error' as const, charge, detail: slip.detail };
  const run = `run "${a.label}"`;
  switch (slip.kind) {
    case 'cell': {
      const column = slip.column === 0 ? 'time' : 'reading';
      return {
        ...common,
        path: `${a.path}.readings[${slip.row}]`,
        reported: slip.copy,
        expected: slip.original,
        message: `In ${run}, row ${slip.row + 1}, the ${column} is ${slip.copy} where the class data have ${slip.original}: ${slipWords[slip.detail] ?? slip.detail}. This looks like a copying slip; please check it against the data sheet. Later values were checked against your own copy, so it is scored only here.`,
      };
    }
    case 'table':
      return { ...common, path: `${a.path}.readings`, message: `The readings of ${run} differ from the class data in several places that no single copying slip explains. Please check the table against the data sheet.` };
    default: {
      const what = { 'row-shift': 'the readings appear moved one row against their times', 'missing-row': 'a row appears to be missing', 'extra-row': 'a row appears to be added' }[slip.kind];
      return {
        ...common,
        path: `${a.path}.readings`,
        message: `In ${run}, from row ${slip.row + 1} on, ${what} compared with the class data. Please check the table against the data sheet; later values were checked against your own copy, so it is scored only here.`,
      };
    }
  }
}

// No solution is more concentrated than pure water, about 55 M (common practice, no source): a catalyst
// beyond 100 M, or below zero, is a slip in the value or its unit.
const MAX_CONCENTRATION_M = 100;

export function checkReadings(run: SubmittedRun, a: RunAnalysis, analyses: RunAnalysis[], settings: Settings, drafts: DraftFinding[]): void {
  if (!(a.concentrationM >= 0 && a.concentrationM <= MAX_CONCENTRATION_M)) {
    drafts.push({
      code: 'implausible',
      stage: 'readings',
      path: `${a.path}.catalyst.value`,
      reported: run.catalyst.value,
      severity: 'error',
      charge: 0,
      message: `The catalyst concentration of run "${a.label}" is ${fmt(run.catalyst.value)} ${run.catalyst.unit}, which no solution can have (none is more concentrated than about 55 M); the rate law fitted from it means nothing. Please check the value and its unit.`,
    });
  }
  const molar = molarForNormality(run.catalyst.unit);
  if (molar) {
    drafts.push({
      code: 'unit-assumed',
      stage: 'readings',
      path: `${a.path}.catalyst.unit`,
      severity: 'warning',
      charge: 0,
      message: `The catalyst concentration of run "${a.label}" is given in ${run.catalyst.unit.trim()} (normality); it was read as ${molar}, which holds for an acid that gives one H+ per formula unit (HCl, HClO4) but not for H2SO4, where it is twice the molarity. If that is not your acid, please give the concentration in ${molar}.`,
    });
  }
  if (a.undetermined) {
    drafts.push({ code: 'implausible', stage: 'readings', path: a.undetermined.path, severity: 'warning', charge: 0, message: a.undetermined.message });
  }
  const before = drafts.length;
  compareReadings(run, a, analyses, settings, drafts);
  const named = new Set(drafts.slice(before).map((d) => d.path));
  const pastWithinNoise = withinScatterOfInfinity(a);
  for (const i of a.excluded) {
    const path = `${a.path}.readings[${i}]`;
    if (named.has(path) || pastWithinNoise(a.readings[i])) continue;
    drafts.push({
      code: 'suspect-reading',
      stage: 'readings',
      path,
      reported: a.readings[i],
      severity: 'warning',
      charge: 0,
      message: `In run "${a.label}", the reading at t = ${fmt(a.times[i])} (${a.readings[i]}) is on the other side of x_inf = ${a.infinity} from x_0, so ln F is undefined there; the refit leaves it out. Please check the reading and x_inf.`,
    });
  }
}

/** Past x_inf by less than this many SDs of the run's scatter, a reading is the plateau's own noise. */
const PAST_INFINITY_SDS = 3;

/**
 * Whether a reading past x_inf is only the plateau's scatter: a run read until it stops changing has
 * readings on both sides of its end value, and one past it by a few SDs is no slip (the refit still
 * leaves it out, ln F being undefined there). The scatter is the run's own about the curve with x_inf
 * fitted; without that fit every reading past x_inf is named.
 */
function withinScatterOfInfinity(a: RunAnalysis): (reading: number) => boolean {
  const scatter = a.ownEndValue ? robustScatter(a.ownEndValue.residuals) : Number.NaN;
  const infinity = a.infinity;
  if (!(scatter > 0) || infinity === undefined) return () => false;
  return (reading) => Math.abs(reading - infinity) <= PAST_INFINITY_SDS * scatter;
}

/** How a suspect reading is off: far from the curve, or turning the run back where it is named for that. */
function whereOff(suspect: SuspectReading): string {
  if (!suspect.turnsBack) return 'lies far from the curve through the other readings';
  const { against, runRises } = suspect.turnsBack;
  const run = runRises ? 'rise' : 'fall';
  const back = runRises ? 'lower' : 'higher';
  const how = against === 'before' ? `it is ${back} than the reading before it` : `the reading after it is ${back}`;
  return `turns the run back: the readings ${run}, but ${how}, and it lies off the curve through the other readings`;
}

function compareReadings(run: SubmittedRun, a: RunAnalysis, analyses: RunAnalysis[], settings: Settings, drafts: DraftFinding[]): void {
  const classRuns = settings.classDataset?.runs;
  if (classRuns) {
    const original = classRunFor(run, a.index, classRuns);
    if (!original) return;
    const charge = settings.rubric.readings;
    for (const slip of compareTables(original.readings, run.readings)) drafts.push(transcriptionDraft(slip, a, charge));
    if (original.infinity !== undefined && run.infinity !== undefined && original.infinity !== run.infinity) {
      drafts.push({
        code: 'transcription',
        stage: 'readings',
        path: `${a.path}.infinity`,
        rubricItem: 'readings',
        itemKey: `readings@${a.path}`,
        severity: 'error',
        charge,
        reported: run.infinity,
        expected: original.infinity,
        message: `x_inf of run "${a.label}" is ${run.infinity} where the class data have ${original.infinity}. Please check it against the data sheet.`,
      });
    }
    return;
  }
  for (let i = 1; i < run.readings.length; i++) {
    const t = run.readings[i][0];
    const x = run.readings[i][1];
    if (t !== run.readings[i - 1][0] || x !== run.readings[i - 1][1]) continue;
    drafts.push({
      code: 'suspect-reading',
      detail: 'extra-row',
      stage: 'readings',
      path: `${a.path}.readings[${i}]`,
      reported: x,
      severity: 'warning',
      charge: 0,
      message: `In run "${a.label}", row ${i + 1} repeats row ${i} exactly (t = ${t}, x = ${x}); it may have been copied twice. It was fitted as given.`,
    });
  }
  // The analysis has fitted all readings with x_inf free already; where that failed, the run's own rate
  // is a close start for another try.
  const startK = a.expected.value > 0 ? a.expected.value : undefined;
  // The student's other runs, read on the same instrument, tell the scatter more surely than a dozen readings.
  const otherRuns = poolScatters(analyses.flatMap((o) => (o !== a && o.ownEndValue ? [runScatter(o.ownEndValue)] : [])));
  const suspect = findSuspectReading({ times: a.times, readings: a.readings, timeUnit: a.timeUnit.text, startK, fitOfAll: a.ownEndValue, infinity: a.infinity, otherRuns });
  if (!suspect) return;
  const guess = suspect.intended
    ? ` It may have been meant as ${suspect.intended.value.toFixed(suspect.decimals)} (${slipWords[suspect.intended.slip]}), which lies on the curve; this is a guess to check against the notebook.`
    : '';
  drafts.push({
    code: 'suspect-reading',
    detail: suspect.intended?.slip,
    stage: 'readings',
    path: `${a.path}.readings[${suspect.index}]`,
    reported: suspect.reading,
    expected: suspect.predicted,
    severity: 'warning',
    charge: 0,
    message: `In run "${a.label}", the reading at t = ${fmt(a.times[suspect.index])} (${suspect.reading}) ${whereOff(suspect)} (${suspect.predicted.toFixed(suspect.decimals)} expected).${guess} Your results were checked against your data as given.`,
  });
}
