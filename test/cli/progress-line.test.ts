import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { run } from '../../server/cli.ts';
import { ProgressLine } from '../../server/cli/progress-line.ts';
import { generateSection } from '../../kinds/first-order-catalysis/demo/generated-section.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { generateAssignment } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';

describe('ProgressLine', () => {
  it('says done of the estimated total, the rate and the time left, rewriting one line', () => {
    const written: string[] = [];
    let now = 0;
    const line = new ProgressLine((t) => written.push(t), 4000, () => now);
    now = 1000;
    // Hand-computed: 100 done from a quarter of the bytes → about 400; 100 in 1 s → 100/s; 300 left → 3 s.
    line.update(100, 1000);
    expect(written).toEqual(['\r100 of about 400 submissions · 100/s · 3 s left\x1b[K']);
    // Within a quarter second of the last: not rewritten.
    now = 1100;
    line.update(120, 1200);
    expect(written).toHaveLength(1);
    // Hand-computed: 300 of 400 at 2.5 s → 120/s; 100 left → 0.83 s, rounded to 1 s.
    now = 2500;
    line.update(300, 3000);
    expect(written[1]).toBe('\r300 of about 400 submissions · 120/s · 1 s left\x1b[K');
    line.end();
    expect(written[2]).toBe('\r\x1b[K');
    // Cleared once: a second end writes nothing.
    line.end();
    expect(written).toHaveLength(3);
  });

  it('writes minutes and seconds for a long wait', () => {
    const written: string[] = [];
    let now = 0;
    const line = new ProgressLine((t) => written.push(t), 100_000, () => now);
    now = 10_000;
    // Hand-computed: 1,000 of about 100,000 at 100/s → 99,000 / 100 = 990 s = 16 min 30 s.
    line.update(1000, 1000);
    expect(written).toEqual(['\r1,000 of about 100,000 submissions · 100/s · 16 min 30 s left\x1b[K']);
  });
});

describe('rateproof check: the progress line', () => {
  let dir: string;
  const file = (name: string) => join(dir, name);
  beforeAll(async () => {
    dir = await mkdtemp(join(tmpdir(), 'rateproof-progress-'));
    // An invented section of 300 generated submissions.
    const random = seededRandom(41);
    const settings = generateAssignment(random, { fitModel: 'origin' });
    const { submissions } = generateSection(random, settings, Array.from({ length: 300 }, (_, i) => `P-${i + 1}`));
    await writeFile(file('section.json'), JSON.stringify(submissions));
    await writeFile(file('assignment.json'), JSON.stringify(settings));
  });
  afterAll(async () => {
    await rm(dir, { recursive: true, force: true });
  });

  async function check(terminal: boolean, ...more: string[]) {
    const out = { stdout: '', stderr: '' };
    const code = await run(['check', '--assignment', file('assignment.json'), file('section.json'), '--jsonl', ...more], {
      stdout: (text) => (out.stdout += text),
      stderr: (text) => (out.stderr += text),
      stderrIsTerminal: terminal,
      readFile: (path) => readFile(path, 'utf8'),
    });
    return { code, ...out };
  }

  it('on a terminal: one line rewritten in place, cleared at the end, standard output untouched', async () => {
    const shown = await check(true);
    expect(shown.code).toBe(0);
    // One batch: one line (nothing left when it is shown), then cleared.
    expect(shown.stderr).toMatch(/^\r300 of about 300 submissions · [\d,]+\/s · 0 s left\x1b\[K\r\x1b\[K$/);
    const quiet = await check(false);
    expect(shown.stdout).toBe(quiet.stdout);
    expect(shown.stdout.split('\n')).toHaveLength(301);
  });

  it('silent when standard error is not a terminal, and with --quiet', async () => {
    expect((await check(false)).stderr).toBe('');
    expect((await check(true, '--quiet')).stderr).toBe('');
  });
});
