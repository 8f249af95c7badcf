import { mkdir } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateSection } from '../../kinds/first-order-catalysis/demo/generated-section.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { generateAssignment } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { call, openApi, seedCourse, type Api, type Seed } from '../support/api-fixture.ts';
import { CHROMIUM_ABSENT, chromiumPresent, launchChromium } from '../support/chromium.ts';
import { pageOverflow, signIn as signInAt, watchProblems } from '../support/workspace-page.ts';

if (!chromiumPresent) console.warn(CHROMIUM_ABSENT);

/** Where the pictures go (outside the repository unless asked), to be looked at by a person. */
const SHOTS = process.env.SCREENSHOT_DIR ?? join(tmpdir(), 'rateproof-phone-shots');

/** A phone held upright (390 CSS px, common practice, no source) and a laptop screen. */
const WIDTHS = [390, 1280];

/**
 * Every workspace page at a phone's width and a laptop's: no console error or failed request, no page
 * wider than the window (no sideways scroll of the page itself), and on the phone the results table shows each student's id and
 * score without scrolling. Screenshots of each page at each width are written for a person to look at.
 */
describe.skipIf(!chromiumPresent)('the workspace at phone and laptop widths', () => {
  let api: Api;
  let s: Seed;
  let browser: Browser;
  let origin: string;
  let studentPath = '';

  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
    origin = await api.app.listen({ port: 0, host: '127.0.0.1' });
    // Invented data with slips, so the results table has findings and the student page has cards.
    const { submissions } = generateSection(seededRandom(5), generateAssignment(seededRandom(5), { fitModel: 'origin' }), ['S-001', 'S-002', 'S-003', 'S-004', 'S-005']);
    const stored = await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, s.taAToken, submissions, 201);
    const results = (await call(api.app, 'GET', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/results`, s.taAToken, undefined, 200)).body as Array<{ submissionId: number | null; errors: number }>;
    const withSlips = results.find((r) => r.errors > 0) ?? results.find((r) => r.submissionId !== null)!;
    expect(stored.body.stored.length).toBe(5);
    studentPath = `#/section/${s.sectionA.id}/assignment/${s.assignment.id}/submission/${withSlips.submissionId}`;
    await mkdir(SHOTS, { recursive: true });
    browser = await launchChromium();
  }, 60_000);
  afterAll(async () => {
    await browser?.close();
    await api?.close();
  });

  const signIn = (page: Page, token: string) => signInAt(page, origin, token);

  /** Opens every folded part of the page (upload, override and settings forms), the widest state. */
  async function unfold(page: Page) {
    await page.evaluate(() => document.querySelectorAll('main details').forEach((d) => ((d as HTMLDetailsElement).open = true)));
  }

  async function checkAndShoot(page: Page, name: string, width: number) {
    await unfold(page);
    await page.screenshot({ path: join(SHOTS, `${name}-${width}.png`), fullPage: true });
    const w = await pageOverflow(page);
    expect(w.scroll, `${name} at ${width}: page ${w.scroll} px wide in a window of ${w.client}; past the edge: ${w.past.join(', ')}`).toBeLessThanOrEqual(w.client);
    // The header spans the whole page, not only the part first in the window.
    const header = await page.locator('header.masthead').boundingBox();
    expect(header!.width, `${name} at ${width}: header width`).toBeGreaterThanOrEqual(w.scroll);
  }

  for (const width of WIDTHS) {
    it(`at ${width} px: sign-in, sections, results, one student's result and the course page fit the window`, async () => {
      const context = await browser.newContext({ viewport: { width, height: 844 } });
      const page = await context.newPage();
      // Nothing a person following the README should meet: no console or script error, no failed request.
      const problems = watchProblems(page);

      await page.goto(origin);
      await page.getByLabel('Staff token').waitFor();
      await checkAndShoot(page, 'sign-in', width);

      await signIn(page, s.taAToken);
      await page.getByRole('heading', { name: 'Your sections' }).waitFor();
      await checkAndShoot(page, 'sections', width);

      await page.getByRole('link', { name: s.assignment.title }).click();
      await page.locator('table.results tbody tr').first().waitFor();
      await checkAndShoot(page, 'results', width);
      // Each student's id and score are on screen without scrolling sideways, whatever the layout:
      // the score cell is found by its column's heading, so a card layout and a table layout both count.
      const scoreColumn = (await page.locator('table.results thead th').allTextContents()).findIndex((t) => t.startsWith('Score'));
      expect(scoreColumn).toBeGreaterThan(0);
      expect(await page.locator('table.results tbody tr').count()).toBe(6);
      // Seen means inside the window and not clipped or covered: the points just inside the cell's
      // left and right edges hit the cell itself (the page is scrolled down to each row first).
      const unseen = await page.evaluate((column) => {
        const client = document.documentElement.clientWidth;
        const missed: string[] = [];
        for (const tr of document.querySelectorAll('table.results tbody tr')) {
          window.scrollTo(0, tr.getBoundingClientRect().top + window.scrollY - 100);
          for (const cell of [tr.querySelector('th')!, tr.children[column]]) {
            const r = cell.getBoundingClientRect();
            const y = r.top + Math.min(10, r.height / 2);
            const hits = [r.left + 1, r.right - 1].map((x) => document.elementFromPoint(x, y));
            if (r.left < 0 || r.right > client || !hits.every((hit) => hit && cell.contains(hit))) missed.push(`${tr.querySelector('th')!.textContent}: ${cell.textContent}`);
          }
        }
        window.scrollTo(0, 0);
        return missed;
      }, scoreColumn);
      expect(unseen).toEqual([]);
      // Shown as cards, the results are still a table to a screen reader: Chromium's own accessibility
      // tree names each student as a row header (display changes once dropped table semantics in
      // some browsers, common practice, no source).
      const cdp = await context.newCDPSession(page);
      const { nodes } = (await cdp.send('Accessibility.getFullAXTree')) as { nodes: Array<{ ignored: boolean; role?: { value: string }; name?: { value: string } }> };
      const rowHeaders = nodes.filter((n) => !n.ignored && n.role?.value === 'rowheader').map((n) => n.name?.value);
      expect(rowHeaders).toEqual(expect.arrayContaining(['S-001', 'S-002', 'S-003', 'S-004', 'S-005', 'S-006']));
      await cdp.detach();

      await page.goto(`${origin}/${studentPath}`);
      await page.locator('li.finding').first().waitFor();
      await checkAndShoot(page, 'student', width);

      const instructor = await context.newPage();
      watchProblems(instructor, problems);
      await context.clearCookies();
      await signIn(instructor, s.instructorToken);
      await instructor.getByRole('link', { name: 'Manage the course: assignments, rosters, staff' }).click();
      await instructor.getByRole('heading', { name: 'Staff' }).waitFor();
      await checkAndShoot(instructor, 'course', width);

      expect(problems).toEqual([]);
      await context.close();
    });
  }
});
