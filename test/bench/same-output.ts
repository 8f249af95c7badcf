import { spawn } from 'node:child_process';
import { createWriteStream } from 'node:fs';
import { mkdtemp, readdir, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { pdfText } from '../support/pdf-reading.ts';
import { corpus } from './corpus.ts';

/**
 * The same output before and after a change to the command's internals: `check --jsonl` on the 6,000
 * submissions of the bench corpus (seed 8) line by line, and `check --out` on its first submissions
 * in two workers (gradebook byte for byte, every sheet's and the summary's text, the graded time apart), from another
 * checkout's build and from this one's.
 *   npx tsx test/bench/same-output.ts OTHER_CHECKOUT [SUBMISSIONS_WITH_SHEETS]
 * OTHER_CHECKOUT holds bin/rateproof.js and its dist/ (main's, built). Exits 1 on any difference.
 */
const ours = fileURLToPath(new URL('../../', import.meta.url));
const [other, sheetsArg] = process.argv.slice(2);
if (!other) {
  console.error('usage: same-output.ts OTHER_CHECKOUT [SUBMISSIONS_WITH_SHEETS]');
  process.exit(2);
}
const JSONL_COUNT = 6_000;
const withSheets = Number(sheetsArg ?? 300);

async function run(root: string, args: string[], stdoutPath?: string): Promise<void> {
  await new Promise<void>((resolve, reject) => {
    const child = spawn(process.execPath, [join(root, 'bin/rateproof.js'), 'check', '--quiet', ...args], { stdio: ['ignore', stdoutPath ? 'pipe' : 'ignore', 'inherit'] });
    if (stdoutPath) child.stdout!.pipe(createWriteStream(stdoutPath));
    child.on('error', reject);
    child.on('close', (code) => (code === 0 ? resolve() : reject(new Error(`${root}: check ${args.join(' ')}: exit ${code}`))));
  });
}

/** The lines that differ, by position; and the counts. */
function compareLines(before: string, after: string): { lines: [number, number]; differing: number[] } {
  const a = before.split('\n');
  const b = after.split('\n');
  const differing: number[] = [];
  for (let i = 0; i < Math.max(a.length, b.length); i++) if (a[i] !== b[i]) differing.push(i + 1);
  return { lines: [a.length - 1, b.length - 1], differing };
}

// The one thing that differs between two runs by design: the time the files were made.
const withoutGradedTime = (text: string) => text.replace(/\d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC/g, '(graded)');

const dir = await mkdtemp(join(tmpdir(), 'rateproof-same-output-'));
let differences = 0;
try {
  const data = await corpus(JSONL_COUNT);
  const out = { before: join(dir, 'before.jsonl'), after: join(dir, 'after.jsonl') };
  await run(other, ['--jsonl', '--assignment', data.assignment, data.submissions], out.before);
  await run(ours, ['--jsonl', '--assignment', data.assignment, data.submissions], out.after);
  const jsonl = compareLines(await readFile(out.before, 'utf8'), await readFile(out.after, 'utf8'));
  differences += jsonl.differing.length;
  console.log(`check --jsonl on ${data.count.toLocaleString('en-US')} submissions: ${jsonl.lines[0]} lines before, ${jsonl.lines[1]} after, ${jsonl.differing.length} differing${jsonl.differing.length ? ` (first at line ${jsonl.differing[0]})` : ''}`);

  const few = join(dir, `first-${withSheets}.json`);
  await writeFile(few, JSON.stringify((JSON.parse(await readFile(data.submissions, 'utf8')) as unknown[]).slice(0, withSheets)));
  const folders = { before: join(dir, 'out-before'), after: join(dir, 'out-after') };
  // Two workers, as on a file large enough for the pool: the sheets are drawn there.
  await run(other, ['--workers', '2', '--assignment', data.assignment, few, '--out', folders.before]);
  await run(ours, ['--workers', '2', '--assignment', data.assignment, few, '--out', folders.after]);
  const names = { before: (await readdir(folders.before)).sort(), after: (await readdir(folders.after)).sort() };
  const sameNames = names.before.join('\n') === names.after.join('\n');
  if (!sameNames) differences++;
  const differingFiles: string[] = [];
  for (const name of sameNames ? names.after : []) {
    const [a, b] = await Promise.all([readFile(join(folders.before, name)), readFile(join(folders.after, name))]);
    const same = name.endsWith('.pdf') ? withoutGradedTime(await pdfText(a)) === withoutGradedTime(await pdfText(b)) : a.equals(b);
    if (!same) differingFiles.push(name);
  }
  differences += differingFiles.length;
  console.log(
    `check --out on ${withSheets} submissions: ${names.before.length} files before, ${names.after.length} after, ${sameNames ? 'the same names' : 'NOT the same names'}; ` +
      `${differingFiles.length} differing (PDFs by their text, the graded time apart; the rest byte for byte)${differingFiles.length ? `: ${differingFiles.slice(0, 5).join(', ')}` : ''}`,
  );
} finally {
  await rm(dir, { recursive: true, force: true });
}
process.exitCode = differences === 0 ? 0 : 1;
