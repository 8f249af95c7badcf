import { execFile } from 'node:child_process';
import { mkdtemp, readdir, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { caught } from './support/thrown.ts';
import { pdfText } from './support/pdf-reading.ts';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CheckResult } from '../schemas/result.ts';
import { run } from '../server/cli.ts';
import { filePosition } from '../server/input/json-position.ts';
import { generateSection } from '../kinds/first-order-catalysis/demo/generated-section.ts';
import { seededRandom } from '../server/demo/seeded-random.ts';
import { generateAssignment } from '../kinds/first-order-catalysis/demo/submission-generator.ts';

const assignment = { kind: 'first-order-catalysis', fitModel: 'origin' };

/** A run of clean first-order readings, x_inf = 1, with k_obs = 0.02 + 0.6 [H+] per minute. */
function runAt(label: string, acid: number) {
  const k = 0.02 + 0.6 * acid;
  const times = [0, 1, 2, 3, 4, 5, 6, 7, 8];
  return {
    label,
    catalyst: { value: acid, unit: 'M' },
    timeUnit: 'min',
    readings: times.map((t) => [t, Number((1 + 9 * Math.exp(-k * t)).toFixed(3))]),
    infinity: 1,
    reported: { k: { value: k.toFixed(4), unit: 'min^-1' } },
  };
}

// Invented pseudonymous ids.
const submission = (studentId: string) => ({
  studentId,
  runs: [runAt('R1', 0.05), runAt('R2', 0.1), runAt('R3', 0.2)],
  reported: { kN: { value: '0.0200', unit: 'min^-1' }, kA: { value: '0.600', unit: 'M^-1 min^-1' } },
});
const notANumber = { ...submission('s-02'), runs: [{ ...runAt('R1', 0.05), readings: [[0, 10], [1, 'nine'], [2, 8]] }] };

let dir: string;
const file = (name: string) => join(dir, name);

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'rateproof-cli-'));
  await writeFile(file('assignment.json'), JSON.stringify(assignment));
  await writeFile(file('bad-assignment.json'), JSON.stringify({ ...assignment, fitModel: 'sideways' }));
  await writeFile(file('one.json'), JSON.stringify(submission('s-01')));
  // s-03 recorded its runs at 25, 26.5 and 28 degC: a signal for review.
  const warming = { ...submission('s-03'), runs: submission('s-03').runs.map((r, i) => ({ ...r, temperatureC: 25 + 1.5 * i })) };
  await writeFile(file('batch.json'), JSON.stringify([submission('s-01'), notANumber, warming], null, 2));
  await writeFile(file('malformed.json'), '[\n  { "studentId": "s-01",\n  }\n]\n');
  const rows = submission('s-01').runs.flatMap((r) =>
    r.readings.map(([t, x]) => ['s-01', r.label, String(r.catalyst.value).replace('.', ','), 'M', 'min', t, String(x).replace('.', ','), t === 0 ? '1' : ''].join(';')),
  );
  await writeFile(file('readings.csv'), ['student_id;run;catalyst;catalyst_unit;time_unit;t;x;infinity', ...rows].join('\n'));
  await writeFile(file('reported.csv'), 'student_id;run;quantity;value;uncertainty;unit\ns-01;R1;k;0,0500;;min^-1\ns-01;;kN;0,0200;;min^-1\n');
  await writeFile(file('no-x.csv'), 'student_id,run,catalyst,catalyst_unit,time_unit,t\ns-01,R1,0.05,M,min,0\n');
});

afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

async function rateproof(...argv: string[]) {
  const out = { stdout: '', stderr: '' };
  const code = await run(argv, {
    stdout: (text) => (out.stdout += text),
    stderr: (text) => (out.stderr += text),
    readFile: (path) => readFile(path, 'utf8'),
  });
  return { code, ...out, stderrLines: out.stderr.trimEnd().split('\n') };
}

describe('rateproof check: files it cannot use', () => {
  it('a missing file: exit 2 and one line naming it', async () => {
    const result = await rateproof('check', '--assignment', file('assignment.json'), file('absent.json'));
    expect(result.code).toBe(2);
    expect(result.stderrLines).toEqual([`rateproof: cannot read ${file('absent.json')}: no such file`]);
    expect(result.stdout).toBe('');
  });

  it('malformed JSON: exit 2 and one line naming the file and the line', async () => {
    const result = await rateproof('check', '--assignment', file('assignment.json'), file('malformed.json'));
    expect(result.code).toBe(2);
    expect(result.stderrLines).toHaveLength(1);
    expect(result.stderr).toMatch(new RegExp(`^rateproof: cannot read ${file('malformed.json')}: .* at line 3 column 3\\n$`));
  });

  it('an invalid assignment: exit 2 and one line naming the file and the field', async () => {
    const result = await rateproof('check', '--assignment', file('bad-assignment.json'), file('one.json'));
    expect(result.code).toBe(2);
    expect(result.stderrLines).toHaveLength(1);
    expect(result.stderr).toMatch(`rateproof: invalid assignment in ${file('bad-assignment.json')}: fitModel: `);
  });

  it('a CSV with a missing column: exit 2 and one line naming the file, line and column', async () => {
    const result = await rateproof('check', '--assignment', file('assignment.json'), file('no-x.csv'));
    expect(result.code).toBe(2);
    expect(result.stderrLines).toEqual([`rateproof: cannot read ${file('no-x.csv')}: line 1: missing column "x"`]);
  });
});

describe('rateproof: arguments', () => {
  it.each([[[]], [['grade']], [['check', 'one.json']], [['check', '--assignment', 'a.json']], [['check', '--assignment', 'a.json', 'one.json', '--colour']]])(
    '%j: usage on stderr, exit 2',
    async (argv) => {
      const result = await rateproof(...argv);
      expect(result.code).toBe(2);
      expect(result.stderr).toContain('usage: rateproof check --assignment');
      expect(result.stdout).toBe('');
    },
  );

  // Common practice, no source: `--help` and `-h` print the usage on stdout and exit 0 (a request, not a mistake).
  it.each([[['--help']], [['-h']], [['help']], [['check', '--help']], [['check', '--assignment', 'a.json', '-h']], [['serve', '--help']], [['demo', '-h']]])(
    '%j: the usage on stdout, exit 0, nothing run',
    async (argv) => {
      const result = await rateproof(...argv);
      expect([result.code, result.stderr]).toEqual([0, '']);
      expect(result.stdout).toMatch(new RegExp(`^usage: rateproof ${argv[0].startsWith('-') || argv[0] === 'help' ? 'check' : argv[0]}`));
    },
  );

  it('a subcommand\'s --help shows its own usage', async () => {
    expect((await rateproof('serve', '--help')).stdout).toContain('DATABASE_URL');
    expect((await rateproof('demo', '--help')).stdout).toContain('instructor token');
    expect((await rateproof('check', '--help')).stdout).not.toContain('rateproof serve');
  });

  it('serve and demo refuse an argument they do not take: usage on stderr, exit 2', async () => {
    const result = await rateproof('demo', 'somewhere');
    expect(result.code).toBe(2);
    expect(result.stderr).toMatch(/^rateproof: unexpected argument 'somewhere'\nusage: rateproof demo/);
  });

  it('--reported only goes with a CSV file', async () => {
    const result = await rateproof('check', '--assignment', file('assignment.json'), file('one.json'), '--reported', file('reported.csv'));
    expect(result.code).toBe(2);
    expect(result.stderr).toMatch(/^rateproof: --reported goes with a CSV submissions file\nusage:/);
  });
});

describe('rateproof check: results', () => {
  it('--json prints an array of results, also for a single submission object', async () => {
    const result = await rateproof('check', '--assignment', file('assignment.json'), file('one.json'), '--json');
    expect(result.code).toBe(0);
    expect(result.stderr).toBe('');
    const results = JSON.parse(result.stdout) as CheckResult[];
    expect(results).toHaveLength(1);
    expect(results[0]).toMatchObject({ studentId: 's-01', status: 'checked' });
  });

  it('one invalid submission in a batch is rejected, naming the field, while the others are checked', async () => {
    const result = await rateproof('check', '--assignment', file('assignment.json'), file('batch.json'), '--json');
    expect(result.code).toBe(0);
    const results = JSON.parse(result.stdout) as CheckResult[];
    expect(results.map((r) => [r.studentId, r.status])).toEqual([['s-01', 'checked'], ['s-02', 'rejected'], ['s-03', 'checked']]);
    expect(results[1].rejected).toContainEqual(expect.objectContaining({ path: 'runs[0].readings[1][1]' }));
  });

  it('prints a table: one row per submission, then each finding or rejection on its own line', async () => {
    const result = await rateproof('check', '--assignment', file('assignment.json'), file('batch.json'));
    expect(result.code).toBe(0);
    const lines = result.stdout.split('\n');
    expect(lines[0]).toMatch(/^student +score +errors +warnings +info +codes$/);
    expect(lines[1]).toMatch(/^s-01 +\d+(\.\d+)?\/\d+(\.\d+)? +\d+ +\d+ +\d+/);
    expect(lines[2]).toMatch(/^s-02 +rejected +0 +0 +0$/);
    const rejected = lines.indexOf('s-02');
    expect(lines[rejected + 1]).toMatch(/^ {2}rejected +runs\[0\]\.readings\[1\]\[1\] +\S/);
  });

  it('--signals FILE writes what the batch suggests for review: here s-01 and s-03 hand in the same readings, and s-03 its runs 3 degC apart', async () => {
    const result = await rateproof('check', '--assignment', file('assignment.json'), file('batch.json'), '--signals', file('signals.json'));
    expect(result.code).toBe(0);
    expect(result.stdout).toContain(`signals for review: 1 pair(s) of submissions with readings that look alike, 0 run(s) smoother than the instrument reads, 1 student(s) with signals about their runs; written to ${file('signals.json')}`);
    const signals = JSON.parse(await readFile(file('signals.json'), 'utf8'));
    expect(signals.pairs.map((p: { students: string[]; runs: Array<{ relation: string }> }) => [p.students, p.runs.map((r) => r.relation)])).toEqual([[['s-01', 's-03'], ['identical', 'identical', 'identical']]]);
    expect(signals.students).toEqual([{ studentId: 's-03', signals: [expect.objectContaining({ code: 'temperature-spread', path: 'runs', evidence: expect.objectContaining({ spread: 3 }) })] }]);
    // The results are printed as without it.
    expect(result.stdout.split('\n')[0]).toMatch(/^student +score/);
  });

  it('reads a CSV readings file with a reported-values file', async () => {
    const result = await rateproof('check', '--assignment', file('assignment.json'), file('readings.csv'), '--reported', file('reported.csv'), '--json');
    expect(result.stderr).toBe('');
    const [checked] = JSON.parse(result.stdout) as CheckResult[];
    expect(checked).toMatchObject({ studentId: 's-01', status: 'checked' });
  });
});

describe('bin/rateproof.js', () => {
  it('starts the real command', async () => {
    const bin = fileURLToPath(new URL('../bin/rateproof.js', import.meta.url));
    const { stdout } = await promisify(execFile)(process.execPath, [bin, 'check', '--assignment', file('assignment.json'), file('one.json'), '--json']);
    expect((JSON.parse(stdout) as CheckResult[])[0].studentId).toBe('s-01');
  });

  it('exits 2 on a missing file', async () => {
    const bin = fileURLToPath(new URL('../bin/rateproof.js', import.meta.url));
    const failure = await promisify(execFile)(process.execPath, [bin, 'check', '--assignment', file('absent.json'), file('one.json')]).catch((e: unknown) => e);
    expect(failure).toMatchObject({ code: 2, stderr: `rateproof: cannot read ${file('absent.json')}: no such file\n` });
  });
});

describe('rateproof check: large files, worker threads and JSON Lines', () => {
  // An invented section of 700 generated submissions (about 1.5 MB: two batches of the stream).
  let big: string;
  let bigAssignment: string;
  beforeAll(async () => {
    const random = seededRandom(31);
    const settings = generateAssignment(random, { fitModel: 'origin' });
    const { submissions } = generateSection(random, settings, Array.from({ length: 700 }, (_, i) => `G-${i + 1}`));
    big = file('big.json');
    bigAssignment = file('big-assignment.json');
    await writeFile(big, JSON.stringify(submissions, null, 1));
    await writeFile(bigAssignment, JSON.stringify(settings));
    await writeFile(file('big.jsonl'), submissions.map((x) => JSON.stringify(x)).join('\n'));
  });

  it('prints the same JSON, in the file\'s order, from two worker threads as from this thread', async () => {
    const pooled = await rateproof('check', '--assignment', bigAssignment, big, '--json', '--workers', '2');
    const inline = await rateproof('check', '--assignment', bigAssignment, big, '--json', '--workers', '0');
    expect(pooled.stderr).toBe('');
    expect(pooled.stdout).toBe(inline.stdout);
    const results = JSON.parse(pooled.stdout) as CheckResult[];
    expect(results.map((r) => r.studentId)).toEqual(Array.from({ length: 700 }, (_, i) => `G-${i + 1}`));
    expect(results.filter((r) => r.findings.some((f) => f.severity === 'error')).length).toBeGreaterThan(100);
  });

  it('--jsonl prints one compact result per line, without the ln F arrays unless --arrays', async () => {
    const compact = await rateproof('check', '--assignment', bigAssignment, file('big.jsonl'), '--jsonl', '--workers', '2');
    const lines = compact.stdout.trimEnd().split('\n');
    expect(lines).toHaveLength(700);
    const first = JSON.parse(lines[0]) as CheckResult & { refit: { runs: Array<Record<string, unknown>> } };
    expect(first.studentId).toBe('G-1');
    expect(first.refit.runs[0]).not.toHaveProperty('lnF');
    expect(first.refit.runs[0]).toHaveProperty('k');
    const full = await rateproof('check', '--assignment', bigAssignment, file('big.jsonl'), '--jsonl', '--arrays');
    expect((JSON.parse(full.stdout.split('\n')[0]) as typeof first).refit.runs[0].lnF).toHaveLength(16);
  });

  it('names the line and column of a malformed submission in a large file as JSON.parse of the whole file does, in a worker too', async () => {
    const lines = (await readFile(big, 'utf8')).split('\n');
    const slip = Math.floor(lines.length * 0.8);
    lines[slip] = `${lines[slip]} }`;
    const text = lines.join('\n');
    await writeFile(file('big-broken.json'), text);
    const whole = filePosition((caught(() => JSON.parse(text)) as Error).message, text);
    expect(whole).toMatch(new RegExp(`at line (${slip + 1}|${slip + 2}) column \\d+$`));
    for (const workers of ['0', '2']) {
      const result = await rateproof('check', '--assignment', bigAssignment, file('big-broken.json'), '--json', '--workers', workers);
      expect(result.code).toBe(2);
      expect(result.stderr).toBe(`rateproof: cannot read ${file('big-broken.json')}: ${whole}\n`);
    }
  });

  it('names the column of a malformed submission in a large file written on one line, in a worker too', async () => {
    const submissions = JSON.parse(await readFile(big, 'utf8')) as unknown[];
    const oneLine = JSON.stringify(submissions);
    // A doubled comma inside a submission about 80 % of the way in, well past the first batch.
    const at = oneLine.indexOf(',"runs"', Math.floor(oneLine.length * 0.8));
    const text = `${oneLine.slice(0, at)},${oneLine.slice(at)}`;
    await writeFile(file('big-one-line.json'), text);
    const whole = filePosition((caught(() => JSON.parse(text)) as Error).message, text);
    expect(whole).toMatch(new RegExp(`at line 1 column ${at + 2}$`));
    for (const workers of ['0', '2']) {
      const result = await rateproof('check', '--assignment', bigAssignment, file('big-one-line.json'), '--json', '--workers', workers);
      expect(result.code).toBe(2);
      expect(result.stderr).toBe(`rateproof: cannot read ${file('big-one-line.json')}: ${whole}\n`);
    }
  });

  it.each([[['--json', '--jsonl']], [['--arrays']], [['--workers', 'many']]])('%j: usage on stderr, exit 2', async (flags) => {
    const result = await rateproof('check', '--assignment', file('assignment.json'), file('one.json'), ...flags);
    expect(result.code).toBe(2);
    expect(result.stderr).toContain('usage: rateproof check --assignment');
  });
});

describe('rateproof check --out DIR', () => {
  it('writes a feedback PDF per checked result, gradebook.csv and summary.pdf', async () => {
    const out = file('out');
    const result = await rateproof('check', '--assignment', file('assignment.json'), file('batch.json'), '--out', out);
    expect(result.code).toBe(0);
    expect(result.stdout.trimEnd().split('\n').at(-1)).toBe(`wrote 2 feedback sheets, gradebook.csv and summary.pdf to ${out}`);
    expect((await readdir(out)).sort()).toEqual(['gradebook.csv', 's-01.pdf', 's-03.pdf', 'summary.pdf']);
    for (const pdf of ['s-01.pdf', 's-03.pdf', 'summary.pdf']) expect((await readFile(join(out, pdf))).subarray(0, 5).toString()).toBe('%PDF-');
    const gradebook = await readFile(join(out, 'gradebook.csv'), 'utf8');
    expect(gradebook.split('\r\n').slice(0, 4)).toEqual([
      '\uFEFFstudent_id,score,max_score,status,causes_costing_points,warnings,infos,main_codes,assignment',
      expect.stringMatching(/^s-01,[\d.]+,[\d.]+,checked,/),
      's-02,,0,rejected,0,0,0,,assignment',
      expect.stringMatching(/^s-03,[\d.]+,[\d.]+,checked,/),
    ]);
  });

  it('writes the same files, prints the same table and finds the same signals in two worker threads as in this thread', async () => {
    // Sheets name the time they were graded, to the minute: the one thing two runs may differ in.
    const ungraded = (text: string) => text.replace(/\d{4}-\d{2}-\d{2} \d{2}:\d{2} UTC/g, '(graded)');
    const written = async (workers: string) => {
      const out = file(`out-workers-${workers}`);
      const signals = file(`signals-workers-${workers}.json`);
      const result = await rateproof('check', '--assignment', file('assignment.json'), file('batch.json'), '--out', out, '--signals', signals, '--workers', workers);
      expect(result.code).toBe(0);
      const files: Array<[string, string]> = [];
      for (const name of (await readdir(out)).sort()) {
        const bytes = await readFile(join(out, name));
        files.push([name, name.endsWith('.pdf') ? ungraded(await pdfText(bytes)) : bytes.toString('utf8')]);
      }
      return { files, signals: await readFile(signals, 'utf8'), stdout: result.stdout.replaceAll(out, 'OUT').replaceAll(signals, 'SIGNALS') };
    };
    const pooled = await written('2');
    expect(pooled).toEqual(await written('0'));
    // The batch: s-01 and s-03 checked (a sheet each), s-02 not a number; s-03's runs warm up (a signal).
    expect(pooled.files.map(([name]) => name)).toEqual(['gradebook.csv', 's-01.pdf', 's-03.pdf', 'summary.pdf']);
    expect(JSON.parse(pooled.signals).students.map((s: { studentId: string }) => s.studentId)).toEqual(['s-03']);
  });

  it('a folder it cannot write to: exit 2 and one line naming the file', async () => {
    await writeFile(file('not-a-folder'), '');
    const result = await rateproof('check', '--assignment', file('assignment.json'), file('one.json'), '--out', file('not-a-folder'), '--json');
    expect(result.code).toBe(2);
    expect(result.stderrLines).toHaveLength(1);
    expect(result.stderr).toMatch(`rateproof: cannot write ${join(file('not-a-folder'), 's-01.pdf')}: `);
  });
});
