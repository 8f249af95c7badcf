import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { cardCounts } from '../../reports/feedback/finding-groups.ts';
import { sectionStandings } from '../../server/grading/report-inputs.ts';
import { call, openApi, regradeAndWait, seedCourse, submissionsFor, type Api, type Seed } from '../support/api-fixture.ts';

/**
 * The results page takes most rows from the summaries kept when results are stored. Its rows must be
 * what working every row out from the findings gives, on a section with findings that cost points,
 * an override, a release, a regrade, a new version after the release, a withdrawn student, a student
 * with nothing submitted and results stored before summaries were kept. Two references, neither the
 * code under test: the same page with every kept summary removed (each row then worked out from the
 * findings), and the computation the page used before, kept here (the standings the gradebook reads,
 * counted with the sheet's card counts).
 */
describe('results page from kept summaries', () => {
  let api: Api;
  let s: Seed;
  let url: string;
  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
    url = `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}`;
  }, 60_000);
  afterAll(async () => api?.close());

  const page = async () => (await call(api.app, 'GET', `${url}/results`, s.taAToken, undefined, 200)).body as Array<Record<string, unknown>>;

  /** The page as the route built it before summaries were kept: every row worked out from the findings. */
  async function before() {
    const rows = await sectionStandings(api.database.store.db, s.sectionA.id, s.assignment.id);
    const none = { submissionId: null, version: null, submittedAt: null, source: null, late: false, held: false, feedbackFirstReadAt: null, score: null, maxScore: null, errors: 0, warnings: 0, infos: 0, codes: [], released: false, releasedScore: null, releasedVersion: null, changedSinceRelease: false, gradeSent: null };
    return rows.map((row) => {
      if (!row.submission) return { ...none, studentId: row.studentId, status: row.enrolment === 'withdrawn' ? 'withdrawn' : 'not-submitted', enrolment: row.enrolment };
      const { submission, result, released } = row;
      const counts = cardCounts(result.findings);
      return {
        studentId: submission.studentId,
        submissionId: submission.submissionId,
        version: submission.version,
        submittedAt: submission.submittedAt.toISOString(),
        source: submission.source,
        late: submission.late,
        held: submission.held,
        feedbackFirstReadAt: row.feedbackFirstReadAt?.toISOString() ?? null,
        status: submission.enrolment === 'withdrawn' ? 'withdrawn' : result.status,
        enrolment: submission.enrolment,
        score: result.score,
        maxScore: result.maxScore,
        errors: counts.costPoints,
        warnings: counts.warnings,
        infos: counts.notes,
        codes: [...new Set(result.findings.map((f) => f.code))],
        released: released !== undefined,
        releasedScore: released?.score ?? null,
        releasedVersion: row.releasedVersion ?? null,
        changedSinceRelease: row.changedSinceRelease,
        // No learning platform in this course: no grade is sent.
        gradeSent: null,
      };
    });
  }

  async function expectSameAsWorkedOut() {
    const kept = await page();
    expect(kept).toEqual(await before());
    // Byte for byte the same with every summary removed (results stored before summaries were kept).
    const db = api.database.store.db;
    const saved = (await sql<{ id: number; page_summary: unknown }>`select id, page_summary from results where page_summary is not null`.execute(db)).rows;
    await sql`update results set page_summary = null`.execute(db);
    const workedOut = await page();
    for (const r of saved) await sql`update results set page_summary = ${JSON.stringify(r.page_summary)}::jsonb where id = ${r.id}`.execute(db);
    expect(JSON.stringify(kept)).toBe(JSON.stringify(workedOut));
    return kept;
  }

  it('matches the rows worked out from the findings at every step', async () => {
    // Slips that cost points (hand-made: a sign flipped, a time unit off by 60), and clean work.
    const work = submissionsFor(['S-001', 'S-002', 'S-003', 'S-004', 'S-005'], 4);
    work[1].runs[1].reported!.k!.value = -Number(work[1].runs[1].reported!.k!.value);
    for (const run of work[2].runs) run.reported!.k!.value = Number(run.reported!.k!.value) / 60;
    const stored = (await call(api.app, 'POST', `${url}/submissions`, s.taAToken, work, 201)).body.stored as Array<{ studentId: string; submissionId: number }>;
    const first = await expectSameAsWorkedOut();
    // The kept summaries are read: the stored ones cover every row submitted (S-006 submitted nothing).
    const summarised = await sql<{ n: number }>`select count(*)::int as n from results where page_summary is not null`.execute(api.database.store.db);
    expect(summarised.rows[0].n).toBe(5);
    expect(first.map((r) => r.studentId)).toEqual(['S-001', 'S-002', 'S-003', 'S-004', 'S-005', 'S-006']);
    // By hand: S-002 lost points for the one flipped sign; S-003 for the one time-unit slip.
    expect(first.find((r) => r.studentId === 'S-003')).toMatchObject({ errors: 1 });

    await call(api.app, 'POST', `${url}/release`, s.taAToken, undefined, 200);
    await expectSameAsWorkedOut();

    // An override after the release: changed since release for S-002 only.
    const view = await call(api.app, 'GET', `/v1/submissions/${stored[1].submissionId}`, s.taAToken, undefined, 200);
    const finding = view.body.result.findings.find((f: { code: string }) => f.code === 'sign-flipped');
    await call(api.app, 'POST', `/v1/submissions/${stored[1].submissionId}/overrides`, s.taAToken, { findingId: finding.id, pointsLost: 0, reason: 'a slip in the table only' }, 201);
    // A new version for S-004 after the release, and S-005 withdrawn.
    await call(api.app, 'POST', `${url}/submissions`, s.taAToken, submissionsFor(['S-004'], 9), 201);
    await call(api.app, 'PUT', `/v1/sections/${s.sectionA.id}/roster/S-005`, s.instructorToken, { status: 'withdrawn' }, 200);
    const changed = await expectSameAsWorkedOut();
    expect(changed.filter((r) => r.changedSinceRelease).map((r) => r.studentId)).toEqual(['S-002', 'S-004']);

    // A regrade under a heavier rubric: every latest result anew, the release still the earlier one.
    await call(api.app, 'PATCH', `/v1/assignments/${s.assignment.id}/settings`, s.instructorToken, { settings: { rubric: { k: 3 } } }, 200);
    await regradeAndWait(api.app, s.instructorToken, s.assignment.id);
    await expectSameAsWorkedOut();
    await call(api.app, 'POST', `${url}/release`, s.taAToken, undefined, 200);
    await expectSameAsWorkedOut();
  }, 120_000);
});
