import type { FastifyInstance } from 'fastify';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { buildApp } from '../../server/app.ts';
import { giveUpPassback } from '../../server/grading/grade-passback.ts';
import { ADMIN_TOKEN, call, seedCourse, submissionsFor, testConfig, type Seed } from '../support/api-fixture.ts';
import { CHROMIUM_ABSENT, chromiumPresent, launchChromium } from '../support/chromium.ts';
import { PLATFORM_ROLES, TestPlatform, type PlatformUser } from '../support/lti-platform/test-platform.ts';
import { enterTool, launchTool } from '../support/lti-platform/tool-launch.ts';
import { openTestDatabase, type TestDatabase } from '../support/test-database.ts';
import { pageOverflow, signIn, watchProblems } from '../support/workspace-page.ts';

if (!chromiumPresent) console.warn(CHROMIUM_ABSENT);

/**
 * What a TA sees of grades sent to a learning platform (docs/lti.md, "Grades sent to the platform"):
 * learners of the test platform launch a link placed by hand and submit, a TA releases while the
 * platform's score service stops taking scores part way, the sends left waiting are given up, and the
 * results page shows who was sent and who was not, with the reason; Send again, with the platform back,
 * sends the rest. The expected words are the docs': "sent", "not sent", "gave up after …".
 */
describe.skipIf(!chromiumPresent)('grade sends on the results page', () => {
  let database: TestDatabase;
  let app: FastifyInstance;
  let platform: TestPlatform;
  let s: Seed;
  let browser: Browser;
  let origin: string;
  // Invented people.
  const learners: PlatformUser[] = Array.from({ length: 4 }, (_, i) => ({ sub: `sub-sends-learner-${i + 1}`, name: `Learner ${i + 1}`, roles: PLATFORM_ROLES.learner }));
  type Row = { studentId: string; gradeSent: { state: string; reason: string | null } | null };
  const results = async (sectionId: number) => (await call(app, 'GET', `/v1/sections/${sectionId}/assignments/${s.assignment.id}/results`, s.instructorToken, undefined, 200)).body as Row[];
  let sent: string[] = [];
  let notSent: string[] = [];

  beforeAll(async () => {
    database = await openTestDatabase('postgres');
    // A passback that waits tries again after 1 s (30 s in service).
    app = await buildApp({ config: { ...testConfig, passbackRetrySeconds: 1 }, store: database.store });
    origin = await app.listen({ port: 0, host: '127.0.0.1' });
    platform = await TestPlatform.start();
    platform.toolKeySetUrl = `${origin}/v1/lti/jwks`;
    s = await seedCourse(app);
    const registered = await call(app, 'POST', '/v1/lti/platforms', ADMIN_TOKEN, platform.registration(s.course.id), 201);
    await call(app, 'PUT', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/lti-placement`, s.instructorToken, { platformId: registered.body.id, contextId: platform.contextId, resourceLinkId: platform.resourceLinkId }, 200);
    const work = submissionsFor(learners.map((l) => l.sub), 31);
    for (const [i, user] of learners.entries()) {
      const launched = await launchTool(app, platform, user);
      expect(launched.statusCode, launched.body).toBe(200);
      const cookie = await enterTool(app, launched.body);
      const csrf = (await app.inject({ method: 'GET', url: '/v1/student/me', headers: { cookie } })).json().csrfToken;
      const { studentId: _id, ...own } = work[i];
      const res = await app.inject({ method: 'POST', url: `/v1/student/assignments/${s.assignment.id}/submissions`, headers: { cookie, 'x-csrf-token': csrf }, payload: own });
      expect(res.statusCode, res.body).toBe(201);
    }
    // The score service takes two scores, then answers 503 until the sends left waiting are given up.
    platform.failScoresAfter = 2;
    await call(app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/release`, s.taAToken, undefined, 200);
    await vi.waitFor(async () => expect((await results(s.sectionA.id)).filter((r) => r.gradeSent?.state === 'waiting')).toHaveLength(2), { timeout: 20_000, interval: 200 });
    // What the queue does once its tries are used up (hours in service), done now.
    await giveUpPassback(database.store.db, { assignmentId: s.assignment.id, sectionId: s.sectionA.id });
    const rows = (await results(s.sectionA.id)).filter((r) => r.gradeSent !== null);
    sent = rows.filter((r) => r.gradeSent!.state === 'sent').map((r) => r.studentId).sort();
    notSent = rows.filter((r) => r.gradeSent!.state === 'failed').map((r) => r.studentId).sort();
    browser = await launchChromium();
  }, 60_000);
  afterAll(async () => {
    await browser?.close();
    await app?.close();
    await platform?.close();
    await database?.close();
  });

  /** One browser context per staff token, signed in once: its session cookie serves each page after. */
  const signedIn = new Map<string, BrowserContext>();
  /** The results page of a section, signed in as its TA, at a window `width` wide. */
  async function resultsPage(sectionId: number, token: string, width = 1280): Promise<{ page: Page; problems: string[] }> {
    let context = signedIn.get(token);
    if (!context) {
      context = await browser.newContext();
      const first = await context.newPage();
      await signIn(first, origin, token);
      await first.close();
      signedIn.set(token, context);
    }
    const page = await context.newPage();
    await page.setViewportSize({ width, height: 900 });
    const problems = watchProblems(page);
    await page.goto(`${origin}/#/section/${sectionId}/assignment/${s.assignment.id}`);
    await page.getByRole('table', { name: 'Latest result of each student' }).waitFor();
    return { page, problems };
  }
  /** Each body row's student id and its Grade sent cell's text, by the cell's own column name. */
  const sendCells = (page: Page) =>
    page.locator('table.results tbody tr').evaluateAll((rows) =>
      rows.map((tr) => [tr.querySelector('th')!.textContent!.trim(), tr.querySelector('td[data-label="Grade sent"]')?.textContent ?? null] as [string, string | null]),
    );

  it('the platform took two scores and the other two were given up (the state the page is shown)', () => {
    expect(platform.gradebook(platform.lineItems[0].id).size).toBe(2);
    expect(sent).toHaveLength(2);
    expect(notSent).toHaveLength(2);
  });

  it('shows "sent" for the sent students, "not sent" with the reason for the others, nothing for students added by hand', async () => {
    const { page, problems } = await resultsPage(s.sectionA.id, s.taAToken);
    await page.getByRole('columnheader', { name: 'Grade sent' }).waitFor();
    const cells = new Map(await sendCells(page));
    for (const id of sent) expect(cells.get(id)).toBe('sent');
    // docs/lti.md: sends still waiting after the tries are marked failed, "gave up after …", with the last reason.
    for (const id of notSent) expect(cells.get(id)).toMatch(/^not sent gave up after (1 try|\d+ tries): score service: status 503$/);
    // docs/lti.md: students added by hand are not sent; their row shows nothing in the column.
    for (const id of ['S-001', 'S-002', 'S-003', 'S-004', 'S-005', 'S-006']) expect(cells.get(id)).toBe('');
    // The reasons wrap inside their column: the table fits its place and does not scroll sideways.
    expect(await page.locator('.table-wrap', { has: page.locator('table.results') }).evaluate((wrap) => wrap.scrollWidth - wrap.clientWidth)).toBeLessThanOrEqual(0);
    expect(problems).toEqual([]);
    await page.close();
  });

  it('the filter "Grade not sent to the course" lists exactly the students not sent', async () => {
    const { page } = await resultsPage(s.sectionA.id, s.taAToken);
    await page.getByLabel('Show').selectOption({ label: 'Grade not sent to the course' });
    expect((await sendCells(page)).map(([id]) => id).sort()).toEqual(notSent);
    await page.close();
  });

  it('a section with no platform students has no Grade sent column', async () => {
    const { page } = await resultsPage(s.sectionB.id, s.taBToken);
    await page.getByRole('columnheader', { name: 'Student' }).waitFor();
    expect(await page.getByRole('columnheader', { name: 'Grade sent' }).count()).toBe(0);
    expect(await page.locator('td[data-label="Grade sent"]').count()).toBe(0);
    await page.close();
  });

  it('on a phone the reason wraps inside its card: the page does not scroll sideways', async () => {
    const { page } = await resultsPage(s.sectionA.id, s.taAToken, 390);
    await page.getByText(/gave up after/).first().waitFor();
    const overflow = await pageOverflow(page);
    expect(overflow.scroll, overflow.past.join(', ')).toBeLessThanOrEqual(overflow.client);
    await page.close();
  });

  it('Send again, with the platform back, ends with every platform student "sent"', async () => {
    platform.failScoresAfter = undefined;
    const { page, problems } = await resultsPage(s.sectionA.id, s.taAToken);
    const note = page.locator('.send-note');
    // docs/lti.md: Send again makes the failed sends wait again and queues them.
    await note.getByText(/^2 grades could not be sent/).waitFor();
    await note.getByRole('button', { name: 'Send again' }).click();
    // The answer's count of sends made to wait again (docs/lti.md: {"waiting": n}).
    await page.getByRole('status').getByText('2 grades queued to be sent again.').waitFor();
    await vi.waitFor(async () => expect((await results(s.sectionA.id)).filter((r) => r.gradeSent !== null && r.gradeSent.state !== 'sent')).toEqual([]), { timeout: 15_000, interval: 200 });
    await page.reload();
    await page.getByRole('columnheader', { name: 'Grade sent' }).waitFor();
    const cells = new Map(await sendCells(page));
    for (const id of [...sent, ...notSent]) expect(cells.get(id)).toBe('sent');
    expect(await note.count()).toBe(0);
    expect(platform.gradebook(platform.lineItems[0].id).size).toBe(4);
    expect(problems).toEqual([]);
    await page.close();
  });
});
