import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openApi, call, regradeAndWait, seedCourse, submissionsFor, type Api, type Seed } from '../support/api-fixture.ts';
import { zipEntryNames } from '../support/zip-entries.ts';
import { folded, pdfText } from '../support/pdf-reading.ts';
import { DRAFT_NOTE } from '../../reports/feedback-input.ts';

// The same flow on a PostgreSQL server and once on the embedded engine (PGlite).
describe.each(['postgres', 'pglite'] as const)('the API on %s', (engine) => {
  let api: Api;
  let s: Seed;
  const url = () => `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}`;

  beforeAll(async () => {
    api = await openApi(engine);
    s = await seedCourse(api.app);
  }, 60_000);
  afterAll(async () => api?.close());

  it('stores and grades a batch; an invalid submission and an unknown student are listed and stored nowhere', async () => {
    const [good1, good2, bad] = submissionsFor(['S-001', 'S-002', 'S-003']);
    (bad.runs[0].readings[2] as unknown[])[1] = 'NaN';
    const stranger = submissionsFor(['S-999'], 2)[0];
    const res = await call(api.app, 'POST', `${url()}/submissions`, s.taAToken, [good1, good2, bad, stranger], 201);
    expect(res.body.stored.map((x: { studentId: string; version: number }) => [x.studentId, x.version])).toEqual([['S-001', 1], ['S-002', 1]]);
    expect(res.body.rejected).toEqual([
      { at: 'submission 3, line 1', studentId: 'S-003', path: 'runs[0].readings[2][1]', message: expect.stringContaining('number') },
      { at: 'submission 4, line 1', studentId: 'S-999', path: 'studentId', message: "not on this section's roster" },
    ]);
    const table = await call(api.app, 'GET', `${url()}/results`, s.taAToken, undefined, 200);
    // Every roster student has a row: a gradebook drops no one who has not submitted.
    expect(table.body.map((r: { studentId: string; status: string }) => [r.studentId, r.status])).toEqual([
      ['S-001', 'checked'],
      ['S-002', 'checked'],
      ['S-003', 'not-submitted'],
      ['S-004', 'not-submitted'],
      ['S-005', 'not-submitted'],
      ['S-006', 'not-submitted'],
    ]);
    // A TA's upload is on time by definition; nothing released, so nothing read.
    expect(table.body[0]).toMatchObject({ version: 1, status: 'checked', score: 22, maxScore: 22, released: false, source: 'staff', late: false, held: false, feedbackFirstReadAt: null });
    expect(table.body[2]).toEqual({ studentId: 'S-003', submissionId: null, version: null, submittedAt: null, source: null, late: false, held: false, feedbackFirstReadAt: null, status: 'not-submitted', enrolment: 'enrolled', score: null, maxScore: null, errors: 0, warnings: 0, infos: 0, codes: [], released: false, releasedScore: null, releasedVersion: null, changedSinceRelease: false, gradeSent: null });
    const csv = await api.app.inject({ method: 'GET', url: `${url()}/gradebook.csv`, headers: { authorization: `Bearer ${s.taAToken}` } });
    expect(csv.body.split('\r\n')[3]).toBe('S-003,,,not-submitted,0,0,0,,Acid catalysis (invented)');
  });

  it('a dry run lists what would be refused and stores nothing', async () => {
    const [good, bad] = submissionsFor(['S-005', 'S-006'], 11);
    (bad.runs[0].readings[1] as unknown[])[0] = 'soon';
    const res = await call(api.app, 'POST', `${url()}/submissions?dryRun=true`, s.taAToken, [good, bad], 200);
    expect(res.body).toEqual({ dryRun: true, valid: 1, rejected: [{ at: 'submission 2, line 1', studentId: 'S-006', path: 'runs[0].readings[1][0]', message: expect.any(String) }] });
    const table = await call(api.app, 'GET', `${url()}/results`, s.taAToken, undefined, 200);
    expect(table.body.find((r: { studentId: string }) => r.studentId === 'S-005').status).toBe('not-submitted');
  });

  it('a dry run reads the CSV layout too', async () => {
    const readings = ['student_id,run,catalyst,catalyst_unit,time_unit,t,x,infinity', ...[0, 1, 2, 3, 4, 5].map((t) => `S-999,A,0.1,M,min,${t},${(10 + 12 * Math.exp(-0.05 * t)).toFixed(3)},10.000`)].join('\n');
    const boundary = 'dry-run-boundary';
    const res = await api.app.inject({
      method: 'POST',
      url: `${url()}/submissions?dryRun=true`,
      headers: { authorization: `Bearer ${s.taAToken}`, 'content-type': `multipart/form-data; boundary=${boundary}` },
      payload: `--${boundary}\r\nContent-Disposition: form-data; name="readings"; filename="readings.csv"\r\nContent-Type: text/csv\r\n\r\n${readings}\r\n--${boundary}--\r\n`,
    });
    expect(res.statusCode, res.body).toBe(200);
    expect(res.json()).toEqual({ dryRun: true, valid: 0, rejected: [{ at: 'submission 1, readings line 2', studentId: 'S-999', path: 'studentId', message: "not on this section's roster" }] });
  });

  it('a resubmission is a new version; the old one stays readable', async () => {
    const [again] = submissionsFor(['S-001'], 7);
    const res = await call(api.app, 'POST', `${url()}/submissions`, s.taAToken, [again], 201);
    expect(res.body.stored[0]).toMatchObject({ studentId: 'S-001', version: 2 });
    const history = await call(api.app, 'GET', `/v1/sections/${s.sectionA.id}/students/S-001/history`, s.taAToken, undefined, 200);
    expect(history.body.map((h: { version: number }) => h.version)).toEqual([1, 2]);
    const first = await call(api.app, 'GET', `/v1/submissions/${history.body[0].submissionId}`, s.taAToken, undefined, 200);
    expect(first.body).toMatchObject({ version: 1, studentId: 'S-001' });
    expect(first.body.result.score).toBe(22);
  });

  it('an Idempotency-Key returns the first response instead of storing a second version', async () => {
    const [sub] = submissionsFor(['S-004'], 3);
    const send = () => api.app.inject({ method: 'POST', url: `${url()}/submissions`, headers: { authorization: `Bearer ${s.taAToken}`, 'idempotency-key': 'batch-0001' }, payload: [sub] });
    const first = await send();
    const second = await send();
    expect(first.statusCode).toBe(201);
    expect(second.statusCode).toBe(201);
    expect(second.json()).toEqual(first.json());
    expect(second.headers['idempotent-replayed']).toBe('true');
    const history = await call(api.app, 'GET', `/v1/sections/${s.sectionA.id}/students/S-004/history`, s.taAToken, undefined, 200);
    expect(history.body).toHaveLength(1);
    const changed = await api.app.inject({ method: 'POST', url: `${url()}/submissions`, headers: { authorization: `Bearer ${s.taAToken}`, 'idempotency-key': 'batch-0001' }, payload: [sub, sub] });
    expect(changed.statusCode).toBe(422);
  });

  it('an override is kept with who, when, before and after, and survives a regrade under new settings', async () => {
    const [slipped] = submissionsFor(['S-005'], 4);
    slipped.runs[1].reported!.k!.value = -Number(slipped.runs[1].reported!.k!.value);
    const stored = await call(api.app, 'POST', `${url()}/submissions`, s.taAToken, [slipped], 201);
    const id = stored.body.stored[0].submissionId;
    const view = await call(api.app, 'GET', `/v1/submissions/${id}`, s.taAToken, undefined, 200);
    const finding = view.body.result.findings.find((f: { code: string }) => f.code === 'sign-flipped');
    expect(finding).toMatchObject({ id: 'sign-flipped@runs[1].reported.k', pointsLost: 2 });
    const before = view.body.result.score;

    const overridden = await call(api.app, 'POST', `/v1/submissions/${id}/overrides`, s.taAToken, { findingId: finding.id, pointsLost: 1, reason: 'sign slip only in the summary table' }, 201);
    expect(overridden.body.result.score).toBe(before + 1);
    expect(overridden.body.overrides).toEqual([
      expect.objectContaining({ findingId: finding.id, pointsBefore: 2, pointsAfter: 1, by: 'ta-a', reason: 'sign slip only in the summary table' }),
    ]);

    await call(api.app, 'PATCH', `/v1/assignments/${s.assignment.id}/settings`, s.instructorToken, { settings: { rubric: { k: 3 } } }, 200);
    const regraded = await regradeAndWait(api.app, s.instructorToken, s.assignment.id, { sectionId: s.sectionA.id });
    expect(regraded.location).toBe(`/v1/assignments/${s.assignment.id}/regrades/${regraded.started.regradeId}`);
    expect(regraded.progress).toMatchObject({ status: 'finished', sectionId: s.sectionA.id });
    expect(regraded.progress.done).toBe(regraded.progress.total);
    expect(regraded.progress.total).toBeGreaterThanOrEqual(1);
    const after = await call(api.app, 'GET', `/v1/submissions/${id}`, s.taAToken, undefined, 200);
    expect(after.body.result.settingsVersion).toBe(2);
    const again = after.body.result.findings.find((f: { id: string }) => f.id === finding.id);
    expect(again).toMatchObject({ pointsLost: 1, override: { originalPointsLost: 3, reason: 'sign slip only in the summary table', by: 'ta-a' } });
    // The student's sheet shows the changed points, never who changed them; the reason stays in the
    // audit trail until a TA ticks "show the reason to the student".
    const sheetText = async () => folded(await pdfText((await api.app.inject({ method: 'GET', url: `/v1/submissions/${id}/feedback.pdf`, headers: { authorization: `Bearer ${s.taAToken}` } })).rawPayload));
    const kept = await sheetText();
    expect(kept).toContain('Reviewed by a teaching assistant: the points were changed from 3 points lost.');
    expect(kept).not.toContain('sign slip only in the summary table');
    expect(kept).not.toContain('ta-a');
    const shown = await call(api.app, 'POST', `/v1/submissions/${id}/overrides`, s.taAToken, { findingId: finding.id, pointsLost: 1, reason: 'sign slip only in the summary table', showReason: true }, 201);
    expect(shown.body.overrides.map((o: { reasonShown: boolean }) => o.reasonShown)).toEqual([false, true]);
    expect(await sheetText()).toContain('Reviewed by a teaching assistant: the points were changed from 3 points lost. Reason: sign slip only in the summary table');
  });

  it("a signal reaches the student's sheet only when a TA puts it there, and leaves it when taken off; every choice is kept", async () => {
    const [spread] = submissionsFor(['S-004'], 6);
    spread.runs[0].temperatureC = 25;
    spread.runs[1].temperatureC = 27.5;
    const stored = await call(api.app, 'POST', `${url()}/submissions`, s.taAToken, [spread], 201);
    const id = stored.body.stored[0].submissionId;
    const sheetText = async () =>
      folded(await pdfText((await api.app.inject({ method: 'GET', url: `/v1/submissions/${id}/feedback.pdf`, headers: { authorization: `Bearer ${s.taAToken}` } })).rawPayload));
    const view = await call(api.app, 'GET', `/v1/submissions/${id}`, s.taAToken, undefined, 200);
    expect(view.body.result.signals).toEqual([expect.objectContaining({ code: 'temperature-spread', path: 'runs' })]);
    expect(view.body.result.signals[0].onSheet).toBeUndefined();
    expect(view.body.signalChoices).toEqual([]);
    expect(await sheetText()).not.toContain('Notes on the measurement');

    const shown = await call(api.app, 'POST', `/v1/submissions/${id}/signals`, s.taAToken, { code: 'temperature-spread', path: 'runs', onSheet: true }, 201);
    expect(shown.body.result.signals[0].onSheet).toBe(true);
    const text = await sheetText();
    expect(text).toContain('Notes on the measurement');
    expect(text).toContain('The runs were recorded at temperatures 2.5 degC apart');
    expect(text).not.toContain('ta-a');

    const hidden = await call(api.app, 'POST', `/v1/submissions/${id}/signals`, s.taAToken, { code: 'temperature-spread', path: 'runs', onSheet: false }, 201);
    expect(hidden.body.result.signals[0].onSheet).toBeUndefined();
    expect(hidden.body.signalChoices).toEqual([
      expect.objectContaining({ code: 'temperature-spread', path: 'runs', onSheet: true, by: 'ta-a' }),
      expect.objectContaining({ code: 'temperature-spread', path: 'runs', onSheet: false, by: 'ta-a' }),
    ]);
    expect(await sheetText()).not.toContain('Notes on the measurement');

    const missing = await call(api.app, 'POST', `/v1/submissions/${id}/signals`, s.taAToken, { code: 'end-value', path: 'runs[0].infinity', onSheet: true }, 400);
    expect(missing.body.error.details).toEqual([{ path: 'body.path', message: 'the latest result raises no signal end-value at runs[0].infinity' }]);
    const badCode = await call(api.app, 'POST', `/v1/submissions/${id}/signals`, s.taAToken, { code: 'misconduct', path: 'runs', onSheet: true }, 400);
    expect(badCode.body.error.details[0].path).toBe('body.code');
    expect((await call(api.app, 'GET', `/v1/submissions/${id}`, s.taAToken, undefined, 200)).body.signalChoices).toHaveLength(2);
  });

  it('results are released only by a TA action; a sheet before release says it is a draft', async () => {
    const table0 = await call(api.app, 'GET', `${url()}/results`, s.taAToken, undefined, 200);
    const draft = await api.app.inject({ method: 'GET', url: `/v1/submissions/${table0.body[0].submissionId}/feedback.pdf`, headers: { authorization: `Bearer ${s.taAToken}` } });
    expect(folded(await pdfText(draft.rawPayload))).toContain(DRAFT_NOTE);
    // One student first: only their latest result is released.
    const one = await call(api.app, 'POST', `/v1/submissions/${table0.body[0].submissionId}/release`, s.taAToken, undefined, 200);
    expect(one.body.released).toBe(1);
    const afterOne = await call(api.app, 'GET', `${url()}/results`, s.taAToken, undefined, 200);
    expect(afterOne.body.filter((r: { released: boolean }) => r.released).map((r: { studentId: string }) => r.studentId)).toEqual([table0.body[0].studentId]);
    const released = await call(api.app, 'POST', `${url()}/release`, s.taAToken, undefined, 200);
    expect(released.body.released).toBeGreaterThan(0);
    const table = await call(api.app, 'GET', `${url()}/results`, s.taAToken, undefined, 200);
    expect(table.body.every((r: { released: boolean; submissionId: number | null }) => r.released === (r.submissionId !== null))).toBe(true);
    const after = await api.app.inject({ method: 'GET', url: `/v1/submissions/${table0.body[0].submissionId}/feedback.pdf`, headers: { authorization: `Bearer ${s.taAToken}` } });
    expect(folded(await pdfText(after.rawPayload))).not.toContain('Draft for the teaching assistant');
  });

  it('accepts the CSV layout as a multipart upload; a repeat with the same Idempotency-Key is recognised by its content', async () => {
    const readings = ['student_id,run,catalyst,catalyst_unit,time_unit,t,x,infinity', ...[0, 1, 2, 3, 4, 5].map((t) => `S-006,A,0.1,M,min,${t},${(10 + 12 * Math.exp(-0.05 * t)).toFixed(3)},10.000`)].join('\n');
    const reported = 'student_id,run,quantity,value,uncertainty,unit\nS-006,A,k,0.0500,0.0001,min^-1\n';
    // Two uploads of the same files, as two tools would send them: different part boundaries.
    const upload = (boundary: string) => {
      const part = (name: string, text: string) => `--${boundary}\r\nContent-Disposition: form-data; name="${name}"; filename="${name}.csv"\r\nContent-Type: text/csv\r\n\r\n${text}\r\n`;
      return api.app.inject({
        method: 'POST',
        url: `${url()}/submissions`,
        headers: { authorization: `Bearer ${s.taAToken}`, 'content-type': `multipart/form-data; boundary=${boundary}`, 'idempotency-key': 'csv-upload-1' },
        payload: `${part('readings', readings)}${part('reported', reported)}--${boundary}--\r\n`,
      });
    };
    const res = await upload('rateproof-test-boundary');
    expect(res.statusCode, res.body).toBe(201);
    expect(res.json().stored[0]).toMatchObject({ studentId: 'S-006', version: 1, status: 'checked' });
    const again = await upload('another-boundary-0123');
    expect([again.statusCode, again.headers['idempotent-replayed']]).toEqual([201, 'true']);
    expect(again.json()).toEqual(res.json());
  });

  it('serves feedback sheets, the section ZIP, the summary and the gradebook', async () => {
    const table = await call(api.app, 'GET', `${url()}/results`, s.taAToken, undefined, 200);
    const pdf = await api.app.inject({ method: 'GET', url: `/v1/submissions/${table.body[0].submissionId}/feedback.pdf`, headers: { authorization: `Bearer ${s.taAToken}` } });
    expect([pdf.statusCode, pdf.headers['content-type'], pdf.rawPayload.subarray(0, 5).toString()]).toEqual([200, 'application/pdf', '%PDF-']);
    const zip = await api.app.inject({ method: 'GET', url: `${url()}/feedback.zip`, headers: { authorization: `Bearer ${s.taAToken}` } });
    expect(zip.statusCode).toBe(200);
    // Each entry named as the sheet downloads alone: the fixture's course, section and assignment, the id and version (hand-written).
    const checked = table.body.filter((r: { status: string }) => r.status === 'checked');
    expect(await zipEntryNames(zip.rawPayload)).toEqual(checked.map((r: { studentId: string; version: number }) => `Physical_chemistry_lab_invented-A-Acid_catalysis_invented-${r.studentId}-v${r.version}-feedback.pdf`));
    const summary = await api.app.inject({ method: 'GET', url: `${url()}/summary.pdf`, headers: { authorization: `Bearer ${s.taAToken}` } });
    expect(summary.rawPayload.subarray(0, 5).toString()).toBe('%PDF-');
    const csv = await api.app.inject({ method: 'GET', url: `${url()}/gradebook.csv?bom=true`, headers: { authorization: `Bearer ${s.taAToken}` } });
    expect(csv.body.startsWith('\uFEFFstudent_id,score,max_score')).toBe(true);
    // Each download is named for its course, section and assignment (names from the fixture, made safe by hand).
    const place = 'Physical_chemistry_lab_invented-A-Acid_catalysis_invented';
    expect([pdf, zip, summary, csv].map((r) => r.headers['content-disposition'])).toEqual([
      `attachment; filename="${place}-${table.body[0].studentId}-v${table.body[0].version}-feedback.pdf"`,
      `attachment; filename="${place}-feedback.zip"`,
      `attachment; filename="${place}-summary.pdf"`,
      `attachment; filename="${place}-gradebook.csv"`,
    ]);
    expect(csv.body.split('\r\n').filter((l) => l !== '')).toHaveLength(table.body.length + 1);
  });

  it('a student withdrawn or removed stays in the history; the section shows who withdrew and leaves out who was removed', async () => {
    const section = `/v1/sections/${s.sectionB.id}`;
    const bUrl = `${section}/assignments/${s.assignment.id}`;
    await call(api.app, 'POST', `${bUrl}/submissions`, s.taBToken, submissionsFor(['S-103'], 21), 201);
    const withdrawn = await call(api.app, 'PUT', `${section}/roster/S-101`, s.instructorToken, { status: 'withdrawn' }, 200);
    expect(withdrawn.body).toMatchObject({ studentId: 'S-101', status: 'withdrawn' });
    expect(withdrawn.body.history.map((e: { status: string; by: string }) => [e.status, e.by])).toEqual([['enrolled', 'instructor-1'], ['withdrawn', 'instructor-1']]);
    await call(api.app, 'PUT', `${section}/roster/S-103`, s.instructorToken, { status: 'removed' }, 200);
    const table = await call(api.app, 'GET', `${bUrl}/results`, s.taBToken, undefined, 200);
    expect(table.body.map((r: { studentId: string; status: string; enrolment: string }) => [r.studentId, r.status, r.enrolment])).toEqual([
      ['S-101', 'withdrawn', 'withdrawn'],
      ['S-102', 'not-submitted', 'enrolled'],
    ]);
    const csv = await api.app.inject({ method: 'GET', url: `${bUrl}/gradebook.csv`, headers: { authorization: `Bearer ${s.taBToken}` } });
    expect(csv.body.split('\r\n').slice(1, 3)).toEqual(['S-101,,,withdrawn,0,0,0,,Acid catalysis (invented)', 'S-102,,,not-submitted,0,0,0,,Acid catalysis (invented)']);
    const refused = await call(api.app, 'POST', `${bUrl}/submissions`, s.taBToken, submissionsFor(['S-101', 'S-103'], 22), 422);
    expect(refused.body.error.details.map((d: { message: string }) => d.message)).toEqual(['withdrawn from this section; enrol them again to accept work', "not on this section's roster"]);
    // The removed student's work is still in their history; enrolling again brings them back.
    const history = await call(api.app, 'GET', `${section}/students/S-103/history`, s.taBToken, undefined, 200);
    expect(history.body).toHaveLength(1);
    await call(api.app, 'POST', `${section}/roster`, s.instructorToken, { students: [{ studentId: 'S-103' }] }, 200);
    const roster = await call(api.app, 'GET', `${section}/roster`, s.taBToken, undefined, 200);
    expect(roster.body.find((r: { studentId: string }) => r.studentId === 'S-103').history.map((e: { status: string }) => e.status)).toEqual(['enrolled', 'removed', 'enrolled']);
    expect((await call(api.app, 'PUT', `${section}/roster/S-999`, s.instructorToken, { status: 'withdrawn' })).status).toBe(404);
    expect((await call(api.app, 'PUT', `${section}/roster/S-102`, s.taBToken, { status: 'withdrawn' })).status).toBe(403);
  });

  it('lists submissions whose readings look alike, for the TA to review', async () => {
    const before = await call(api.app, 'GET', `${url()}/signals`, s.taAToken, undefined, 200);
    expect(before.body).toMatchObject({ pairs: [], groups: [] });
    // S-006's runs came from a formula (the CSV upload above): they scatter no more than rounding does.
    expect(before.body.smooth.map((r: { studentId: string; label: string }) => [r.studentId, r.label])).toEqual([['S-006', 'A']]);
    // S-005 hands in S-001's latest readings shifted by a constant.
    const history = await call(api.app, 'GET', `/v1/sections/${s.sectionA.id}/students/S-001/history`, s.taAToken, undefined, 200);
    const latest = await call(api.app, 'GET', `/v1/submissions/${history.body[history.body.length - 1].submissionId}`, s.taAToken, undefined, 200);
    const copy = structuredClone(latest.body.payload);
    copy.studentId = 'S-005';
    for (const run of copy.runs) run.readings = run.readings.map(([t, x]: [number, number]) => [t, Number((x + 0.75).toFixed(3))]);
    await call(api.app, 'POST', `${url()}/submissions`, s.taAToken, [copy], 201);
    const after = await call(api.app, 'GET', `${url()}/signals`, s.taAToken, undefined, 200);
    expect(after.body.pairs).toHaveLength(1);
    expect(after.body.pairs[0].students).toEqual(['S-001', 'S-005']);
    // Every one of the 4 runs was shifted by the same 0.75 deg (hand-made above).
    expect(after.body.pairs[0].runs.map((r: { relation: string }) => r.relation)).toEqual(['offset', 'offset', 'offset', 'offset']);
  });

  it("lists the course's staff with their sections and live tokens, for the instructor", async () => {
    const staff = await call(api.app, 'GET', `/v1/courses/${s.course.id}/staff`, s.instructorToken, undefined, 200);
    expect(staff.body.slice(0, 3).map((m: { handle: string; role: string; sectionIds: number[]; liveTokens: number }) => [m.handle, m.role, m.sectionIds, m.liveTokens])).toEqual([
      ['instructor-1', 'instructor', [], 1],
      ['ta-a', 'ta', [s.sectionA.id], 1],
      ['ta-b', 'ta', [s.sectionB.id], 1],
    ]);
  });

  it('a revoked token answers 401 from then on', async () => {
    const staff = (await call(api.app, 'POST', `/v1/courses/${s.course.id}/staff`, s.instructorToken, { handle: 'ta-leaving', role: 'ta', sectionIds: [s.sectionA.id] }, 201)).body;
    const token = (await call(api.app, 'POST', `/v1/staff/${staff.id}/tokens`, s.instructorToken, undefined, 201)).body.token;
    await call(api.app, 'GET', `/v1/sections/${s.sectionA.id}/roster`, token, undefined, 200);
    const revoked = await call(api.app, 'POST', `/v1/staff/${staff.id}/tokens/revoke`, s.instructorToken, undefined, 200);
    expect(revoked.body.revoked).toBe(1);
    expect((await call(api.app, 'GET', `/v1/sections/${s.sectionA.id}/roster`, token)).status).toBe(401);
  });

  it('serves its OpenAPI document and a browsable docs page', async () => {
    const res = await api.app.inject({ method: 'GET', url: '/openapi.json' });
    expect(res.statusCode).toBe(200);
    const docs = await api.app.inject({ method: 'GET', url: '/docs/' });
    expect([docs.statusCode, docs.headers['content-type']]).toEqual([200, expect.stringContaining('text/html')]);
    expect(Object.keys(res.json().paths)).toContain('/v1/sections/{sectionId}/assignments/{assignmentId}/submissions');
  });
});
