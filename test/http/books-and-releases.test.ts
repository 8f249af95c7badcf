import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { DRAFT_NOTE } from '../../reports/feedback-input.ts';
import { call, openApi, regradeAndWait, seedCourse, submissionsFor, type Api, type Seed } from '../support/api-fixture.ts';
import { folded, pdfText } from '../support/pdf-reading.ts';
import { unzip } from '../support/zip-entries.ts';

interface Finding { id: string; pointsLost: number; rubricItem?: string; itemKey?: string }
interface Item { item: string; count: number; each: number }
interface Result { score: number; maxScore: number; items: Item[]; findings: Finding[] }
interface Row { studentId: string; submissionId: number | null; score: number | null; maxScore: number | null; released: boolean; releasedScore: number | null; changedSinceRelease: boolean }

/** The test's own account of what a finding may be set to: its instance's worth (or its item's) less the other findings' points there. */
function ownLimit(r: Result, target: Finding): number {
  const item = r.items.find((c) => c.item === target.rubricItem);
  if (!item) return 0;
  const sameInstance = (f: Finding) => (target.itemKey ? f.itemKey === target.itemKey : f.rubricItem === target.rubricItem);
  const others = r.findings.filter((f) => f.id !== target.id && sameInstance(f)).reduce((s, f) => s + f.pointsLost, 0);
  return (target.itemKey ? item.each : item.each * item.count) - others;
}

/** The books of a result as the test adds them up: score = max - lost, each item within its worth. */
function expectBooksHold(r: Result): void {
  const max = r.items.reduce((s, c) => s + c.each * c.count, 0);
  const lost = r.findings.reduce((s, f) => s + f.pointsLost, 0);
  expect(r.maxScore).toBeCloseTo(max, 9);
  expect(r.score).toBeCloseTo(max - lost, 9);
  expect(r.score).toBeGreaterThanOrEqual(0);
  for (const c of r.items) expect(r.findings.filter((f) => f.rubricItem === c.item).reduce((s, f) => s + f.pointsLost, 0)).toBeLessThanOrEqual(c.each * c.count + 1e-9);
}

/** Submissions with slips a checker charges: k and k_N with their signs lost in some runs. */
function slipped(ids: string[], seed: number) {
  const random = seededRandom(seed);
  return submissionsFor(ids, seed).map((s) => {
    for (const run of s.runs) if (random() < 0.5 && run.reported?.k) run.reported.k.value = -Number(run.reported.k.value);
    return s;
  });
}

const gradebookScores = (csv: string) => new Map(csv.trim().split('\r\n').slice(1).map((line) => line.split(',')).map(([id, score]) => [id, score]));

describe('books and releases through the API', () => {
  let api: Api;
  let s: Seed;
  const url = () => `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}`;
  const table = async (): Promise<Row[]> => (await call(api.app, 'GET', `${url()}/results`, s.taAToken, undefined, 200)).body;
  const gradebook = async () => gradebookScores((await api.app.inject({ method: 'GET', url: `${url()}/gradebook.csv`, headers: { authorization: `Bearer ${s.taAToken}` } })).body);
  const view = async (id: number) => (await call(api.app, 'GET', `/v1/submissions/${id}`, s.taAToken, undefined, 200)).body;

  beforeAll(async () => {
    api = await openApi('postgres');
    s = await seedCourse(api.app);
  }, 60_000);
  afterAll(async () => api?.close());

  it('an override beyond what its rubric item has left is a 422 naming the limit, and nothing is stored', async () => {
    const [one] = submissionsFor(['S-006'], 7);
    one.runs[0].reported!.k!.value = -Number(one.runs[0].reported!.k!.value);
    const id = (await call(api.app, 'POST', `${url()}/submissions`, s.taAToken, [one], 201)).body.stored[0].submissionId;
    const before = await view(id);
    const finding = before.result.findings.find((f: Finding) => f.id === 'sign-flipped@runs[0].reported.k');
    // The generated settings' k item is worth 2 per run (from the settings the fixture makes).
    expect(finding).toMatchObject({ pointsLost: 2, rubricItem: 'k', itemKey: 'k@runs[0]' });
    const refused = await call(api.app, 'POST', `/v1/submissions/${id}/overrides`, s.taAToken, { findingId: finding.id, pointsLost: 10, reason: 'too much' }, 422);
    expect(refused.body.error.details).toEqual([{ path: 'body.pointsLost', message: 'points must be between 0 and 2, what rubric item k@runs[0] has left' }]);
    expect((await view(id)).overrides).toEqual([]);
    expect((await view(id)).result.score).toBe(before.result.score);
  });

  it('random overrides: each one accepted keeps the books, each refused is a 422 with nothing stored', async () => {
    const ids = ['S-001', 'S-002', 'S-003', 'S-004', 'S-005'];
    const stored = (await call(api.app, 'POST', `${url()}/submissions`, s.taAToken, slipped(ids, 11), 201)).body.stored as Array<{ submissionId: number }>;
    const random = seededRandom(99);
    let accepted = 0;
    let refused = 0;
    for (let n = 0; n < 80; n++) {
      const id = stored[Math.floor(random() * stored.length)].submissionId;
      const current = await view(id);
      const charged = (current.result as Result).findings.filter((f) => f.rubricItem);
      if (charged.length === 0) continue;
      const target = charged[Math.floor(random() * charged.length)];
      const limit = ownLimit(current.result, target);
      const points = Math.round(random() * (limit + 2) * 4) / 4;
      const res = await call(api.app, 'POST', `/v1/submissions/${id}/overrides`, s.taAToken, { findingId: target.id, pointsLost: points, reason: 'checked by hand' });
      if (points <= limit + 1e-9) {
        expect(res.status).toBe(201);
        expect(res.body.result.findings.find((f: Finding) => f.id === target.id).pointsLost).toBeCloseTo(points, 9);
        expectBooksHold(res.body.result);
        accepted++;
      } else {
        expect(res.status).toBe(422);
        expect(res.body.error.details[0].message).toContain(`between 0 and ${limit}`);
        const after = await view(id);
        expect(after.overrides.length).toBe(current.overrides.length);
        expect(after.result.score).toBe(current.result.score);
        refused++;
      }
    }
    expect(accepted).toBeGreaterThan(10);
    expect(refused).toBeGreaterThan(10);
    // The table and the gradebook carry the same scores as each result.
    const rows = await table();
    const book = await gradebook();
    for (const { submissionId } of stored) {
      const r = (await view(submissionId)).result as Result;
      expectBooksHold(r);
      const row = rows.find((x) => x.submissionId === submissionId)!;
      expect(row.score).toBe(r.score);
      expect(Number(book.get(row.studentId))).toBeCloseTo(r.score, 9);
    }
  });

  it('a regrade after a release leaves every released student released, showing what was released until released again', async () => {
    const released = await call(api.app, 'POST', `${url()}/release`, s.taAToken, undefined, 200);
    const shown = await table();
    const submitted = shown.filter((r) => r.submissionId !== null);
    expect(released.body.released).toBe(submitted.length);
    for (const r of submitted) expect(r).toMatchObject({ released: true, releasedScore: r.score, changedSinceRelease: false });
    // A finding overridden (by the test before) and released, to follow through the regrade.
    let overridden: { submissionId: number; finding: Finding & { override: { pointsLost: number } } } | undefined;
    for (const r of submitted) {
      const finding = (await view(r.submissionId!)).result.findings.find((f: { override?: unknown }) => f.override);
      if (finding && !overridden) overridden = { submissionId: r.submissionId!, finding };
    }
    expect(overridden).toBeDefined();

    // A regrade under the same settings changes nothing a student sees.
    await regradeAndWait(api.app, s.instructorToken, s.assignment.id, { sectionId: s.sectionA.id });
    for (const r of (await table()).filter((x) => x.submissionId !== null)) expect(r).toMatchObject({ released: true, changedSinceRelease: false, releasedScore: shown.find((x) => x.studentId === r.studentId)!.score });
    expect((await call(api.app, 'POST', `${url()}/release`, s.taAToken, undefined, 200)).body.released).toBe(0);

    // k now worth 3 a run: every maximum changes.
    await call(api.app, 'PATCH', `/v1/assignments/${s.assignment.id}/settings`, s.instructorToken, { settings: { rubric: { k: 3 } } }, 200);
    await regradeAndWait(api.app, s.instructorToken, s.assignment.id, { sectionId: s.sectionA.id });
    const after = await table();
    const book = await gradebook();
    for (const r of after.filter((x) => x.submissionId !== null)) {
      const before = shown.find((x) => x.studentId === r.studentId)!;
      const latest = (await view(r.submissionId!)).result as Result;
      expect(r).toMatchObject({ released: true, releasedScore: before.score, score: latest.score, changedSinceRelease: true });
      expect(Number(book.get(r.studentId))).toBe(before.score);
    }
    // The override carried over to the new result, which raises the same finding (k's worth only grew).
    const again = (await view(overridden!.submissionId)).result.findings.find((f: Finding) => f.id === overridden!.finding.id);
    expect(again).toMatchObject({ pointsLost: overridden!.finding.override.pointsLost, override: { reason: 'checked by hand' } });

    // One action releases them all; the gradebook then shows the new scores.
    expect((await call(api.app, 'POST', `${url()}/release`, s.taAToken, undefined, 200)).body.released).toBe(submitted.length);
    const now = await table();
    const newBook = await gradebook();
    for (const r of now.filter((x) => x.submissionId !== null)) {
      expect(r).toMatchObject({ released: true, releasedScore: r.score, changedSinceRelease: false });
      expect(Number(newBook.get(r.studentId))).toBe(r.score);
    }
  });

  it('an override after a release waits for the next release; one student is released on their own', async () => {
    const row = (await table()).find((r) => r.studentId === 'S-006')!;
    const finding = (await view(row.submissionId!)).result.findings.find((f: Finding) => f.id === 'sign-flipped@runs[0].reported.k');
    await call(api.app, 'POST', `/v1/submissions/${row.submissionId}/overrides`, s.taAToken, { findingId: finding.id, pointsLost: 0, reason: 'the sign is right in the lab book' }, 201);
    const changed = (await table()).filter((r) => r.changedSinceRelease);
    expect(changed.map((r) => r.studentId)).toEqual(['S-006']);
    expect(changed[0]).toMatchObject({ released: true, releasedScore: row.score, score: row.score! + finding.pointsLost });
    expect(Number((await gradebook()).get('S-006'))).toBe(row.score);
    expect((await view(row.submissionId!)).release).toMatchObject({ score: row.score, changedSinceRelease: true });
    // The sheet is still the released one; a TA previews the new one, marked as a draft.
    const sheet = async (query: string) => folded(await pdfText((await api.app.inject({ method: 'GET', url: `/v1/submissions/${row.submissionId}/feedback.pdf${query}`, headers: { authorization: `Bearer ${s.taAToken}` } })).rawPayload));
    const shown = await sheet('');
    expect(shown).toContain(`${row.score} / ${row.maxScore} points`);
    expect(shown).not.toContain(DRAFT_NOTE);
    const preview = await sheet('?latest=true');
    expect(preview).toContain(`${row.score! + finding.pointsLost} / ${row.maxScore} points`);
    expect(preview).toContain(DRAFT_NOTE);
    expect((await call(api.app, 'POST', `/v1/submissions/${row.submissionId}/release`, s.taAToken, undefined, 200)).body.released).toBe(1);
    expect((await table()).find((r) => r.studentId === 'S-006')).toMatchObject({ releasedScore: row.score! + finding.pointsLost, changedSinceRelease: false });
  });

  it('a signal put on the sheet carries over to the regraded result, and the student is not marked changed', async () => {
    const [spread] = submissionsFor(['S-001'], 6);
    // Two runs 2.5 degrees apart: the checker raises a temperature-spread signal (as in the API flow test).
    spread.runs[0].temperatureC = 25;
    spread.runs[1].temperatureC = 27.5;
    const id = (await call(api.app, 'POST', `${url()}/submissions`, s.taAToken, [spread], 201)).body.stored[0].submissionId;
    await call(api.app, 'POST', `/v1/submissions/${id}/signals`, s.taAToken, { code: 'temperature-spread', path: 'runs', onSheet: true }, 201);
    expect((await call(api.app, 'POST', `/v1/submissions/${id}/release`, s.taAToken, undefined, 200)).body.released).toBe(1);
    const before = await view(id);
    await regradeAndWait(api.app, s.instructorToken, s.assignment.id, { sectionId: s.sectionA.id });
    const after = await view(id);
    expect(after.result.resultId).not.toBe(before.result.resultId);
    expect(after.result.signals).toEqual([expect.objectContaining({ code: 'temperature-spread', path: 'runs', onSheet: true })]);
    expect(after.release).toMatchObject({ score: before.result.score, changedSinceRelease: false });
    expect((await table()).find((r) => r.studentId === 'S-001')).toMatchObject({ released: true, changedSinceRelease: false });
  });

  it('a new version after a release shows the student the released version until a TA releases the new one', async () => {
    // Worked by hand (test/casebook/cases/foc-sucrose-sign-flipped.json and foc-sucrose-origin-clean.json):
    // sucrose inversion at 35 C, rotation 32.4, 28.8, 25.5, 22.4, 19.6 deg at 0-40 min, r_inf -11.1 deg;
    // the through-origin ln F fit gives k = 8.698e-3 min^-1, SE 1.39e-5, so 0.008698 +/- 0.000014 is right.
    const sucrose = (k: string) => ({
      studentId: 'S-001',
      runs: [
        {
          label: '0.5 M HCl',
          catalyst: { value: 0.5, unit: 'M' },
          timeUnit: 'min',
          readings: [[0, 32.4], [10, 28.8], [20, 25.5], [30, 22.4], [40, 19.6]],
          infinity: -11.1,
          reported: { lnF: ['0.00000', '-0.08638', '-0.17271', '-0.26122', '-0.34850'], k: { value: k, uncertainty: '0.000014', unit: 'min^-1' } },
        },
      ],
    });
    // One run under the default rubric: ln F column 1 + k 2 + its SE 1 = 4 points.
    const settings = { kind: 'first-order-catalysis', fitModel: 'origin', displayStep: 0.1 };
    const assignment = (await call(api.app, 'POST', `/v1/courses/${s.course.id}/assignments`, s.instructorToken, { title: 'Sucrose inversion (invented)', settings }, 201)).body;
    const here = `/v1/sections/${s.sectionA.id}/assignments/${assignment.id}`;
    const get = (path: string) => api.app.inject({ method: 'GET', url: path, headers: { authorization: `Bearer ${s.taAToken}` } });
    const row = async (): Promise<Row & { version: number; releasedVersion: number | null }> => (await call(api.app, 'GET', `${here}/results`, s.taAToken, undefined, 200)).body.find((r: Row) => r.studentId === 'S-001');
    const bookLine = async () => (await get(`${here}/gradebook.csv`)).body.split('\r\n').find((l) => l.startsWith('S-001,'));
    const sheet = async (id: number, query = '') => folded(await pdfText((await get(`/v1/submissions/${id}/feedback.pdf${query}`)).rawPayload));
    const zipSheet = async () => folded(await pdfText((await unzip((await get(`${here}/feedback.zip`)).rawPayload)).find((e) => /^Physical_chemistry_lab_invented-A-Sucrose_inversion_invented-S-001-v\d+-feedback\.pdf$/.test(e.name))!.data));

    // Version 1: the slope reported as k, its sign lost: k's 2 points, 4 - 2 = 2.
    const v1 = (await call(api.app, 'POST', `${here}/submissions`, s.taAToken, [sucrose('-0.008698')], 201)).body.stored[0].submissionId;
    const graded1 = (await view(v1)).result as Result;
    expect(graded1.findings.filter((f) => f.pointsLost > 0).map((f) => [f.id, f.pointsLost])).toEqual([['sign-flipped@runs[0].reported.k', 2]]);
    expect([graded1.score, graded1.maxScore]).toEqual([2, 4]);
    expect((await call(api.app, 'POST', `/v1/submissions/${v1}/release`, s.taAToken, undefined, 200)).body.released).toBe(1);

    // Version 2: the same work with k's sign right: nothing to charge, 4 of 4.
    const v2 = (await call(api.app, 'POST', `${here}/submissions`, s.taAToken, [sucrose('0.008698')], 201)).body.stored[0].submissionId;
    expect((await view(v2)).result).toMatchObject({ score: 4, maxScore: 4 });

    // The student still sees version 1: the gradebook, the sheet and the ZIP; the row says it changed.
    expect(await row()).toMatchObject({ submissionId: v2, version: 2, score: 4, released: true, releasedScore: 2, releasedVersion: 1, changedSinceRelease: true });
    expect(await bookLine()).toMatch(/^S-001,2,4,checked,1,\d+,\d+,sign-flipped,Sucrose inversion \(invented\)$/);
    for (const shown of [await sheet(v2), await zipSheet()]) {
      expect(shown).toContain('version 1');
      expect(shown).toContain('2 / 4 points');
      expect(shown).not.toContain(DRAFT_NOTE);
    }
    expect((await view(v2)).release).toMatchObject({ version: 1, score: 2, changedSinceRelease: true });
    expect((await view(v1)).release).toMatchObject({ version: 1, score: 2, changedSinceRelease: false });
    // A TA previews version 2, marked as a draft.
    const preview = await sheet(v2, '?latest=true');
    expect(preview).toContain('version 2');
    expect(preview).toContain('4 / 4 points');
    expect(preview).toContain(DRAFT_NOTE);

    // Releasing version 1 again would hide a newer version's release later: refused, nothing stored.
    const older = await call(api.app, 'POST', `/v1/submissions/${v1}/release`, s.taAToken, undefined, 409);
    expect(older.body.error.details).toEqual([{ path: 'params.submissionId', message: 'version 1 of 2' }]);
    expect(await row()).toMatchObject({ releasedScore: 2, changedSinceRelease: true });

    // The section release covers the new version; the student then sees 4 of 4.
    expect((await call(api.app, 'POST', `${here}/release`, s.taAToken, undefined, 200)).body.released).toBe(1);
    expect(await row()).toMatchObject({ submissionId: v2, score: 4, released: true, releasedScore: 4, releasedVersion: 2, changedSinceRelease: false });
    expect(await bookLine()).toMatch(/^S-001,4,4,checked,0,\d+,\d+,,Sucrose inversion \(invented\)$/);
    const now = await sheet(v2);
    expect(now).toContain('version 2');
    expect(now).toContain('4 / 4 points');
    expect((await call(api.app, 'POST', `${here}/release`, s.taAToken, undefined, 200)).body.released).toBe(0);
  });
});
