import { mkdtemp, readFile, readdir, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { registerKindModule } from '../../kinds/registry.ts';
import { buildApp } from '../../server/app.ts';
import { run } from '../../server/cli.ts';
import { call, seedCourse, testConfig, type Seed } from '../support/api-fixture.ts';
import { EXPECTED, RUN_A, RUN_B, SECTION } from '../support/decay-runs/data.ts';
import { DECAY_RUNS } from '../support/decay-runs/schemas.ts';
import { folded, pdfText } from '../support/pdf-reading.ts';
import { openTestDatabase, type TestDatabase } from '../support/test-database.ts';

// The one line that adds the kind, here and in every worker thread.
await registerKindModule(new URL('../support/decay-runs/index.ts', import.meta.url));

type RunRefit = { label: string; k: { value: number; standardError: number } };
const codesOf = (result: { findings: Array<{ code: string }> }) => result.findings.map((f) => f.code);

/** The test kind's readings of S-001 as the CSV upload gives them: a row a reading, the run's values repeated. */
function readingsCsv(studentId: string, kA: number, kB: number): string {
  const rows = [RUN_A, RUN_B].flatMap((r, i) => r.readings.map(([t, x]) => [studentId, r.label, r.timeUnit, r.infinity, t, x, i === 0 ? kA : kB].join(',')));
  return ['student_id,run,time_unit,infinity,t,x,reported_k', ...rows].join('\r\n');
}

/**
 * A kind no generic code knows (decay runs: runs of readings, each fitted for k, no catalyst), through
 * the service with a pool of two worker threads, and through the command. Expected values: scipy
 * (test/support/decay-runs/data.ts) and hand-worked verdicts.
 */
describe('the test kind, registered in one line', () => {
  let database: TestDatabase;
  let app: Awaited<ReturnType<typeof buildApp>>;
  let s: Seed;
  let url: string;
  let dir: string;
  let ids: Record<string, number>;
  const pdf = async (path: string) => folded(await pdfText((await app.inject({ method: 'GET', url: path, headers: { authorization: `Bearer ${s.taAToken}` } })).rawPayload));

  beforeAll(async () => {
    database = await openTestDatabase();
    app = await buildApp({ config: { ...testConfig, workers: 2 }, store: database.store });
    s = await seedCourse(app);
    dir = await mkdtemp(join(tmpdir(), 'rateproof-test-kind-'));
  }, 60_000);
  afterAll(async () => {
    await app?.close();
    await database?.close();
    await rm(dir, { recursive: true, force: true });
  });

  it('takes its settings, refusing a bad one by its field', async () => {
    const bad = await call(app, 'POST', `/v1/courses/${s.course.id}/assignments`, s.instructorToken, { title: 'Decay runs (invented)', settings: { kind: DECAY_RUNS, tolerance: 5 } }, 400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path)).toEqual(['body.settings.tolerance']);
    const assignment = (await call(app, 'POST', `/v1/courses/${s.course.id}/assignments`, s.instructorToken, { title: 'Decay runs (invented)', settings: { kind: DECAY_RUNS } }, 201)).body;
    expect(assignment.settings).toEqual({ kind: DECAY_RUNS, tolerance: 0.03, pointsPerRun: 2, minReadings: 6, late: { policy: 'grade', points: 0 } });
    expect(assignment.stages).toEqual([{ id: 'runs', title: 'Each run: k' }, { id: 'handing-in', title: 'Handing in' }]);
    // The late policy is refused by its field like any other setting.
    const deductNothing = await call(app, 'POST', `/v1/courses/${s.course.id}/assignments`, s.instructorToken, { title: 'Decay runs (invented)', settings: { kind: DECAY_RUNS, late: { policy: 'deduct', points: 0 } } }, 400);
    expect(deductNothing.body.error.details.map((d: { path: string }) => d.path)).toEqual(['body.settings.late.points']);
    url = `/v1/sections/${s.sectionA.id}/assignments/${assignment.id}`;
  });

  it('checks a JSON batch and a CSV upload in the worker threads: scipy’s k, the hand-worked causes and scores', async () => {
    const stored = (await call(app, 'POST', `${url}/submissions`, s.taAToken, SECTION, 201)).body.stored as Array<{ studentId: string; submissionId: number; score: number }>;
    // S-001 right in both runs (2 + 2 of 4); S-002 and S-003 wrong in both.
    expect(stored.map((r) => [r.studentId, r.score])).toEqual([['S-001', 4], ['S-002', 0], ['S-003', 0]]);
    const boundary = 'decayboundary';
    const payload = `--${boundary}\r\nContent-Disposition: form-data; name="readings"; filename="readings.csv"\r\nContent-Type: text/csv\r\n\r\n${readingsCsv('S-004', 0.1, 0.25)}\r\n--${boundary}--\r\n`;
    const fromCsv = await app.inject({ method: 'POST', url: `${url}/submissions`, headers: { authorization: `Bearer ${s.taAToken}`, 'content-type': `multipart/form-data; boundary=${boundary}` }, payload });
    expect(fromCsv.statusCode).toBe(201);
    // 0.100 against 0.1201 in run A: off by 17 %, none of the slips: unexplained, 2 points.
    expect(fromCsv.json().stored.map((r: { studentId: string; score: number }) => [r.studentId, r.score])).toEqual([['S-004', 2]]);
    ids = Object.fromEntries([...stored, ...fromCsv.json().stored].map((r: { studentId: string; submissionId: number }) => [r.studentId, r.submissionId]));

    const view = async (id: string) => (await call(app, 'GET', `/v1/submissions/${ids[id]}`, s.taAToken, undefined, 200)).body.result;
    const first = await view('S-001');
    const [a, b] = first.refit.runs as RunRefit[];
    expect(a.k.value).toBeCloseTo(EXPECTED.A.k, 12);
    expect(a.k.standardError).toBeCloseTo(EXPECTED.A.standardError, 12);
    expect(b.k.value).toBeCloseTo(EXPECTED.B.k, 12);
    expect(b.k.standardError).toBeCloseTo(EXPECTED.B.standardError, 12);
    expect(codesOf(first)).toEqual([]);
    expect(codesOf(await view('S-002'))).toEqual(['sign-flipped', 'log-base']);
    expect(codesOf(await view('S-003'))).toEqual(['half-life-for-k', 'unexplained']);
    expect((await view('S-004')).findings).toEqual([expect.objectContaining({ code: 'unexplained', path: 'runs[0].reported.k', pointsLost: 2 })]);
    // The kind's own signal: run B has 4 readings of the 6 asked for.
    expect(first.signals).toEqual([expect.objectContaining({ code: 'few-readings', path: 'runs[1].readings', evidence: { readings: 4, minReadings: 6 } })]);
  });

  it('puts the kind’s own signal on a sheet at a TA’s choice, and refuses a code the kind does not raise', async () => {
    await call(app, 'POST', `/v1/submissions/${ids['S-001']}/signals`, s.taAToken, { code: 'few-readings', path: 'runs[1].readings', onSheet: true }, 201);
    const other = await call(app, 'POST', `/v1/submissions/${ids['S-001']}/signals`, s.taAToken, { code: 'small-change', path: 'runs[1].readings', onSheet: true }, 400);
    expect(other.body.error.details).toEqual([{ path: 'body.code', message: "small-change is not a signal of this assignment's kind: one of few-readings" }]);
    const sheet = await pdf(`/v1/submissions/${ids['S-001']}/feedback.pdf`);
    expect(sheet).toContain('Run “B” has 4 readings; the assignment asks for 6.');
  });

  it('compares the section’s readings: all four students hand in the same readings', async () => {
    const signals = (await call(app, 'GET', `${url}/signals`, s.taAToken, undefined, 200)).body;
    expect(signals.notCompared).toBeUndefined();
    expect(signals.groups.map((g: string[]) => [...g].sort())).toEqual([['S-001', 'S-002', 'S-003', 'S-004']]);
  });

  it('draws the sheet and the summary from the kind’s report parts', async () => {
    const sheet = await pdf(`/v1/submissions/${ids['S-003']}/feedback.pdf`);
    expect(sheet).toContain('Each run: reported and refitted k');
    expect(sheet).toContain('half-life-for-k');
    expect(sheet).toContain('ln F against t, run by run');
    // scipy's k of run A (0.1201365) and its standard error (0.000811) to two figures, k to the same place.
    expect(sheet).toContain('A 5.770 0.12014 ± 0.00081 min⁻¹');
    const summary = await pdf(`${url}/summary.pdf`);
    expect(summary).toContain('TOLERANCE ON K 3 %');
    expect(summary).toContain('The class’s k, run by run');
    // Every student's run A refits to the same k: median and range 0.1201.
    expect(summary).toContain('A 4 0.1201 0.1201 to 0.1201');
  });

  it('goes through the command: JSON results, and sheets, gradebook and summary with --out', async () => {
    await writeFile(join(dir, 'assignment.json'), JSON.stringify({ kind: DECAY_RUNS }));
    await writeFile(join(dir, 'batch.json'), JSON.stringify(SECTION));
    let stdout = '';
    const io = { stdout: (t: string) => (stdout += t), stderr: () => {}, readFile: (p: string) => readFile(p, 'utf8') };
    expect(await run(['check', '--assignment', join(dir, 'assignment.json'), join(dir, 'batch.json'), '--json'], io)).toBe(0);
    const checked = JSON.parse(stdout) as Array<{ studentId: string; score: number; findings: Array<{ code: string }>; refit: { runs: RunRefit[] } }>;
    expect(checked.map((r) => [r.studentId, r.score, codesOf(r)])).toEqual([
      ['S-001', 4, []],
      ['S-002', 0, ['sign-flipped', 'log-base']],
      ['S-003', 0, ['half-life-for-k', 'unexplained']],
    ]);
    expect(checked[0].refit.runs[1].k.value).toBeCloseTo(EXPECTED.B.k, 12);
    expect(await run(['check', '--assignment', join(dir, 'assignment.json'), join(dir, 'batch.json'), '--out', join(dir, 'out')], io)).toBe(0);
    expect((await readdir(join(dir, 'out'))).sort()).toEqual(['S-001.pdf', 'S-002.pdf', 'S-003.pdf', 'gradebook.csv', 'summary.pdf']);
    expect(folded(await pdfText(await readFile(join(dir, 'out', 'S-002.pdf'))))).toContain('sign-flipped');
  });
});
