import { readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { run } from '../../server/cli.ts';

/**
 * The files in docs/examples, run as docs/examples/README.md says, with the results it states. Where
 * a value is the point of an example, it is computed here apart from the engine.
 */
const examples = join(import.meta.dirname, '..', '..', 'docs', 'examples');
const at = (name: string) => join(examples, name);

interface Result {
  studentId: string;
  score: number;
  maxScore: number;
  findings: Array<{ code: string; severity: string; path: string }>;
}

async function check(...args: string[]): Promise<Result[]> {
  let out = '';
  const code = await run(['check', ...args, '--json'], { stdout: (t) => (out += t), stderr: () => {}, readFile: (p) => readFile(p, 'utf8') });
  expect(code).toBe(0);
  return JSON.parse(out) as Result[];
}

/** Score and the codes of the errors, as the README's table shows them (each code once). */
const table = (results: Result[]) => results.map((r) => [r.studentId, `${r.score}/${r.maxScore}`, [...new Set(r.findings.filter((f) => f.severity === 'error').map((f) => f.code))]]);

/** Ordinary least squares y = a + b x, written here apart from the engine. */
function line(x: number[], y: number[]): { a: number; b: number } {
  const mx = x.reduce((s, v) => s + v, 0) / x.length;
  const my = y.reduce((s, v) => s + v, 0) / y.length;
  const b = x.reduce((s, v, i) => s + (v - mx) * (y[i] - my), 0) / x.reduce((s, v) => s + (v - mx) ** 2, 0);
  return { a: my - b * mx, b };
}

describe('docs/examples, first kind', () => {
  const readme = [
    ['B-01', '22/22', []],
    ['B-02', '21/22', ['log-base']],
    ['B-03', '20/22', ['concentration-unit']],
  ];

  it('the JSON batch gives the README table', async () => {
    expect(table(await check('--assignment', at('assignment.json'), at('submissions.json')))).toEqual(readme);
  });

  it("B-03's k_A is the slope of its own k_obs against [H+] divided by 1000 (mM read as M)", async () => {
    const b03 = (JSON.parse(await readFile(at('submissions.json'), 'utf8')) as Array<{ studentId: string; runs: Array<{ catalyst: { value: number }; reported: { k: { value: number } } }>; reported: { kA: { value: number } } }>).find((s) => s.studentId === 'B-03')!;
    const { b } = line(b03.runs.map((r) => r.catalyst.value), b03.runs.map((r) => r.reported.k.value));
    expect(b03.reported.kA.value * 1000).toBeCloseTo(b, 3);
  });

  it('the CSV pair gives the same scores and codes, with sig-figs warnings that cost nothing (digits as written)', async () => {
    const results = await check('--assignment', at('assignment.json'), at('readings.csv'), '--reported', at('reported.csv'));
    expect(table(results)).toEqual(readme);
    // B-01's four k_obs, k_N and k_A are each written 0.02814 against 6.5e-06 and the like: six roundings.
    expect(results[0].findings.map((f) => [f.code, f.severity])).toEqual(Array(6).fill(['sig-figs', 'warning']));
    for (const r of results) expect(r.findings.filter((f) => f.code === 'sig-figs').length).toBeGreaterThan(0);
  });
});

describe('docs/examples, temperature-dependence', () => {
  // R exact in the SI since 2019 (8.314462618 J K^-1 mol^-1); 1.987 cal K^-1 mol^-1 is R in calories (common practice, no source).
  const R = 8.314462618;

  it('gives the README table', async () => {
    const results = await check('--assignment', at('temperature-dependence/assignment.json'), at('temperature-dependence/submissions.json'));
    expect(table(results)).toEqual([
      ['T-01', '3/3', []],
      ['T-02', '1/3', ['gas-constant']],
      ['T-03', '1/3', ['energy-unit']],
    ]);
  });

  it("T-01's E_a is the least-squares slope of ln k against 1/T times R; T-02's is the same slope times 1.987; T-03's a thousand times T-01's", async () => {
    type Sub = { studentId: string; points: Array<{ temperature: { value: number }; k: { value: string } }>; reported: { Ea: { value: string } } };
    const subs = JSON.parse(await readFile(at('temperature-dependence/submissions.json'), 'utf8')) as Sub[];
    const { b } = line(subs[0].points.map((p) => 1 / p.temperature.value), subs[0].points.map((p) => Math.log(Number(p.k.value))));
    const [t1, t2, t3] = subs.map((s) => Number(s.reported.Ea.value));
    expect(t1).toBeCloseTo((-b * R) / 1000, 2);
    expect(t2).toBeCloseTo((-b * 1.987) / 1000, 2);
    expect(t3).toBeCloseTo(t1 * 1000, -1);
  });
});
