import { readFile } from 'node:fs/promises';
import { withoutArrays } from '../../server/batches/check-json-batch.ts';
import { assignmentOfJson } from '../../server/batches/check-settings-batch.ts';
import { checkAndRead } from '../../server/checks/check.ts';
import { corpus } from './corpus.ts';

/**
 * Where `check --jsonl`'s time goes in one thread, the process's start apart: the bench corpus (5,000
 * by default) parsed, checked and written as JSON Lines (as `checkJsonBatch` does, its parts timed
 * apart) in batches of 500, five passes in one process, each part by the process's CPU time. The first pass's checking is also given per 1,000: what a
 * fresh thread (the command, and each pool worker again) spends before the compiler has caught up.
 *   npx tsx test/bench/checker-warm-up.ts [COUNT]
 */
const count = Number(process.argv[2] ?? 5_000);
const BATCH = 500;
const SLICE = 1_000;

const cpuMs = (since: NodeJS.CpuUsage) => {
  const d = process.cpuUsage(since);
  return (d.user + d.system) / 1000;
};

const data = await corpus(count);
const text = await readFile(data.submissions, 'utf8');
const assignment = assignmentOfJson(await readFile(data.assignment, 'utf8'));
for (let pass = 1; pass <= 5; pass++) {
  let start = process.cpuUsage();
  const submissions = JSON.parse(text) as unknown[];
  const parse = cpuMs(start);
  let check = 0;
  let format = 0;
  const slices: number[] = [];
  for (let i = 0; i < submissions.length; i += BATCH) {
    const batch = submissions.slice(i, i + BATCH);
    start = process.cpuUsage();
    const results = batch.map((s) => checkAndRead(assignment, s).result);
    const checked = cpuMs(start);
    check += checked;
    slices[Math.floor(i / SLICE)] = (slices[Math.floor(i / SLICE)] ?? 0) + checked;
    start = process.cpuUsage();
    results.map((r) => `${JSON.stringify(withoutArrays(r))}\n`).join('');
    format += cpuMs(start);
  }
  const perSlice = pass === 1 ? `; checking per ${SLICE.toLocaleString('en-US')} in turn: ${slices.map((s) => s.toFixed(0)).join(', ')} ms` : '';
  console.log(`pass ${pass}: parse ${parse.toFixed(0)} ms, check ${check.toFixed(0)} ms, format ${format.toFixed(0)} ms${perSlice}`);
}
