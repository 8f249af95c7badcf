import { readFile } from 'node:fs/promises';
import type { FastifyInstance } from 'fastify';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../server/app.ts';
import { call, seedCourse, submissionsFor, testConfig, type Seed } from '../support/api-fixture.ts';
import { CHROMIUM_ABSENT, chromiumPresent, launchChromium } from '../support/chromium.ts';
import { openTestDatabase, type TestDatabase } from '../support/test-database.ts';
import { signIn, watchProblems } from '../support/workspace-page.ts';
import { zipEntryNames } from '../support/zip-entries.ts';

if (!chromiumPresent) console.warn(CHROMIUM_ABSENT);

/**
 * The section page's download links in a browser, on a service whose limit makes section A (6
 * submissions) large and section B (3) small: A's ZIP and summary come through a job (202, progress,
 * then the stored file), B's straight from the request; both saved under the server's file name.
 */
describe.skipIf(!chromiumPresent)('section downloads drawn by a job, in the browser', () => {
  let database: TestDatabase;
  let app: FastifyInstance;
  let s: Seed;
  let browser: Browser;
  let origin: string;

  beforeAll(async () => {
    database = await openTestDatabase('postgres');
    app = await buildApp({ config: { ...testConfig, bigSection: 4 }, store: database.store });
    s = await seedCourse(app);
    await call(app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, s.taAToken, submissionsFor(['S-001', 'S-002', 'S-003', 'S-004', 'S-005', 'S-006'], 6), 201);
    await call(app, 'POST', `/v1/sections/${s.sectionB.id}/assignments/${s.assignment.id}/submissions`, s.taBToken, submissionsFor(['S-101', 'S-102', 'S-103'], 7), 201);
    origin = await app.listen({ port: 0, host: '127.0.0.1' });
    browser = await launchChromium();
  }, 120_000);
  afterAll(async () => {
    await browser?.close();
    await app?.close();
    await database?.close();
  });

  async function download(page: Page, link: string) {
    const [file] = await Promise.all([page.waitForEvent('download', { timeout: 90_000 }), page.getByRole('link', { name: link }).click()]);
    return { name: file.suggestedFilename(), bytes: await readFile((await file.path())!) };
  }

  it('follows a 202 for a large section: progress shown, then the stored ZIP and summary saved under their names', async () => {
    const context = await browser.newContext({ acceptDownloads: true });
    const page = await context.newPage();
    const problems = watchProblems(page);
    const answers: number[] = [];
    page.on('response', (r) => r.url().endsWith('/feedback.zip') && answers.push(r.status()));
    await signIn(page, origin, s.taAToken);
    await page.goto(`${origin}/#/section/${s.sectionA.id}/assignment/${s.assignment.id}`);
    const zipPromise = download(page, 'Every feedback sheet (ZIP)');
    await page.getByRole('progressbar', { name: 'Drawing progress' }).waitFor();
    const zip = await zipPromise;
    expect(answers).toEqual([202]);
    expect(zip.name).toBe('Physical_chemistry_lab_invented-A-Acid_catalysis_invented-feedback.zip');
    expect(await zipEntryNames(zip.bytes)).toHaveLength(6);
    const summary = await download(page, 'Section summary (PDF)');
    expect(summary.name).toBe('Physical_chemistry_lab_invented-A-Acid_catalysis_invented-summary.pdf');
    expect(summary.bytes.subarray(0, 5).toString()).toBe('%PDF-');
    // The progress goes once the file is saved.
    await expect.poll(() => page.getByRole('progressbar', { name: 'Drawing progress' }).count()).toBe(0);
    expect(problems).toEqual([]);
    await context.close();
  }, 180_000);

  it('saves a small section’s ZIP straight from the request', async () => {
    const context = await browser.newContext({ acceptDownloads: true });
    const page = await context.newPage();
    const problems = watchProblems(page);
    const answers: number[] = [];
    page.on('response', (r) => r.url().endsWith('/feedback.zip') && answers.push(r.status()));
    await signIn(page, origin, s.taBToken);
    await page.goto(`${origin}/#/section/${s.sectionB.id}/assignment/${s.assignment.id}`);
    const zip = await download(page, 'Every feedback sheet (ZIP)');
    expect(answers).toEqual([200]);
    expect(zip.name).toBe('Physical_chemistry_lab_invented-B-Acid_catalysis_invented-feedback.zip');
    expect(await zipEntryNames(zip.bytes)).toHaveLength(3);
    expect(problems).toEqual([]);
    await context.close();
  }, 120_000);
});
