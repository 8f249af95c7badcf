import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { feedbackSheetOrReason } from '../../kinds/documents.ts';
import { feedbackInput, section } from '../reports/fixtures.ts';
import { bearer, openApi, seedCourse, submissionsFor, type Api, type Seed } from '../support/api-fixture.ts';
import { folded, pdfText } from '../support/pdf-reading.ts';
import { unzip } from '../support/zip-entries.ts';

describe('stored results with absurd values still give a feedback sheet each, and a whole ZIP', () => {
  let api: Api;
  let s: Seed;
  let stored: Array<{ studentId: string; submissionId: number }>;

  beforeAll(async () => {
    api = await openApi('pglite');
    s = await seedCourse(api.app);
    // Invented submissions: k typed as 1e308 and as 2.8e19, and a catalyst of 1e308 M.
    const subs = submissionsFor(['S-001', 'S-002', 'S-003'], 3);
    subs[0].runs[0].reported!.k!.value = 1e308;
    subs[1].runs[1].reported!.k!.value = 2.8e19;
    subs[2].runs[2].catalyst.value = 1e308;
    const res = await api.app.inject({ method: 'POST', url: `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, headers: bearer(s.taAToken), payload: subs });
    expect(res.statusCode, res.body).toBe(201);
    stored = res.json().stored;
  }, 60_000);
  afterAll(async () => api?.close());

  it('each feedback PDF is a 200 that names the absurd value', async () => {
    expect(stored.map((x) => x.studentId)).toEqual(['S-001', 'S-002', 'S-003']);
    for (const { studentId, submissionId } of stored) {
      const res = await api.app.inject({ method: 'GET', url: `/v1/submissions/${submissionId}/feedback.pdf`, headers: bearer(s.taAToken) });
      expect(res.statusCode, res.body).toBe(200);
      const text = folded(await pdfText(res.rawPayload));
      expect(text).toContain(studentId);
      expect(text).toContain('implausible');
    }
  });

  it('the section ZIP holds every sheet, whole', async () => {
    const res = await api.app.inject({ method: 'GET', url: `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/feedback.zip`, headers: bearer(s.taAToken) });
    expect(res.statusCode).toBe(200);
    const entries = await unzip(res.rawPayload);
    // Named for what each is, from the fixture's course, section and assignment (hand-written).
    expect(entries.map((e) => e.name).sort()).toEqual([1, 2, 3].map((n) => `Physical_chemistry_lab_invented-A-Acid_catalysis_invented-S-00${n}-v1-feedback.pdf`));
    for (const e of entries) expect(e.data.subarray(0, 5).toString()).toBe('%PDF-');
  });
});

describe('feedbackSheetOrReason', () => {
  it('puts a page that says why in place of a sheet that cannot be drawn', async () => {
    const { settings, students } = section(5, [undefined]);
    const input = feedbackInput(settings, students[0]);
    const broken = { ...input, result: { ...input.result, findings: null as never } };
    const text = folded(await pdfText(await feedbackSheetOrReason(broken)));
    expect(text).toContain('This sheet could not be drawn');
    expect(text).toContain(students[0].submission.studentId);
  });
});
