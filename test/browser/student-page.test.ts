import { mkdir, readFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateSection } from '../../kinds/first-order-catalysis/demo/generated-section.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { generateAssignment } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import type { SubmissionDisplay } from '../../schemas/display.ts';
import { call, openApi, seedCourse, type Api, type Seed } from '../support/api-fixture.ts';
import { CHROMIUM_ABSENT, chromiumPresent, launchChromium } from '../support/chromium.ts';
import { signIn, watchProblems } from '../support/workspace-page.ts';

if (!chromiumPresent) console.warn(CHROMIUM_ABSENT);

/** Where the pictures go (outside the repository unless asked), to be looked at by a person. */
const SHOTS = process.env.SCREENSHOT_DIR ?? join(tmpdir(), 'rateproof-student-shots');
/** A phone held upright and a laptop screen (common practice, no source). */
const WIDTHS = [390, 1280];

/**
 * The student page in Chromium, for both kinds: it draws what the server's display sends (the
 * student's dashed line for a run with a finding, the second kind's Arrhenius and Eyring plots), shows
 * no checker path outside the TA's detail view, and no number breaks across lines at either width.
 */
describe.skipIf(!chromiumPresent)('the student page in a browser', () => {
  let api: Api;
  let s: Seed;
  let browser: Browser;
  let origin: string;
  let firstKind = '';
  let secondKind = '';

  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
    origin = await api.app.listen({ port: 0, host: '127.0.0.1' });
    const { submissions } = generateSection(seededRandom(5), generateAssignment(seededRandom(5), { fitModel: 'origin' }), ['S-001', 'S-002', 'S-003', 'S-004', 'S-005']);
    const stored = (await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, s.taAToken, submissions, 201)).body.stored as Array<{ submissionId: number }>;
    // A student whose ln F plot has the student's own line (a run with a finding), as the server says.
    for (const { submissionId } of stored) {
      const display = (await call(api.app, 'GET', `/v1/submissions/${submissionId}/display`, s.taAToken, undefined, 200)).body as SubmissionDisplay;
      if (display.plots.some((p) => p.title.startsWith('ln F') && p.series.some((x) => x.owner === 'student' && x.line))) {
        firstKind = `#/section/${s.sectionA.id}/assignment/${s.assignment.id}/submission/${submissionId}`;
        break;
      }
    }
    // The second kind: the example assignment and batch of docs/examples, handed in by students of the roster.
    const example = (name: string) => readFile(new URL(`../../docs/examples/temperature-dependence/${name}`, import.meta.url), 'utf8').then(JSON.parse);
    const assignment = (await call(api.app, 'POST', `/v1/courses/${s.course.id}/assignments`, s.instructorToken, { title: 'Temperature dependence (invented)', settings: await example('assignment.json') }, 201)).body;
    const batch = ((await example('submissions.json')) as Array<{ studentId: string }>).map((x, i) => ({ ...x, studentId: `S-00${i + 1}` }));
    const second = (await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${assignment.id}/submissions`, s.taAToken, batch, 201)).body.stored as Array<{ submissionId: number }>;
    secondKind = `#/section/${s.sectionA.id}/assignment/${assignment.id}/submission/${second[0].submissionId}`;
    await mkdir(SHOTS, { recursive: true });
    browser = await launchChromium();
  }, 60_000);
  afterAll(async () => {
    await browser?.close();
    await api?.close();
  });

  /** What the page holds against its rules: paths in the visible text, numbers on two lines, sideways scroll. */
  const pageFacts = (page: Page) =>
    page.evaluate(() => ({
      text: document.body.innerText,
      wrapped: [...document.querySelectorAll('.comparison td.number .line')]
        .filter((el) => el.getBoundingClientRect().height > 1.9 * parseFloat(getComputedStyle(el).fontSize))
        .map((el) => el.textContent),
      overflow: document.documentElement.scrollWidth - document.documentElement.clientWidth,
    }));

  async function open(path: string, width: number): Promise<{ page: Page; problems: string[] }> {
    const page = await browser.newPage({ viewport: { width, height: 900 } });
    const problems = watchProblems(page);
    await signIn(page, origin, s.taAToken);
    await page.goto(`${origin}/${path}`);
    await page.locator('svg.plot').first().waitFor();
    return { page, problems };
  }

  it.each(WIDTHS)('draws the student’s dashed line for a run with a finding, with no path and no broken number, at %i px', async (width) => {
    expect(firstKind, 'a generated student with a slip in a run').not.toBe('');
    const { page, problems } = await open(firstKind, width);
    expect(await page.locator('svg.plot line.student-line[data-owner=student]').count()).toBeGreaterThan(0);
    const facts = await pageFacts(page);
    expect(facts.text).not.toMatch(/runs\[|reported\.[A-Za-z]/);
    expect(facts.wrapped).toEqual([]);
    expect(facts.overflow).toBeLessThanOrEqual(0);
    // The path stays for the TA, in the detail view.
    await page.locator('details.place-detail').first().locator('summary').click();
    expect(await page.locator('details.place-detail[open] code.path').first().textContent()).toMatch(/^(runs\[|reported\.)/);
    await page.screenshot({ path: join(SHOTS, `student-first-kind-${width}.png`), fullPage: true });
    await page.locator('li.finding').first().screenshot({ path: join(SHOTS, `student-first-kind-card-${width}.png`) });
    await page.locator('.plots').screenshot({ path: join(SHOTS, `student-first-kind-plots-${width}.png`) });
    expect(problems).toEqual([]);
    await page.close();
  });

  it.each(WIDTHS)('draws the second kind’s Arrhenius and Eyring plots and its table with a difference column at %i px', async (width) => {
    const { page, problems } = await open(secondKind, width);
    expect(await page.locator('svg.plot title').allTextContents()).toEqual(['Arrhenius: ln k against 1/T', 'Eyring: ln(k/T) against 1/T']);
    expect(await page.locator('table.comparison thead th').allTextContents()).toEqual(['Quantity', 'Reported', 'Refit', 'Difference', 'Tolerance']);
    const facts = await pageFacts(page);
    expect(facts.text).not.toMatch(/points\[|reported\.[A-Za-z]/);
    expect(facts.wrapped).toEqual([]);
    expect(facts.overflow).toBeLessThanOrEqual(0);
    await page.screenshot({ path: join(SHOTS, `student-second-kind-${width}.png`), fullPage: true });
    await page.locator('.plots').screenshot({ path: join(SHOTS, `student-second-kind-plots-${width}.png`) });
    expect(problems).toEqual([]);
    await page.close();
  });
});
