import { execFileSync, spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { availableParallelism, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { corpus } from './corpus.ts';

/**
 * Whole processes, timed from start to exit as a TA would wait for them: `rateproof check` (the
 * compiled command) against the script a TA would write instead (numpy/scipy refit, matplotlib sheets;
 * `test/bench/baseline.py`, run with Debian's python3-numpy, python3-scipy, python3-matplotlib),
 * on the same generated corpus. Goals: checking at least 5 times faster than the baseline, sheets at
 * least 20 times, `check` on an empty batch within 8 times a bare `node -e 0`, `check --jsonl` on the
 * 20,000 at least as fast as the baseline, and `check --out` on them under 300 MB. Printed, not asserted.
 */
const root = fileURLToPath(new URL('../../', import.meta.url));
const bin = join(root, 'bin/rateproof.js');
const baseline = join(root, 'test/bench/baseline.py');
const PYTHON = '/usr/bin/python3';
const CHECKED = 20_000;
const SHEETS = 40;
const SECTION = 120;

/** Median wall time of `runs` runs of a command, its output sent to /dev/null as a shell's `> /dev/null` would. */
async function seconds(command: string, args: string[], runs: number): Promise<number> {
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const start = process.hrtime.bigint();
    await new Promise<void>((resolve, reject) => {
      const child = spawn(command, args, { stdio: ['ignore', 'ignore', 'inherit'] });
      child.on('error', reject);
      child.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`${command} ${args.join(' ')}: exit ${code}`))));
    });
    times.push(Number(process.hrtime.bigint() - start) / 1e9);
  }
  return times.sort((a, b) => a - b)[Math.floor(times.length / 2)];
}

/** Why the baseline cannot run here, or undefined when it can. */
function baselineMissing(): string | undefined {
  if (!existsSync(baseline)) return `${baseline} is not there`;
  try {
    execFileSync(PYTHON, ['-c', 'import numpy, scipy, matplotlib'], { stdio: 'ignore' });
    return undefined;
  } catch {
    return 'it needs apt-get install python3-numpy python3-scipy python3-matplotlib';
  }
}

const ratio = (theirs: number | undefined, ours: number) => (theirs === undefined ? 'baseline not run' : `${(theirs / ours).toFixed(1)} times faster than the baseline`);
const secs = (s: number | undefined) => (s === undefined ? '-' : `${s.toFixed(2)} s`);

export async function benchWholeProcess(): Promise<void> {
  const missing = baselineMissing();
  if (missing) console.log(`whole process: the baseline script is not run: ${missing}`);
  const data = await corpus(CHECKED);
  const dir = await mkdtemp(join(tmpdir(), 'rateproof-bench-'));
  try {
    const empty = join(dir, 'empty.json');
    await writeFile(empty, '[]');
    const nodeBare = await seconds(process.execPath, ['-e', '0'], 7);
    const emptyCheck = await seconds(process.execPath, [bin, 'check', '--assignment', data.assignment, empty], 7);
    console.log(`start-up: check on an empty batch ${secs(emptyCheck)}, node -e 0 ${secs(nodeBare)}: ${(emptyCheck / nodeBare).toFixed(1)} times (goal <= 8)`);

    const ours = await seconds(process.execPath, [bin, 'check', '--assignment', data.assignment, data.submissions], 3);
    const theirs = missing ? undefined : await seconds(PYTHON, [baseline, '--once', data.submissions], 3);
    console.log(`check ${CHECKED.toLocaleString('en-US')} submissions (whole process, table output): rateproof ${secs(ours)}, baseline ${secs(theirs)}: ${ratio(theirs, ours)} (goal >= 5)`);
    await benchJsonLines(data, missing === undefined);
    await benchCourseFile(data, dir);
    // What the worker pool adds on this machine: the same check in the command's own thread.
    const oneThread = await seconds(process.execPath, [bin, 'check', '--workers', '0', '--assignment', data.assignment, data.submissions], 3);
    console.log(`  the same in one thread (--workers 0): ${secs(oneThread)}; the pool of ${availableParallelism()} workers is ${(oneThread / ours).toFixed(2)} times as fast`);

    await benchSheets(data, dir, SHEETS, missing ? undefined : 3, `${SHEETS} feedback sheets`, '(goal >= 20)');
    // A large section as a TA has it, checked with every sheet: what a course waits for in practice.
    await benchSheets(data, dir, SECTION, missing ? undefined : 1, `a section of ${SECTION} checked with its sheets`, '(goal >= 20; the baseline is run once, it takes most of a minute)');
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

/**
 * `check --jsonl` and the baseline in turn, three runs each (ours, theirs, ours, ...), so that both
 * meet the same load; min / median / max of each, and the ratio of the medians.
 */
async function benchJsonLines(data: { assignment: string; submissions: string }, withBaseline: boolean): Promise<void> {
  const ours: number[] = [];
  const theirs: number[] = [];
  for (let i = 0; i < 3; i++) {
    ours.push(await seconds(process.execPath, [bin, 'check', '--jsonl', '--assignment', data.assignment, data.submissions], 1));
    if (withBaseline) theirs.push(await seconds(PYTHON, [baseline, '--once', data.submissions], 1));
  }
  const spread = (times: number[]) => {
    const sorted = [...times].sort((a, b) => a - b);
    return { text: `${secs(sorted[0])} / ${secs(sorted[1])} / ${secs(sorted[2])}`, median: sorted[1] };
  };
  const a = spread(ours);
  const b = withBaseline ? spread(theirs) : undefined;
  console.log(
    `check --jsonl ${CHECKED.toLocaleString('en-US')} submissions (whole process, min / median / max of 3, in turn with the baseline): rateproof ${a.text}, baseline ${b?.text ?? 'not run'}: ` +
      `${b ? `${(b.median / a.median).toFixed(2)} times the baseline's speed` : 'baseline not run'} (goal >= 1)`,
  );
}

const TIME = '/usr/bin/time';

/** The course-wide file alone (`npx tsx test/bench/course-file.ts`): the corpus of 20,000 made or reused, `check --out` measured once. */
export async function benchCourseFileAlone(): Promise<void> {
  const data = await corpus(CHECKED);
  const dir = await mkdtemp(join(tmpdir(), 'rateproof-bench-'));
  try {
    await benchCourseFile(data, dir);
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

/**
 * `check --out` on the whole corpus, once: its peak memory (the largest resident set, as GNU time
 * reports it) against the goal of 300 MB, and how long the 20,000 sheets take.
 */
async function benchCourseFile(data: { assignment: string; submissions: string }, dir: string): Promise<void> {
  if (!existsSync(TIME)) {
    console.log(`check --out ${CHECKED.toLocaleString('en-US')} submissions: peak memory not measured (${TIME} is not there; apt-get install time)`);
    return;
  }
  const report = join(dir, 'time.txt');
  const wall = await seconds(TIME, ['-f', '%M', '-o', report, process.execPath, bin, 'check', '--assignment', data.assignment, data.submissions, '--out', join(dir, 'course')], 1);
  const megabytes = Number((await readFile(report, 'utf8')).trim().split('\n').pop()) / 1024;
  console.log(`check --out ${CHECKED.toLocaleString('en-US')} submissions (sheets, gradebook, summary; whole process): peak memory ${megabytes.toFixed(0)} MB (goal < 300 MB), ${secs(wall)}`);
  await rm(join(dir, 'course'), { recursive: true, force: true });
}

/** The first `count` submissions checked with `--out` (sheets, summary, gradebook) against the baseline's `count` PDFs. */
async function benchSheets(data: { assignment: string; submissions: string }, dir: string, count: number, baselineRuns: number | undefined, what: string, goal: string): Promise<void> {
  const few = join(dir, `first-${count}.json`);
  await writeFile(few, JSON.stringify((JSON.parse(await readFile(data.submissions, 'utf8')) as unknown[]).slice(0, count)));
  const ours = await seconds(process.execPath, [bin, 'check', '--assignment', data.assignment, few, '--out', join(dir, `ours-${count}`)], 3);
  const theirs = baselineRuns === undefined ? undefined : await seconds(PYTHON, [baseline, '--pdfs', String(count), few, dir], baselineRuns);
  console.log(`${what} (whole process; ours also writes the summary and gradebook): rateproof ${secs(ours)}, baseline ${secs(theirs)}: ${ratio(theirs, ours)} ${goal}`);
}
