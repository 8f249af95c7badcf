import { mkdir, readFile, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { exampleRowsOf } from '../support/example-csv.ts';
import { call, openApi, seedCourse, type Api, type Seed } from '../support/api-fixture.ts';
import { CHROMIUM_ABSENT, chromiumPresent, launchChromium } from '../support/chromium.ts';
import { pageOverflow, pasteCells, signIn, watchProblems } from '../support/workspace-page.ts';

if (!chromiumPresent) console.warn(CHROMIUM_ABSENT);

/** Where the pictures go (outside the repository unless asked), to be looked at by a person. */
const SHOTS = process.env.SCREENSHOT_DIR ?? join(tmpdir(), 'rateproof-student-shots');

/** A phone held upright (390 CSS px, common practice, no source) and a laptop screen. */
const WIDTHS = [390, 1280];

/** The grouped form of an access code: 12 characters of the 32 without look-alikes (the shared contract). */
const CODE = /^[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{4}-[0-9A-HJKMNP-TV-Z]{4}$/;

/**
 * The student's own door in a real headless Chromium against the service on a test database: an
 * instructor issues codes on the section page (shown once, printable, as a CSV); a student signs in
 * with a code at each width, hands in their values through the grid (pasted as from a spreadsheet),
 * sees the form check and no grade, sees nothing before release, and reads their feedback once a TA
 * releases it; the staff page shows when they first read it. No console error on the way.
 */
describe.skipIf(!chromiumPresent)("the students' own door in a browser", () => {
  let api: Api;
  let s: Seed;
  let browser: Browser;
  let origin: string;
  /** One student's readings and reported values from the example files, without the student_id column. */
  let readings: string[][];
  let reported: string[][];

  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
    origin = await api.app.listen({ port: 0, host: '127.0.0.1' });
    // The example files of the first kind (docs/examples): student B-01's 4 runs of 16 readings, counted by hand.
    [readings, reported] = await Promise.all([exampleRowsOf('readings.csv', 'B-01'), exampleRowsOf('reported.csv', 'B-01')]);
    await mkdir(SHOTS, { recursive: true });
    browser = await launchChromium();
  }, 60_000);
  afterAll(async () => {
    await browser?.close();
    await api?.close();
  });

  const results = () => `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/results`;

  async function issueCode(studentId: string): Promise<string> {
    const { body } = await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/access-codes`, s.instructorToken, { studentIds: [studentId] }, 201);
    return body.codes[0].code as string;
  }

  async function shoot(page: Page, name: string, width: number) {
    await page.screenshot({ path: join(SHOTS, `${name}-${width}.png`), fullPage: true });
    const w = await pageOverflow(page);
    expect(w.scroll, `${name} at ${width}: page ${w.scroll} px wide in a window of ${w.client}; past the edge: ${w.past.join(', ')}`).toBeLessThanOrEqual(w.client);
  }

  it('lets an instructor issue the section’s codes, shown once with one printed slip per student and a CSV for a mail merge', async () => {
    const context = await browser.newContext({ acceptDownloads: true, viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    const problems = watchProblems(page);
    await signIn(page, origin, s.instructorToken);
    await page.getByRole('link', { name: s.assignment.title }).first().click();
    await page.getByText('Students’ access codes').click();
    await page.getByText('0 of 6 enrolled students hold a code.').waitFor();
    await page.getByRole('button', { name: 'Issue codes for the whole section…' }).click();
    await page.getByText('6 codes issued. They are shown only now').waitFor();
    const shown = await page.locator('table.code-list tbody tr').evaluateAll((rows) => rows.map((r) => [r.querySelector('th')!.textContent, r.querySelector('code')!.textContent]));
    // The roster of section A in the fixture: S-001..S-006.
    expect(shown.map(([id]) => id)).toEqual(['S-001', 'S-002', 'S-003', 'S-004', 'S-005', 'S-006']);
    for (const [, code] of shown) expect(code).toMatch(CODE);
    await page.getByText('6 of 6 enrolled students hold a code.').waitFor();
    await shoot(page, 'codes-issued', 1280);

    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download the CSV for a mail merge' }).click()]);
    const lines = (await readFile((await download.path())!, 'utf8')).trim().split('\r\n');
    expect(lines[0]).toBe('studentId,displayName,code,address');
    expect(lines.slice(1)).toEqual(shown.map(([id, code]) => `${id},,${code},${origin}/student`));

    // On paper: one slip per student, with the address, and nothing of the page around it.
    await page.emulateMedia({ media: 'print' });
    expect(await page.locator('.code-slip').evaluateAll((slips) => slips.filter((x) => (x as HTMLElement).offsetHeight > 0).length)).toBe(6);
    expect(await page.locator('main').isVisible()).toBe(false);
    await expect.poll(() => page.locator('.code-slip').first().textContent()).toContain(`Sign in at ${origin}/student`);
    await page.screenshot({ path: join(SHOTS, 'codes-print.png') });
    await page.emulateMedia({ media: 'screen' });

    // A code shown here opens the student's pages; a revoked one no longer does (checked through the API).
    const code = shown[5][1]!;
    expect((await api.app.inject({ method: 'POST', url: '/v1/student/session', payload: { code } })).statusCode).toBe(201);
    await page.locator('tr', { hasText: 'S-006' }).getByRole('button', { name: 'Revoke' }).click();
    await page.getByRole('button', { name: 'Revoke the code' }).click();
    await page.getByText('The code of S-006 is revoked; their sessions are ended.').waitFor();
    expect((await api.app.inject({ method: 'POST', url: '/v1/student/session', payload: { code } })).statusCode).toBe(401);
    expect(problems).toEqual([]);
    await context.close();
  });

  for (const [i, width] of WIDTHS.entries()) {
    const studentId = ['S-001', 'S-002'][i];
    it(`at ${width} px: a student signs in with a code, hands in through the grid, sees the form check and nothing before release, then reads their feedback`, async () => {
      const code = await issueCode(studentId);
      const context = await browser.newContext({ viewport: { width, height: 844 } });
      const page = await context.newPage();
      // Nothing a student should meet: no console or script error, no failed request.
      const problems = watchProblems(page);

      await page.goto(`${origin}/student`);
      await page.getByLabel('Access code').fill(code.toLowerCase());
      await shoot(page, 'student-sign-in', width);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.getByText(`Signed in as ${studentId}`).waitFor();
      await page.getByRole('heading', { name: s.assignment.title }).waitFor();
      await page.getByText('Nothing handed in yet.').waitFor();
      await page.getByText('Feedback: not released yet.').waitFor();
      await shoot(page, 'student-home', width);
      // The staff's address sends a student's session to their own pages.
      await page.goto(origin);
      await page.waitForURL(`${origin}/student`);
      await page.getByText('Nothing handed in yet.').waitFor();

      await page.getByRole('link', { name: 'Hand in your values' }).click();
      // Pasted with the header line: by column name; the reported values without one: from the cell on.
      await pasteCells(page, '#grid-readings input[data-row="0"][data-col="0"]', readings);
      await page.getByText(`${readings.length - 1} rows pasted by their column names.`).waitFor();
      const gridOrder = await page.locator('#grid-reported thead th').allTextContents();
      const header = reported[0];
      const inGridOrder = reported.slice(1).map((r) => gridOrder.slice(1, -1).map((name) => r[header.indexOf(name.replace(/ optional$/, ''))] ?? ''));
      await pasteCells(page, '#grid-reported input[data-row="0"][data-col="0"]', inGridOrder);
      await page.getByText(`${inGridOrder.length} rows pasted.`).waitFor();
      await page.getByRole('button', { name: 'Hand in these values' }).click();
      await page.getByRole('heading', { name: 'Version 1 handed in' }).waitFor();
      // The example student's readings, counted by hand: 4 runs of 16 readings.
      expect(await page.locator('.form-lines li').allTextContents()).toContain('4 runs read, 16 readings each');
      // The form check only: no score, no finding.
      expect(await page.locator('main').textContent()).not.toMatch(/score|point/i);
      await shoot(page, 'student-submitted', width);

      // Before release: nothing to read, and the service has nothing for them either.
      await page.getByRole('link', { name: 'Your assignments' }).click();
      await page.getByText(/^Version 1, handed in/).waitFor();
      await page.goto(`${origin}/student#/assignment/${s.assignment.id}/feedback`);
      await page.getByText('Your feedback on this assignment is not released yet.').waitFor();
      expect((await page.request.get(`${origin}/v1/student/assignments/${s.assignment.id}/feedback`)).status()).toBe(404);

      // A TA releases the section; the student reads their feedback.
      await call(api.app, 'POST', `${results().replace(/results$/, 'release')}`, s.taAToken, undefined, 200);
      await page.goto(`${origin}/student#/`);
      await page.getByText(/Feedback on version 1 released .*; not read yet\./).waitFor();
      await page.getByRole('link', { name: 'Read your feedback' }).click();
      await page.getByRole('heading', { name: `Feedback: ${s.assignment.title}` }).waitFor();
      // Their values against ours, as the staff see the same released result.
      const row = ((await call(api.app, 'GET', results(), s.taAToken, undefined, 200)).body as Array<{ studentId: string; submissionId: number; score: number; maxScore: number; feedbackFirstReadAt: string | null }>).find((r) => r.studentId === studentId)!;
      const staffDisplay = (await call(api.app, 'GET', `/v1/submissions/${row.submissionId}/display`, s.taAToken, undefined, 200)).body;
      await page.getByText(`Score ${row.score} of ${row.maxScore}`).waitFor();
      expect(await page.locator('table.comparison caption').textContent()).toBe(staffDisplay.comparison.caption);
      expect(await page.locator('table.comparison tbody tr').count()).toBe(staffDisplay.comparison.rows.length);
      expect(await page.locator('svg.plot').count()).toBe(staffDisplay.plots.length);
      expect(await page.locator('li.finding').count()).toBe(staffDisplay.stages.reduce((n: number, st: { cards: unknown[] }) => n + st.cards.length, 0));
      // None of the staff's controls, and nothing of another student.
      expect(await page.locator('details.place-detail, form.override').count()).toBe(0);
      const text = (await page.locator('body').textContent())!;
      // The fixture's other students, sections A and B.
      expect(['S-001', 'S-002', 'S-003', 'S-004', 'S-005', 'S-006', 'S-101', 'S-102', 'S-103'].filter((id) => id !== studentId && text.includes(id))).toEqual([]);
      const pdf = await page.request.get(`${origin}${await page.getByRole('link', { name: 'Feedback sheet (PDF)' }).getAttribute('href')}`);
      expect((await pdf.body()).subarray(0, 4).toString()).toBe('%PDF');
      await shoot(page, 'student-feedback', width);

      // The first read shows on their home and on the staff's results.
      await page.getByRole('link', { name: 'Your assignments' }).click();
      await page.getByText(/Feedback on version 1 released .*; first read /).waitFor();
      const after = ((await call(api.app, 'GET', results(), s.taAToken, undefined, 200)).body as Array<{ studentId: string; feedbackFirstReadAt: string | null }>).find((r) => r.studentId === studentId)!;
      expect(after.feedbackFirstReadAt).not.toBeNull();

      await page.getByRole('button', { name: 'Sign out' }).click();
      await page.getByLabel('Access code').waitFor();
      expect(problems).toEqual([]);
      await context.close();
    });
  }

  it('names a wrong code and a refused value by its field, marks late work held, and shows the staff the late, held and read columns', async () => {
    // Late work under the hold policy: the section's deadline passed an hour ago.
    await call(api.app, 'PATCH', `/v1/assignments/${s.assignment.id}/settings`, s.instructorToken, { settings: { late: { policy: 'hold', points: 0 } } }, 200);
    await call(api.app, 'PUT', results().replace(/results$/, 'deadline'), s.instructorToken, { dueAt: new Date(Date.now() - 3_600_000).toISOString() }, 200);
    const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
    const page = await context.newPage();
    // The refusals below are answered 401 and 400, which the browser logs as failed loads; script errors there must be none.
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(String(e)));
    await page.goto(`${origin}/student`);
    await page.getByLabel('Access code').fill('AAAA-BBBB-CCCC');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText('That code is not valid.', { exact: false }).waitFor();

    await page.getByLabel('Access code').fill(await issueCode('S-003'));
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByText('waits for your teaching assistant to accept it').waitFor();
    await page.getByRole('link', { name: 'Hand in your values' }).click();
    await page.getByText('The deadline has passed: what you hand in now is marked late.').waitFor();
    const t = readings[0].indexOf('t');
    const bad = readings.map((r) => [...r]);
    // Grid row 3 (the first run's third reading) gets a time that is no number.
    bad[3][t] = 'ten';
    await pasteCells(page, '#grid-readings input[data-row="0"][data-col="0"]', bad);
    await page.getByRole('button', { name: 'Hand in these values' }).click();
    await page.getByText('Nothing was handed in').waitFor();
    // The field named as a person counts, from 1 (hand-worked from the path the schema gives).
    await page.locator('.refused li', { hasText: 'run 1, reading 3, item 1' }).waitFor();
    await shoot(page, 'student-refused', 390);
    await page.locator(`#grid-readings input[data-row="2"][data-col="${t}"]`).fill(readings[3][t]);
    await page.getByRole('button', { name: 'Hand in these values' }).click();
    await page.getByRole('heading', { name: 'Version 1 handed in' }).waitFor();
    await page.getByText(/, late, waiting to be accepted\.$/).waitFor();
    expect(errors).toEqual([]);

    // The staff's results: S-003 late and held, accepted with one click; the read column as the service has it.
    const staff = await browser.newContext({ viewport: { width: 390, height: 844 } });
    const ta = await staff.newPage();
    const problems = watchProblems(ta);
    await signIn(ta, origin, s.taAToken);
    await ta.getByRole('link', { name: s.assignment.title }).click();
    const row = ta.locator('table.results tbody tr', { hasText: 'S-003' });
    await row.getByText('held until accepted').waitFor();
    await shoot(ta, 'staff-results-held', 390);
    // The student's page says so too, and offers the same action; the results table's is used here.
    await row.getByRole('link', { name: 'S-003' }).click();
    await ta.getByText('Handed in after the deadline and held until accepted.').waitFor();
    await ta.getByRole('button', { name: 'Accept late work' }).waitFor();
    await ta.goBack();
    await row.getByRole('button', { name: 'Accept late work' }).click();
    await expect.poll(() => row.locator('td[data-label="Late"]').textContent()).toBe('late');
    const rows = (await call(api.app, 'GET', results(), s.taAToken, undefined, 200)).body as Array<{ studentId: string; held: boolean; released: boolean; feedbackFirstReadAt: string | null }>;
    expect(rows.find((r) => r.studentId === 'S-003')!.held).toBe(false);
    for (const r of rows) {
      const read = (await ta.locator('table.results tbody tr', { hasText: r.studentId }).locator('td[data-label="Read"]').textContent())!;
      expect(read === '' ? 'none' : read === 'not yet' ? 'released, unread' : 'read', r.studentId).toBe(r.feedbackFirstReadAt ? 'read' : r.released ? 'released, unread' : 'none');
    }
    expect(problems).toEqual([]);
    await staff.close();
    await context.close();
  });

  it('takes the kind’s CSV file itself, without a student_id column, and answers with the form check', async () => {
    const file = join(tmpdir(), `rateproof-own-readings-${process.pid}.csv`);
    await writeFile(file, `${readings.map((r) => r.join(',')).join('\n')}\n`);
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    const problems = watchProblems(page);
    await page.goto(`${origin}/student`);
    await page.getByLabel('Access code').fill(await issueCode('S-004'));
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('link', { name: 'Hand in your values' }).click();
    await page.getByText('Or upload your CSV files').click();
    await page.getByLabel('readings.csv').setInputFiles(file);
    await page.getByRole('button', { name: 'Hand in these files' }).click();
    await page.getByRole('heading', { name: 'Version 1 handed in' }).waitFor();
    // The same readings as the grid's (4 runs of 16, counted by hand in the example file).
    expect(await page.locator('.form-lines li').allTextContents()).toContain('4 runs read, 16 readings each');
    expect(problems).toEqual([]);
    await context.close();
  });
});
