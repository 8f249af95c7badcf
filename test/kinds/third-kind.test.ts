import { mkdtemp, readFile, readdir, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../server/app.ts';
import { run } from '../../server/cli.ts';
import { registerKind } from '../../kinds/registry.ts';
import { sharedFindingCodes } from '../../schemas/result.ts';
import { call, seedCourse, testConfig, type Seed } from '../support/api-fixture.ts';
import { folded, pdfText } from '../support/pdf-reading.ts';
import { openTestDatabase, type TestDatabase } from '../support/test-database.ts';
import { unzip } from '../support/zip-entries.ts';
import { ZERO_ORDER, zeroOrderKind, zeroOrderReport, zeroOrderSubmission } from '../support/zero-order-kind.ts';
import { kindFor } from '../../kinds/registry.ts';

/**
 * A third kind, registered here in the test suite only, runs through the API and the command with
 * nothing else changed: settings, a batch with a refused submission, findings with the kind's own
 * code and stage, an override, the sheet, the summary, the gradebook, the ZIP and release; and
 * `rateproof check` with JSON and with --out. It is registered in this thread only (registerKind),
 * so it runs in the service's own thread (RATEPROOF_WORKERS=0); registerKindModule reaches the worker
 * threads too (test/kinds/test-kind.test.ts).
 */
registerKind({ checker: zeroOrderKind, report: async () => zeroOrderReport });

describe('a kind registered in one line', () => {
  let database: TestDatabase;
  let app: Awaited<ReturnType<typeof buildApp>>;
  let s: Seed;
  let url: string;
  let dir: string;
  const pdf = async (path: string) => folded(await pdfText((await app.inject({ method: 'GET', url: path, headers: { authorization: `Bearer ${s.taAToken}` } })).rawPayload));

  beforeAll(async () => {
    database = await openTestDatabase();
    app = await buildApp({ config: { ...testConfig, workers: 0 }, store: database.store });
    s = await seedCourse(app);
    dir = await mkdtemp(join(tmpdir(), 'rateproof-kind-'));
  }, 60_000);
  afterAll(async () => {
    await app?.close();
    await database?.close();
    await rm(dir, { recursive: true, force: true });
  });

  it('the built-in kind lists every shared finding code among its own', () => {
    expect(sharedFindingCodes.filter((c) => !kindFor('first-order-catalysis')!.findingCodes.includes(c))).toEqual([]);
  });

  it('goes through the API: settings, a batch, findings, an override, documents and release', async () => {
    const bad = await call(app, 'POST', `/v1/courses/${s.course.id}/assignments`, s.instructorToken, { title: 'Zero order (invented)', settings: { kind: ZERO_ORDER, tolerance: 5 } }, 400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path)).toEqual(['body.settings.tolerance']);
    const assignment = (await call(app, 'POST', `/v1/courses/${s.course.id}/assignments`, s.instructorToken, { title: 'Zero order (invented)', settings: { kind: ZERO_ORDER } }, 201)).body;
    url = `/v1/sections/${s.sectionA.id}/assignments/${assignment.id}`;
    // The workspace groups findings by the stages the assignment's kind names.
    expect(assignment.stages).toEqual([{ id: 'line', title: 'The line: k' }]);

    const batch = [
      zeroOrderSubmission('S-001', 0.05, 0.05),
      zeroOrderSubmission('S-002', 0.05, -0.05),
      zeroOrderSubmission('S-003', 0.05, 1.0),
      { studentId: 'S-004', points: [[0, 1]], reported: { k: 0.05 } },
    ];
    const stored = (await call(app, 'POST', `${url}/submissions`, s.taAToken, batch, 201)).body;
    expect(stored.stored.map((r: { studentId: string; score: number }) => [r.studentId, r.score])).toEqual([['S-001', 2], ['S-002', 0], ['S-003', 0]]);
    expect(stored.rejected).toEqual([expect.objectContaining({ studentId: 'S-004', path: 'points' })]);

    const results = (await call(app, 'GET', `${url}/results`, s.taAToken, undefined, 200)).body;
    const codes = (id: string) => results.find((r: { studentId: string }) => r.studentId === id);
    expect(codes('S-003')).toMatchObject({ status: 'checked', score: 0 });

    const view = (await call(app, 'GET', `/v1/submissions/${stored.stored[2].submissionId}`, s.taAToken, undefined, 200)).body;
    expect(view.result.findings).toEqual([expect.objectContaining({ id: 'intercept-for-slope@reported.k', code: 'intercept-for-slope', stage: 'line' })]);
    const overridden = (await call(app, 'POST', `/v1/submissions/${view.submissionId}/overrides`, s.taAToken, { findingId: 'intercept-for-slope@reported.k', pointsLost: 1, reason: 'half credit for the line', showReason: true }, 201)).body;
    expect(overridden.result.score).toBe(1);

    const sheet = await pdf(`/v1/submissions/${view.submissionId}/feedback.pdf`);
    expect(sheet).toContain('The line: k');
    expect(sheet).toContain('intercept-for-slope');
    expect(sheet).toContain('k of the line');
    expect(sheet).toContain(`Refit k = ${view.result.refit.k.value.toPrecision(4)}`);
    expect(sheet).toContain('Reason: half credit for the line');

    const summary = await pdf(`${url}/summary.pdf`);
    expect(summary).toContain('TOLERANCE ON K 2 %');
    expect(summary).toContain('The class’s zero-order k');
    expect(summary).toContain('intercept-for-slope');

    const gradebook = (await call(app, 'GET', `${url}/gradebook.csv`, s.taAToken, undefined, 200)).body as string;
    expect(gradebook.replace(/^\uFEFF/, '').split('\r\n').slice(1, 4)).toEqual(['S-001,2,2,checked,0,0,0,,Zero order (invented)', 'S-002,0,2,checked,1,0,0,sign-flipped,Zero order (invented)', 'S-003,1,2,checked,1,0,0,intercept-for-slope,Zero order (invented)']);
    const zip = await app.inject({ method: 'GET', url: `${url}/feedback.zip`, headers: { authorization: `Bearer ${s.taAToken}` } });
    expect((await unzip(zip.rawPayload)).map((e) => e.name).filter((n) => n.endsWith('.pdf'))).toHaveLength(3);

    const signals = (await call(app, 'GET', `${url}/signals`, s.taAToken, undefined, 200)).body;
    expect(signals.notCompared).toBe('signals across a section are not worked out for this kind of experiment');
    expect((await call(app, 'POST', `${url}/release`, s.taAToken, undefined, 200)).body.released).toBe(3);
  });

  it('answers a CSV upload for a kind without a CSV layout with a 400 that says so', async () => {
    const boundary = 'kindboundary';
    const payload = `--${boundary}\r\nContent-Disposition: form-data; name="readings"; filename="r.csv"\r\nContent-Type: text/csv\r\n\r\nstudent_id\r\n--${boundary}--\r\n`;
    const res = await app.inject({ method: 'POST', url: `${url}/submissions`, headers: { authorization: `Bearer ${s.taAToken}`, 'content-type': `multipart/form-data; boundary=${boundary}` }, payload });
    expect(res.statusCode).toBe(400);
    expect(res.json().error.details).toEqual([{ path: 'body', message: `the kind ${ZERO_ORDER} has no CSV layout: send the submissions as a JSON array` }]);
  });

  it('goes through the command: JSON results, and sheets, gradebook and summary with --out', async () => {
    await writeFile(join(dir, 'assignment.json'), JSON.stringify({ kind: ZERO_ORDER }));
    await writeFile(join(dir, 'batch.json'), JSON.stringify([zeroOrderSubmission('s-01', 0.04, 0.04), zeroOrderSubmission('s-02', 0.04, -0.04)]));
    let stdout = '';
    const io = { stdout: (t: string) => (stdout += t), stderr: () => {}, readFile: (p: string) => readFile(p, 'utf8') };
    expect(await run(['check', '--assignment', join(dir, 'assignment.json'), join(dir, 'batch.json'), '--json'], io)).toBe(0);
    const checked = JSON.parse(stdout);
    expect(checked.map((r: { studentId: string; findings: Array<{ code: string }> }) => [r.studentId, r.findings.map((f) => f.code)])).toEqual([
      ['s-01', []],
      ['s-02', ['sign-flipped']],
    ]);
    expect(await run(['check', '--assignment', join(dir, 'assignment.json'), join(dir, 'batch.json'), '--out', join(dir, 'out')], io)).toBe(0);
    expect((await readdir(join(dir, 'out'))).sort()).toEqual(['gradebook.csv', 's-01.pdf', 's-02.pdf', 'summary.pdf']);
    const refitK = checked[1].refit.k.value as number;
    expect(folded(await pdfText(await readFile(join(dir, 'out', 's-02.pdf'))))).toContain(`Refit k = ${refitK.toPrecision(4)}`);
  });
});
