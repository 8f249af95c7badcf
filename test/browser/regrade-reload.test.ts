import type { FastifyInstance } from 'fastify';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../server/app.ts';
import { call, seedCourse, submissionsFor, testConfig, type Seed } from '../support/api-fixture.ts';
import { CHROMIUM_ABSENT, chromiumPresent, launchChromium } from '../support/chromium.ts';
import { openTestDatabase, type TestDatabase } from '../support/test-database.ts';
import { signIn, watchProblems } from '../support/workspace-page.ts';

if (!chromiumPresent) console.warn(CHROMIUM_ABSENT);

/**
 * A regrade outlives the page that started it: after a reload the course page finds the assignment's
 * latest regrade in the store and follows it. The service here works no jobs (--no-jobs), so the
 * regrade stays half-done until the test does its parts by hand, as another process would.
 */
describe.skipIf(!chromiumPresent)('a regrade followed across page reloads', () => {
  let database: TestDatabase;
  let app: FastifyInstance;
  let s: Seed;
  let browser: Browser;
  let origin: string;
  // 600 submissions: three parts of 250, 250 and 100 (the part size in server/grading/regrade.ts).
  const students = Array.from({ length: 600 }, (_, i) => `S-${String(1001 + i)}`);

  beforeAll(async () => {
    database = await openTestDatabase('postgres');
    app = await buildApp({ config: { ...testConfig, role: 'requests' }, store: database.store });
    s = await seedCourse(app);
    await call(app, 'POST', `/v1/sections/${s.sectionA.id}/roster`, s.instructorToken, { students: students.map((studentId) => ({ studentId })) }, 200);
    await call(app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, s.taAToken, submissionsFor(students, 8), 201);
    origin = await app.listen({ port: 0, host: '127.0.0.1' });
    browser = await launchChromium();
  }, 180_000);
  afterAll(async () => {
    await browser?.close();
    await app?.close();
    await database?.close();
  });

  const panelOf = (page: Page) => page.locator('article', { has: page.getByRole('heading', { name: s.assignment.title }) });

  it('answers null before any regrade, then the one started last; a TA may not ask', async () => {
    const url = `/v1/assignments/${s.assignment.id}/regrades/latest`;
    expect((await call(app, 'GET', url, s.instructorToken, undefined, 200)).body).toEqual({ regrade: null });
    expect((await call(app, 'GET', url, s.taAToken)).status).toBe(403);
  });

  it('shows the progress stored for a regrade started before the reload, and its end', async () => {
    const started = (await call(app, 'POST', `/v1/assignments/${s.assignment.id}/regrade`, s.instructorToken, {}, 202)).body;
    expect(started).toMatchObject({ total: 600, done: 0, status: 'running' });
    expect((await call(app, 'GET', `/v1/assignments/${s.assignment.id}/regrades/latest`, s.instructorToken, undefined, 200)).body.regrade).toEqual(started);

    const page = await browser.newPage();
    // A reload cuts off the requests still under way (net::ERR_ABORTED): those are the test's doing, any other failure counts.
    const problems: string[] = [];
    watchProblems(page, problems);
    const aborted = new Set<string>();
    page.on('requestfailed', (r) => r.failure()?.errorText === 'net::ERR_ABORTED' && aborted.add(`failed: ${r.url()}`));
    await signIn(page, origin, s.instructorToken);
    await page.getByRole('link', { name: 'Manage the course: assignments, rosters, staff' }).click();
    const panel = panelOf(page);
    await panel.getByText('0 of 600 regraded; it goes on if you leave this page').waitFor();
    expect(await panel.getByRole('button', { name: 'Regrade every submission' }).isDisabled()).toBe(true);

    // One part done elsewhere while the page is away; the reloaded page shows it.
    await app.regrades.runPart(database.store.db, { regradeId: started.regradeId, part: 0 });
    await page.reload();
    await panel.getByText('250 of 600 regraded; it goes on if you leave this page').waitFor();
    expect(await panel.getByRole('progressbar', { name: 'Regrade progress' }).evaluate((bar) => [(bar as HTMLProgressElement).value, (bar as HTMLProgressElement).max])).toEqual([250, 600]);

    // The rest done while the page watches: it follows without a reload.
    await app.regrades.runPart(database.store.db, { regradeId: started.regradeId, part: 1 });
    await panel.getByText('500 of 600 regraded; it goes on if you leave this page').waitFor();
    await app.regrades.runPart(database.store.db, { regradeId: started.regradeId, part: 2 });
    await panel.getByText(/^Regrade finished .+: 600 of 600 submissions regraded\.$/).waitFor();
    expect(await panel.getByRole('button', { name: 'Regrade every submission' }).isDisabled()).toBe(false);
    expect(problems.filter((p) => !aborted.has(p))).toEqual([]);
    await page.close();
  }, 120_000);
});
