import { randomUUID } from 'node:crypto';
import type { FastifyInstance } from 'fastify';
import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../server/app.ts';
import { readConfig } from '../../server/config.ts';
import { createSectionFile, deleteExpiredSectionFiles } from '../../server/store/section-files.ts';
import { call, seedCourse, submissionsFor, testConfig, type Seed } from '../support/api-fixture.ts';
import { pdfText } from '../support/pdf-reading.ts';
import { openTestDatabase, type TestDatabase } from '../support/test-database.ts';
import { unzip } from '../support/zip-entries.ts';

/**
 * A large section's ZIP and summary drawn by a job: the download answers 202 with a poll address,
 * the poll answers progress, the finished file is the one the direct download gives. A second service
 * on the same database, whose limit is higher and which works no jobs, gives the direct download of
 * the same section to compare with (what the job stores must equal it, entry by entry).
 */
describe.each(['pglite', 'postgres'] as const)('section files drawn by a job on %s', (engine) => {
  let database: TestDatabase;
  let app: FastifyInstance;
  let direct: FastifyInstance;
  let s: Seed;
  const studentsA = ['S-001', 'S-002', 'S-003', 'S-004', 'S-005', 'S-006'];
  // A limit of 4 submissions: section A (6) is large, section B (3) small.
  const limit = 4;

  beforeAll(async () => {
    database = await openTestDatabase(engine);
    app = await buildApp({ config: { ...testConfig, bigSection: limit }, store: database.store });
    direct = await buildApp({ config: { ...testConfig, role: 'requests' }, store: database.store });
    s = await seedCourse(app);
    await call(app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, s.taAToken, submissionsFor(studentsA, 4), 201);
    await call(app, 'POST', `/v1/sections/${s.sectionB.id}/assignments/${s.assignment.id}/submissions`, s.taBToken, submissionsFor(['S-101', 'S-102', 'S-103'], 5), 201);
  }, 120_000);
  afterAll(async () => {
    await direct?.close();
    await app?.close();
    await database?.close();
  });

  const base = (sectionId: number) => `/v1/sections/${sectionId}/assignments/${s.assignment.id}`;
  const raw = (server: FastifyInstance, url: string, token: string) => server.inject({ method: 'GET', url, headers: { authorization: `Bearer ${token}` } });

  /** Asks for the download, follows the job's progress to its end; returns what each poll said and the file. */
  async function drawnByJob(document: 'feedback.zip' | 'summary.pdf') {
    const asked = await raw(app, `${base(s.sectionA.id)}/${document}`, s.taAToken);
    expect(asked.statusCode).toBe(202);
    const started = asked.json();
    expect(asked.headers.location).toBe(started.poll);
    expect(started).toMatchObject({ document, status: 'running', done: 0, total: document === 'feedback.zip' ? studentsA.length : 1, download: null });
    const polls = [started];
    while (polls.at(-1).status === 'running') {
      await new Promise((r) => setTimeout(r, 50));
      polls.push((await call(app, 'GET', started.poll, s.taAToken, undefined, 200)).body);
    }
    const end = polls.at(-1);
    expect(end).toMatchObject({ status: 'finished', done: end.total, download: `${started.poll}/content` });
    // Done only grows.
    expect(polls.map((p) => p.done)).toEqual([...polls.map((p) => p.done)].sort((a, b) => a - b));
    const file = await raw(app, end.download, s.taAToken);
    expect(file.statusCode).toBe(200);
    return { started, end, file };
  }

  it('reads the limit from RATEPROOF_BIG_SECTION (a whole number), 200 when unset', () => {
    expect(readConfig({ RATEPROOF_BIG_SECTION: '12' }).bigSection).toBe(12);
    expect(readConfig({}).bigSection).toBeUndefined();
    expect(() => readConfig({ RATEPROOF_BIG_SECTION: 'many' })).toThrow(/RATEPROOF_BIG_SECTION: a whole number of students/);
  });

  it('draws a large section’s ZIP in a job: the stored file has the entries and sheets of the direct download', async () => {
    const { file } = await drawnByJob('feedback.zip');
    const directZip = await raw(direct, `${base(s.sectionA.id)}/feedback.zip`, s.taAToken);
    expect(directZip.statusCode).toBe(200);
    expect([file.headers['content-type'], file.headers['content-disposition']]).toEqual([directZip.headers['content-type'], directZip.headers['content-disposition']]);
    const [fromJob, fromRequest] = [await unzip(file.rawPayload), await unzip(directZip.rawPayload)];
    expect(fromJob.map((e) => e.name)).toEqual(fromRequest.map((e) => e.name));
    expect(fromJob).toHaveLength(studentsA.length);
    for (let i = 0; i < fromJob.length; i++) expect(await pdfText(fromJob[i].data)).toBe(await pdfText(fromRequest[i].data));
  }, 120_000);

  it('draws a large section’s summary in a job, with the text of the direct one', async () => {
    const { file } = await drawnByJob('summary.pdf');
    const directPdf = await raw(direct, `${base(s.sectionA.id)}/summary.pdf`, s.taAToken);
    expect(directPdf.statusCode).toBe(200);
    expect(file.headers['content-disposition']).toBe(directPdf.headers['content-disposition']);
    // The summary is dated when drawn: the date line is left out of the comparison.
    const undated = async (pdf: Buffer) => (await pdfText(pdf)).replace(/\d{4}-\d{2}-\d{2}[ T]\d{2}:\d{2}(:\d{2})?( UTC)?/g, '<date>');
    expect(await undated(file.rawPayload)).toBe(await undated(directPdf.rawPayload));
  }, 120_000);

  it('answers a small section directly, as before (200, the file)', async () => {
    const zip = await raw(app, `${base(s.sectionB.id)}/feedback.zip`, s.taBToken);
    expect([zip.statusCode, zip.headers['content-type']]).toEqual([200, 'application/zip']);
    expect(await unzip(zip.rawPayload)).toHaveLength(3);
    const pdf = await raw(app, `${base(s.sectionB.id)}/summary.pdf`, s.taBToken);
    expect([pdf.statusCode, pdf.headers['content-type']]).toEqual([200, 'application/pdf']);
  }, 60_000);

  it('lets only those who may download the section see the file: a TA of another section gets 404 as for the download', async () => {
    const { end } = await drawnByJob('summary.pdf');
    expect((await raw(app, `${base(s.sectionA.id)}/summary.pdf`, s.taBToken)).statusCode).toBe(404);
    expect((await raw(app, end.poll, s.taBToken)).statusCode).toBe(404);
    expect((await raw(app, end.download, s.taBToken)).statusCode).toBe(404);
    // Nor through a section of their own: the file belongs to section A.
    const elsewhere = `${base(s.sectionB.id)}/files/${end.fileId}`;
    expect((await raw(app, elsewhere, s.taBToken)).statusCode).toBe(404);
    expect((await raw(app, `${elsewhere}/content`, s.taBToken)).statusCode).toBe(404);
    expect((await raw(app, end.poll, s.instructorToken)).statusCode).toBe(200);
    expect((await raw(app, end.poll, 'rp_not-a-real-token')).statusCode).toBe(401);
  }, 60_000);

  it('names the field of a file id that is not one, and answers 404 for one never given out', async () => {
    const bad = await raw(app, `${base(s.sectionA.id)}/files/not-a-file`, s.taAToken);
    expect(bad.statusCode).toBe(400);
    expect(bad.json().error.details.map((d: { path: string }) => d.path)).toEqual(['params.fileId']);
    expect((await raw(app, `${base(s.sectionA.id)}/files/2b1c9a3e-0000-4000-8000-000000000000`, s.taAToken)).statusCode).toBe(404);
  });

  it('answers 409 for the content while the file is drawn, and the cleanup deletes expired files', async () => {
    // A file recorded with no job: it stays to draw.
    const waiting = await createSectionFile(database.store.db, { id: randomUUID(), sectionId: s.sectionA.id, assignmentId: s.assignment.id, document: 'summary.pdf', total: 1, keepHours: 1 });
    const early = await raw(app, `${base(s.sectionA.id)}/files/${waiting.fileId}/content`, s.taAToken);
    expect([early.statusCode, early.json().error.message]).toEqual([409, 'the file is still being drawn; poll its progress']);
    const stored = async () => (await sql<{ n: number }>`select count(*)::int as n from section_files`.execute(database.store.db)).rows[0].n;
    const before = await stored();
    expect(before).toBeGreaterThan(0);
    await sql`update section_files set expires_at = now() - interval '1 second'`.execute(database.store.db);
    expect(await deleteExpiredSectionFiles(database.store.db)).toBe(before);
    expect(await stored()).toBe(0);
    expect((await raw(app, `${base(s.sectionA.id)}/files/${waiting.fileId}`, s.taAToken)).statusCode).toBe(404);
  }, 60_000);
});
