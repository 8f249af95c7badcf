import { mkdtemp, readFile, readdir, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { run } from '../../server/cli.ts';
import { call, openApi, seedCourse, type Api, type Seed } from '../support/api-fixture.ts';
import { folded, pdfText } from '../support/pdf-reading.ts';

/**
 * The kind `temperature-dependence` through the service and the command, on invented data: rate
 * constants at five temperatures (E_a near 80 kJ/mol); one student reports with R in calories.
 */
const R = 8.314462618;
const T = [288.15, 298.15, 308.15, 318.15, 328.15];
const wobble = [1.006, 0.995, 1.003, 0.992, 1.004];
const k = T.map((t, i) => 5e10 * Math.exp(-80000 / (R * t)) * wobble[i]);
const points = T.map((t, i) => ({ label: `${(t - 273.15).toFixed(0)} °C`, temperature: { value: t, unit: 'K' }, k: { value: k[i].toPrecision(4), unit: 's^-1' } }));

/** Least-squares E_a in kJ/mol from these points with gas constant `r`, computed here apart from the engine. */
function activationEnergy(r: number): number {
  const x = T.map((t) => 1 / t);
  const y = points.map((p) => Math.log(Number(p.k.value)));
  const mx = x.reduce((a, b) => a + b, 0) / x.length;
  const my = y.reduce((a, b) => a + b, 0) / y.length;
  const slope = x.reduce((s, xi, i) => s + (xi - mx) * (y[i] - my), 0) / x.reduce((s, xi) => s + (xi - mx) ** 2, 0);
  return (-slope * r) / 1000;
}
const submission = (studentId: string, r: number) => ({ studentId, points, reported: { Ea: { value: activationEnergy(r).toPrecision(4), unit: 'kJ mol^-1' } } });
const settings = { kind: 'temperature-dependence', rubric: { EaUncertainty: 0, A: 0, dH: 0, dS: 0 } };

describe('the temperature-dependence kind through the service and the command', () => {
  let api: Api;
  let s: Seed;
  let dir: string;
  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
    dir = await mkdtemp(join(tmpdir(), 'rateproof-td-'));
  }, 60_000);
  afterAll(async () => {
    await api?.close();
    await rm(dir, { recursive: true, force: true });
  });

  it('grades a batch, and draws the sheet with its Arrhenius plot and the summary with the class values', async () => {
    const assignment = (await call(api.app, 'POST', `/v1/courses/${s.course.id}/assignments`, s.instructorToken, { title: 'Activation energy (invented)', settings }, 201)).body;
    expect(assignment.stages.map((x: { id: string }) => x.id)).toEqual(['runs', 'arrhenius', 'eyring', 'reporting', 'handing-in']);
    const url = `/v1/sections/${s.sectionA.id}/assignments/${assignment.id}`;
    const stored = (await call(api.app, 'POST', `${url}/submissions`, s.taAToken, [submission('S-001', R), submission('S-002', 1.987)], 201)).body;
    expect(stored.stored.map((x: { score: number }) => x.score)).toEqual([2, 0]);
    const view = (await call(api.app, 'GET', `/v1/submissions/${stored.stored[1].submissionId}`, s.taAToken, undefined, 200)).body;
    expect(view.result.findings.map((f: { id: string }) => f.id)).toEqual(['gas-constant@reported.Ea']);
    const pdf = async (path: string) => folded(await pdfText((await api.app.inject({ method: 'GET', url: path, headers: { authorization: `Bearer ${s.taAToken}` } })).rawPayload));
    const sheet = await pdf(`/v1/submissions/${view.submissionId}/feedback.pdf`);
    expect(sheet).toContain('Arrhenius: Ea and A');
    expect(sheet).toContain('gas-constant');
    expect(sheet).toContain('Arrhenius: ln k against 1/T');
    expect(sheet).toContain('Eyring: ln(k/T) against 1/T');
    const summary = await pdf(`${url}/summary.pdf`);
    expect(summary).toContain('The class’s activation parameters');
    expect(summary).toContain('FIT ordinary least squares');
    const gradebook = (await call(api.app, 'GET', `${url}/gradebook.csv`, s.taAToken, undefined, 200)).body as string;
    expect(gradebook.replace(/^\uFEFF/, '').split('\r\n')[2]).toBe('S-002,0,2,checked,1,0,0,gas-constant,Activation energy (invented)');
  });

  it('takes its CSV layout as a multipart upload: a points file and a reported file', async () => {
    const assignment = (await call(api.app, 'POST', `/v1/courses/${s.course.id}/assignments`, s.instructorToken, { title: 'Activation energy, CSV (invented)', settings }, 201)).body;
    const pointsCsv = ['student_id,label,temperature,temperature_unit,k,k_unit', ...points.map((p) => `S-003,${p.label},${p.temperature.value},K,${p.k.value},s^-1`)].join('\n');
    const reportedCsv = `student_id,quantity,value,unit\nS-003,Ea,${activationEnergy(1.987).toPrecision(4)},kJ mol^-1`;
    const boundary = 'tdboundary';
    const part = (name: string, text: string) => `--${boundary}\r\nContent-Disposition: form-data; name="${name}"; filename="${name}.csv"\r\nContent-Type: text/csv\r\n\r\n${text}\r\n`;
    const res = await api.app.inject({
      method: 'POST',
      url: `/v1/sections/${s.sectionA.id}/assignments/${assignment.id}/submissions`,
      headers: { authorization: `Bearer ${s.taAToken}`, 'content-type': `multipart/form-data; boundary=${boundary}` },
      payload: part('points', pointsCsv) + part('reported', reportedCsv) + `--${boundary}--\r\n`,
    });
    expect(res.statusCode).toBe(201);
    const view = (await call(api.app, 'GET', `/v1/submissions/${res.json().stored[0].submissionId}`, s.taAToken, undefined, 200)).body;
    expect(view.result.findings.map((f: { id: string }) => f.id)).toEqual(['gas-constant@reported.Ea']);
  });

  it('checks a batch with the command', async () => {
    await writeFile(join(dir, 'assignment.json'), JSON.stringify(settings));
    await writeFile(join(dir, 'batch.json'), JSON.stringify([submission('s-01', R), submission('s-02', 1.987)]));
    let out = '';
    const io = { stdout: (t: string) => (out += t), stderr: () => {}, readFile: (p: string) => readFile(p, 'utf8') };
    expect(await run(['check', '--assignment', join(dir, 'assignment.json'), join(dir, 'batch.json'), '--json'], io)).toBe(0);
    expect(JSON.parse(out).map((r: { findings: Array<{ code: string }> }) => r.findings.map((f) => f.code))).toEqual([[], ['gas-constant']]);
    expect(await run(['check', '--assignment', join(dir, 'assignment.json'), join(dir, 'batch.json'), '--out', join(dir, 'out')], io)).toBe(0);
    expect((await readdir(join(dir, 'out'))).sort()).toEqual(['gradebook.csv', 's-01.pdf', 's-02.pdf', 'summary.pdf']);
    // The CSV layout: the points file, and --reported for the reported values.
    await writeFile(join(dir, 'points.csv'), ['student_id,label,temperature,temperature_unit,k,k_unit', ...points.map((p) => `s-03,${p.label},${p.temperature.value},K,${p.k.value},s^-1`)].join('\n'));
    await writeFile(join(dir, 'reported.csv'), `student_id,quantity,value,unit\ns-03,Ea,${(-activationEnergy(R)).toPrecision(4)},kJ/mol`);
    out = '';
    expect(await run(['check', '--assignment', join(dir, 'assignment.json'), join(dir, 'points.csv'), '--reported', join(dir, 'reported.csv'), '--json'], io)).toBe(0);
    expect(JSON.parse(out).map((r: { findings: Array<{ code: string }> }) => r.findings.map((f) => f.code))).toEqual([['sign-flipped']]);
  });
});
