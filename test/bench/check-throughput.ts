import { readFile } from 'node:fs/promises';
import { findingCodes, type FindingCode } from '../../kinds/first-order-catalysis/schemas.ts';
import { corpus } from './corpus.ts';
import { checkBatch, checkSubmission } from '../../server/checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import {
  atExpectedPath,
  cleanCase,
  generateAssignment,
  generateSubmission,
  isFound,
  slipCase,
  slipCodes,
  type SlipCode,
} from '../../kinds/first-order-catalysis/demo/submission-generator.ts';

/**
 * The checker on generated submissions (an invented scenario, see the generator): (a) which codes it
 * reports at the place of each injected slip, and (b) checked submissions per second on clean ones.
 */
const CASES_PER_SLIP = 100;
// Seeds the tests never use: recall measured where nothing was tuned.
const HELD_OUT_FIRST_SEED = 100_000;
const HELD_OUT_CASES = 500;
const BATCH_SIZE = 2000;
const NOTHING = '(none)';

/** Per case, each code found (as code or among alsoCodes) at any of the slip's expected paths, once. */
function codesAtSlip(code: SlipCode, seed: number): Set<string> {
  const { settings, submission, expected } = slipCase(code, seed);
  const result = checkSubmission(parseAssignment(settings), submission);
  if (result.status === 'rejected') return new Set(['rejected']);
  const found = result.findings
    .filter((f) => expected.some((e) => atExpectedPath(e, f.path)))
    .flatMap((f) => [f.code, ...(f.alsoCodes ?? [])]);
  return new Set(found.length > 0 ? found : [NOTHING]);
}

/** Rows: injected code; columns: codes found at the expected path; counts over 100 cases each. */
export function confusionTable(): string {
  const rows = new Map<SlipCode, Map<string, number>>();
  for (const code of slipCodes) {
    const counts = new Map<string, number>();
    for (let seed = 0; seed < CASES_PER_SLIP; seed++) {
      for (const found of codesAtSlip(code, seed)) counts.set(found, (counts.get(found) ?? 0) + 1);
    }
    rows.set(code, counts);
  }
  const seen = new Set([...rows.values()].flatMap((counts) => [...counts.keys()]));
  const columns = [...findingCodes.filter((c: FindingCode) => seen.has(c)), ...['rejected', NOTHING].filter((c) => seen.has(c))];
  const width = Math.max(...slipCodes.map((c) => c.length));
  const header = ['injected \\ found'.padEnd(width), ...columns].join(' | ');
  const lines = slipCodes.map((code) =>
    [code.padEnd(width), ...columns.map((c) => String(rows.get(code)!.get(c) ?? '').padStart(c.length))].join(' | '),
  );
  return [header, header.replace(/[^|]/g, '-'), ...lines].join('\n');
}

/** Per slip, the share of held-out cases with every expected finding; and clean work with an error. */
export function heldOutRecall(): string {
  const lines = slipCodes.map((code) => {
    let found = 0;
    for (let seed = HELD_OUT_FIRST_SEED; seed < HELD_OUT_FIRST_SEED + HELD_OUT_CASES; seed++) {
      const { settings, submission, expected } = slipCase(code, seed);
      const result = checkSubmission(parseAssignment(settings), submission);
      if (expected.every((e) => isFound(e, result.findings))) found++;
    }
    return `${code}: ${((100 * found) / HELD_OUT_CASES).toFixed(1)} % (${found}/${HELD_OUT_CASES})`;
  });
  let clean = 0;
  let suspect = 0;
  for (let seed = HELD_OUT_FIRST_SEED; seed < HELD_OUT_FIRST_SEED + HELD_OUT_CASES; seed++) {
    const { settings, submission } = cleanCase(seed);
    const result = checkSubmission(parseAssignment(settings), submission);
    if (result.status === 'checked' && !result.findings.some((f) => f.severity === 'error')) clean++;
    if (result.findings.some((f) => f.code === 'suspect-reading')) suspect++;
  }
  lines.push(`clean work with no error: ${((100 * clean) / HELD_OUT_CASES).toFixed(1)} % (${clean}/${HELD_OUT_CASES})`);
  lines.push(`clean work with a suspect-reading warning (a false alarm): ${((100 * suspect) / HELD_OUT_CASES).toFixed(1)} % (${suspect}/${HELD_OUT_CASES})`);
  return lines.join('\n');
}

export function benchChecks(): { checksPerSecond: number; microsecondsPerCheck: number } {
  console.log(`checker diagnoses: codes found at the injected slip's path, ${CASES_PER_SLIP} submissions per slip`);
  console.log(confusionTable());
  console.log(`held-out recall: seeds ${HELD_OUT_FIRST_SEED} to ${HELD_OUT_FIRST_SEED + HELD_OUT_CASES - 1}, which no test uses`);
  console.log(heldOutRecall());

  const random = seededRandom(2024);
  // The default assignment; every student with their own data.
  const settings = generateAssignment(random);
  const assignment = parseAssignment(settings);
  const submissions = Array.from({ length: BATCH_SIZE }, (_, n) => generateSubmission(random, settings, n + 1));
  checkBatch(assignment, submissions); // warm-up
  const start = process.hrtime.bigint();
  let count = 0;
  while (process.hrtime.bigint() - start < 3_000_000_000n) {
    const results = checkBatch(assignment, submissions);
    if (results.some((r) => r.status !== 'checked')) throw new Error('a clean submission was rejected');
    count += results.length;
  }
  const seconds = Number(process.hrtime.bigint() - start) / 1e9;
  return { checksPerSecond: count / seconds, microsecondsPerCheck: (seconds / count) * 1e6 };
}

/** Checked submissions per second on the whole-process corpus, where a third carry slips whose causes are searched. */
export async function benchCorpusChecks(): Promise<{ checksPerSecond: number; microsecondsPerCheck: number }> {
  const data = await corpus(20_000);
  const assignment = parseAssignment(JSON.parse(await readFile(data.assignment, 'utf8')));
  const submissions = (JSON.parse(await readFile(data.submissions, 'utf8')) as unknown[]).slice(0, BATCH_SIZE);
  checkBatch(assignment, submissions); // warm-up
  const start = process.hrtime.bigint();
  let count = 0;
  while (process.hrtime.bigint() - start < 3_000_000_000n) {
    count += checkBatch(assignment, submissions).length;
  }
  const seconds = Number(process.hrtime.bigint() - start) / 1e9;
  return { checksPerSecond: count / seconds, microsecondsPerCheck: (seconds / count) * 1e6 };
}
