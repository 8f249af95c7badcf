import { readFile, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateSection } from '../../kinds/first-order-catalysis/demo/generated-section.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { generateAssignment } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { call, openApi, seedCourse, type Api, type Seed } from '../support/api-fixture.ts';
import { CHROMIUM_ABSENT, chromiumPresent, launchChromium } from '../support/chromium.ts';
import { signIn as signInAt, watchProblems } from '../support/workspace-page.ts';

if (!chromiumPresent) console.warn(CHROMIUM_ABSENT);

/**
 * The workspace in a real headless Chromium against the service on a test database: a TA signs in,
 * uploads a section (invented data from the generator), opens a student with slips, overrides a
 * finding with a reason, releases, downloads the gradebook and signs out.
 */
describe.skipIf(!chromiumPresent)('the workspace in a browser', () => {
  let api: Api;
  let s: Seed;
  let browser: Browser;
  let origin: string;
  const ids = ['S-001', 'S-002', 'S-003', 'S-004', 'S-005'];
  const batchFile = join(tmpdir(), `rateproof-batch-${process.pid}.json`);

  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
    origin = await api.app.listen({ port: 0, host: '127.0.0.1' });
    // The roster has S-001..S-006; five submit, so one row shows as not submitted.
    const { submissions } = generateSection(seededRandom(5), generateAssignment(seededRandom(5), { fitModel: 'origin' }), ids);
    await writeFile(batchFile, JSON.stringify(submissions));
    browser = await launchChromium();
  }, 60_000);
  afterAll(async () => {
    await browser?.close();
    await api?.close();
  });

  const signIn = (page: Page, token: string) => signInAt(page, origin, token);

  /** Signs in, collecting the page's script errors from the start (each test expects none). */
  async function signInWatchingErrors(page: Page, token: string): Promise<string[]> {
    const pageErrors: string[] = [];
    page.on('pageerror', (e) => pageErrors.push(String(e)));
    await signIn(page, token);
    return pageErrors;
  }

  it('shows a first visitor the sign-in page, and a TA their home page, with no console error and no failed request', async () => {
    const page = await browser.newPage();
    const problems = watchProblems(page);
    await page.goto(origin);
    await page.getByLabel('Staff token').waitFor();
    await page.reload();
    await page.getByLabel('Staff token').waitFor();
    await page.getByLabel('Staff token').fill(s.taAToken);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('link', { name: s.assignment.title }).waitFor();
    expect(problems).toEqual([]);
    await page.close();
  });

  it('takes a TA from sign-in through upload, review, override and release to the gradebook and sign-out', async () => {
    const context = await browser.newContext({ acceptDownloads: true });
    const page = await context.newPage();
    const pageErrors = await signInWatchingErrors(page, s.taAToken);
    // The token is not kept by the page: not in storage, and the cookie is HttpOnly.
    expect(await page.evaluate(() => JSON.stringify({ ...localStorage }) + JSON.stringify({ ...sessionStorage }) + document.cookie)).toBe('{}{}');

    await page.getByRole('link', { name: s.assignment.title }).click();
    await page.getByText('Add submissions').click();
    await page.locator('#upload-files').setInputFiles(batchFile);
    await page.getByRole('button', { name: 'Check files' }).click();
    await page.getByText('5 submissions can be stored; 0 problems found. Nothing is stored yet.').waitFor();
    expect((await call(api.app, 'GET', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/results`, s.taAToken, undefined, 200)).body.filter((r: { submissionId: number | null }) => r.submissionId !== null)).toHaveLength(0);
    await page.getByRole('button', { name: 'Store 5 submissions' }).click();
    await page.getByText('Stored 5 submissions; 0 problems left out.').waitFor();
    await page.getByText('Showing 6 of 6 students on the roster.').waitFor();
    await expect.poll(() => page.locator('tr.missing th').allTextContents()).toEqual(['S-006']);

    // A student with slips: the findings say they are likely causes; one is overridden with a reason.
    await page.locator('tr.has-errors a').first().click();
    await page.getByText('likely cause read from the numbers, for you to review: not a verdict').waitFor();
    // One card per cause; each of its places opens, for the TA, its path and the form to change its points.
    const finding = page.locator('li.finding.error').first();
    const code = (await finding.locator('.finding-head code').textContent())!;
    const place = finding.locator('details.place-detail').first();
    await place.locator('summary').click();
    await place.getByLabel('Points lost').fill('0');
    await place.getByLabel('Reason (kept in the audit trail)').fill('the slip is only in the summary table');
    await place.getByLabel('Show the reason to the student (on the feedback sheet)').check();
    await place.getByRole('button', { name: 'Save the change' }).click();
    await page.getByText(/changed [\d.]+ to 0 points lost: “the slip is only in the summary table” \(shown to the student\)/).waitFor();
    expect(await page.locator('li.finding.error').first().locator('.finding-head code').textContent()).toBe(code);

    // Release the section, after a confirmation that says how many.
    await page.getByRole('link', { name: /^Section A/ }).click();
    await page.getByRole('button', { name: 'Release results…' }).click();
    await page.getByText('Release 5 results of this section to the students?').waitFor();
    await page.getByRole('button', { name: 'Release 5 results' }).click();
    await page.getByText('5 results released to students.').waitFor();

    // An override after the release: the student still sees the released result until one more release.
    const results = `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/results`;
    const rows = (await call(api.app, 'GET', results, s.taAToken, undefined, 200)).body as Array<{ studentId: string; submissionId: number | null; errors: number; score: number }>;
    const later = rows.filter((r) => r.errors > 0).at(-1)!;
    const charged = (await call(api.app, 'GET', `/v1/submissions/${later.submissionId}`, s.taAToken, undefined, 200)).body.result.findings.find((f: { pointsLost: number; override?: unknown }) => f.pointsLost > 0 && !f.override);
    await call(api.app, 'POST', `/v1/submissions/${later.submissionId}/overrides`, s.taAToken, { findingId: charged.id, pointsLost: 0, reason: 'seen in the lab book' }, 201);
    await page.reload();
    await page.getByText(`1 student changed since release (they still see the released score): ${later.studentId}.`).waitFor();
    await expect.poll(() => page.locator('tr', { hasText: later.studentId }).locator('.released-score').textContent()).toBe(`released ${later.score}`);
    await page.getByRole('button', { name: 'Release results…' }).click();
    await page.getByText('Release 1 result of this section to the students? It has changed since release').waitFor();
    await page.getByRole('button', { name: 'Release 1 result' }).click();
    await page.getByText('1 result released to students.').waitFor();
    await expect.poll(() => page.locator('.changed-note').count()).toBe(0);

    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Gradebook (CSV)' }).click()]);
    // Saved under the name the service gives (course, section and assignment of the fixture, made safe by hand).
    expect(download.suggestedFilename()).toBe('Physical_chemistry_lab_invented-A-Acid_catalysis_invented-gradebook.csv');
    const csv = (await readFile((await download.path())!, 'utf8')).replace(/^\uFEFF/, '');
    const lines = csv.trim().split('\r\n');
    expect(lines[0]).toBe('student_id,score,max_score,status,causes_costing_points,warnings,infos,main_codes,assignment');
    expect(lines.slice(1).map((l) => l.split(',')[0]).sort()).toEqual([...ids, 'S-006']);
    expect(lines.find((l) => l.startsWith('S-006,'))).toBe(`S-006,,,not-submitted,0,0,0,,${s.assignment.title}`);

    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByLabel('Staff token').waitFor();
    expect((await page.request.get(`${origin}/v1/me`)).status()).toBe(401);
    expect(pageErrors).toEqual([]);
    await context.close();
  });

  it('lists an upload\'s problems by submission counted from 1 with its line, and malformed JSON with its line', async () => {
    const page = await browser.newPage();
    await signIn(page, s.taAToken);
    await page.getByRole('link', { name: s.assignment.title }).click();
    await page.getByText('Add submissions').click();
    const bad = JSON.parse(await readFile(batchFile, 'utf8')).slice(0, 2);
    bad[1].runs[0].timeUnit = 'fortnights';
    // Pretty-printed: the second submission starts on the line after the first one's closing brace, counted here.
    const text = JSON.stringify(bad, null, 2);
    const line = text.slice(0, text.indexOf('\n  {', 2) + 1).split('\n').length;
    const badFile = join(tmpdir(), `rateproof-bad-${process.pid}.json`);
    await writeFile(badFile, text);
    await page.locator('#upload-files').setInputFiles(badFile);
    await page.getByRole('button', { name: 'Check files' }).click();
    await expect.poll(() => page.locator('table.problems tbody td').first().textContent()).toBe(`submission 2, line ${line}`);
    const malformedFile = join(tmpdir(), `rateproof-malformed-${process.pid}.json`);
    await writeFile(malformedFile, '[\n  {"studentId": "S-001",\n  }\n]');
    await page.locator('#upload-files').setInputFiles(malformedFile);
    await page.getByRole('button', { name: 'Check files' }).click();
    await expect.poll(() => page.locator('.upload-outcome').textContent()).toMatch(/not valid JSON: .* at line 3 column 3/);
    await page.close();
  });

  it('can be used by keyboard alone: sign in, open a section, sort and filter', async () => {
    const page = await browser.newPage();
    await page.goto(origin);
    // The form appears once the page has asked who is signed in; Tab before that finds nothing.
    await page.getByLabel('Staff token').waitFor();
    await page.keyboard.press('Tab'); // the brand link
    await page.keyboard.press('Tab');
    expect(await page.evaluate(() => document.activeElement?.id)).toBe('token');
    await page.keyboard.type(s.taAToken);
    await page.keyboard.press('Enter');
    const link = page.getByRole('link', { name: s.assignment.title });
    await link.focus();
    await page.keyboard.press('Enter');
    const sortByScore = page.getByRole('button', { name: 'Score' });
    await sortByScore.focus();
    await page.keyboard.press('Enter');
    await expect.poll(() => page.locator('th[aria-sort=ascending]').textContent()).toContain('Score');
    await page.getByLabel('Show').focus();
    await page.keyboard.press('ArrowDown');
    expect(await page.getByLabel('Show').inputValue()).toBe('errors');
    await expect.poll(() => page.locator('tr.missing').count()).toBe(0);
    // Every control on the page has a name a screen reader can say.
    const unnamed = await page.evaluate(() =>
      [...document.querySelectorAll('input, select, textarea, button')].filter((el) => {
        const labelled = el.id && document.querySelector(`label[for="${el.id}"]`);
        return !labelled && !el.getAttribute('aria-label') && !(el.textContent ?? '').trim();
      }).length,
    );
    expect(unnamed).toBe(0);
    await page.close();
  });

  it('shows a hostile run label as text and runs nothing, and readings that look alike as a prompt', async () => {
    const [submission] = generateSection(seededRandom(9), generateAssignment(seededRandom(9), { fitModel: 'origin' }), ['S-006']).submissions;
    const copied = JSON.parse(await readFile(batchFile, 'utf8'))[0];
    submission.runs = structuredClone(copied.runs);
    submission.runs[0].label = '<img src=x onerror="window.__hostile=1">';
    const stored = await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, s.taAToken, [submission], 201);
    const page = await browser.newPage();
    await signIn(page, s.taAToken);
    await page.goto(`${origin}/#/section/${s.sectionA.id}/assignment/${s.assignment.id}/submission/${stored.body.stored[0].submissionId}`);
    // The label as text in the table's Run column (and the plot's key), quoted as the sheet quotes it.
    await page.locator('table.comparison td').getByText('“<img src=x onerror="window.__hostile=1">”', { exact: true }).waitFor();
    expect(await page.evaluate(() => (window as unknown as { __hostile?: number }).__hostile)).toBeUndefined();
    expect(await page.locator('main img').count()).toBe(0);
    // One student's result released on its own, after a question naming the student and version.
    await page.getByRole('button', { name: 'Release this result…' }).click();
    await page.getByText('Release this result (S-006, version 1) to the student?').waitFor();
    await page.getByRole('button', { name: 'Release to the student' }).click();
    await page.getByText(/^Released /).waitFor();
    await page.getByRole('link', { name: /^Section A/ }).click();
    await page.getByRole('heading', { name: 'Readings that look alike' }).waitFor();
    await page.getByText(new RegExp(`^${copied.studentId} and S-006: 4 runs with the same readings; \\d reported k written alike to every digit\\.$`)).waitFor();
    await page.close();
  });

  it("puts a signal on the student's sheet only when the TA chooses, and keeps the choice in a trail", async () => {
    const [submission] = generateSection(seededRandom(12), generateAssignment(seededRandom(12), { fitModel: 'origin' }), ['S-004']).submissions;
    submission.runs[0].temperatureC = 25;
    submission.runs[1].temperatureC = 27.5;
    const stored = await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, s.taAToken, [submission], 201);
    const id = stored.body.stored[0].submissionId;
    const page = await browser.newPage();
    await signIn(page, s.taAToken);
    await page.goto(`${origin}/#/section/${s.sectionA.id}/assignment/${s.assignment.id}/submission/${id}`);
    const signal = page.locator('li.signal', { hasText: 'temperature-spread' });
    await signal.getByText('Not on the student’s sheet.').waitFor();
    await signal.getByRole('button', { name: 'Show it on the sheet' }).click();
    await page.locator('li.signal.on-sheet').getByText(/: ta-a put it on the sheet$/).waitFor();
    const view = await call(api.app, 'GET', `/v1/submissions/${id}`, s.taAToken, undefined, 200);
    expect(view.body.result.signals).toEqual([expect.objectContaining({ code: 'temperature-spread', onSheet: true })]);
    await page.getByRole('button', { name: 'Take it off the sheet' }).click();
    await page.getByText(/: ta-a took it off the sheet$/).waitFor();
    // S-004 was released (the first test) before this new version: the student still sees that one.
    const shown = view.body.release as { version: number };
    expect(shown.version).toBeLessThan(view.body.version);
    await page.getByText(new RegExp(`^Version ${shown.version} released .*: the student still sees it until this version is released\\.$`)).waitFor();
    // The released version's page says so and offers no release.
    const history = (await call(api.app, 'GET', `/v1/sections/${s.sectionA.id}/students/S-004/history?assignmentId=${s.assignment.id}`, s.taAToken, undefined, 200)).body as Array<{ submissionId: number; version: number }>;
    const earlier = history.find((v) => v.version === shown.version)!;
    await page.goto(`${origin}/#/section/${s.sectionA.id}/assignment/${s.assignment.id}/submission/${earlier.submissionId}`);
    await page.getByText(/^Released /).waitFor();
    expect(await page.getByRole('button', { name: /^Release/ }).count()).toBe(0);
    await page.close();
  });

  it("lets an instructor edit settings (the schema's messages beside the fields), regrade with progress, add to a roster and manage a TA's tokens", async () => {
    const page = await browser.newPage();
    const pageErrors = await signInWatchingErrors(page, s.instructorToken);
    await page.getByRole('link', { name: 'Manage the course: assignments, rosters, staff' }).click();
    const panel = page.locator('article', { has: page.getByRole('heading', { name: s.assignment.title }) });
    await panel.getByText('Edit the settings').click();
    // The tolerance on k_obs, relative, shown in per cent.
    const k = panel.locator('fieldset', { has: page.locator('legend', { hasText: 'Tolerances' }) }).getByLabel('kobs', { exact: true });
    await k.fill('-5');
    await panel.getByRole('button', { name: 'Save the settings' }).click();
    const beside = panel.locator(`#${await k.getAttribute('id')}-message`);
    await expect.poll(() => beside.textContent()).toMatch(/>=\s*0/);
    await expect.poll(() => page.evaluate(() => document.activeElement?.id)).toBe(await k.getAttribute('id'));
    await k.fill('2');
    await panel.getByRole('button', { name: 'Save the settings' }).click();
    await panel.getByText(/^Settings version 2 saved/).waitFor();
    const stored = await call(api.app, 'GET', `/v1/assignments/${s.assignment.id}`, s.instructorToken, undefined, 200);
    expect(stored.body.settings.tolerances.k).toEqual({ relative: 0.02 });

    await panel.getByRole('button', { name: 'Regrade every submission' }).click();
    await panel.getByText(/^Regrade finished .+: (\d+) of \1 submissions regraded\.$/).waitFor();
    // Found again after a reload: the page asks the server for the assignment's latest regrade.
    await page.reload();
    await panel.getByText(/^Regrade finished .+: (\d+) of \1 submissions regraded\.$/).waitFor();

    const roster = page.locator('article', { has: page.getByRole('heading', { name: /^Section A:/ }) });
    await roster.getByLabel('Add students (pseudonymous ids, one per line)').fill('S-201\nS-202');
    await roster.getByRole('button', { name: 'Add to the roster' }).click();
    await roster.getByText('2 students added.').waitFor();
    await roster.getByText('S-202', { exact: true }).waitFor();
    await roster.getByLabel('Enrolment of S-202').selectOption('withdrawn');
    await roster.getByText(/^withdrawn by instructor-1, /).waitFor();
    const roster202 = (await call(api.app, 'GET', `/v1/sections/${s.sectionA.id}/roster`, s.instructorToken, undefined, 200)).body.find((r: { studentId: string }) => r.studentId === 'S-202');
    expect(roster202.history.map((e: { status: string }) => e.status)).toEqual(['enrolled', 'withdrawn']);
    // One id per line: a line holding three words is named and nothing is added; then the counts say
    // who was added and who was already there (the box's promise, common practice, no source).
    await roster.getByLabel('Add students (pseudonymous ids, one per line)').fill('S-203\nB 26 bad');
    await roster.getByRole('button', { name: 'Add to the roster' }).click();
    await roster.getByText(/Line 2: "B 26 bad" is not one student id/).waitFor();
    await roster.getByLabel('Add students (pseudonymous ids, one per line)').fill('S-203\nS-201\nS-202');
    await roster.getByRole('button', { name: 'Add to the roster' }).click();
    await roster.getByText('1 student added; 1 enrolled again; 1 already enrolled.').waitFor();

    await page.getByLabel('Handle (letters, digits, dot, underscore or hyphen)').fill('ta-new');
    await page.getByLabel('Section A').check();
    await page.getByRole('button', { name: 'Add', exact: true }).click();
    const row = page.locator('tr', { has: page.getByRole('rowheader', { name: 'ta-new' }) });
    await row.waitFor();
    await row.getByRole('button', { name: 'Issue a token' }).click();
    const token = (await page.locator('code.token').textContent())!;
    expect(token).toMatch(/^rp_/);
    await row.getByRole('button', { name: 'Revoke tokens…' }).click();
    await page.getByRole('button', { name: 'Revoke every token of ta-new' }).click();
    await page.getByText('1 token of ta-new revoked; their sessions are ended.').waitFor();
    expect((await call(api.app, 'GET', '/v1/me', token)).status).toBe(401);
    expect(pageErrors).toEqual([]);
    await page.close();
  });

  it('lets an instructor create an assignment of the second kind and edit its settings in its form, with the messages by field', async () => {
    const page = await browser.newPage();
    const pageErrors = await signInWatchingErrors(page, s.instructorToken);
    await page.getByRole('link', { name: 'Manage the course: assignments, rosters, staff' }).click();
    await page.getByText('New assignment').click();
    await page.getByLabel('Kind of experiment').selectOption('temperature-dependence');
    await page.getByLabel('Title').fill('Activation energy (invented)');
    await page.getByRole('button', { name: 'Create the assignment' }).click();
    const panel = page.locator('article', { has: page.getByRole('heading', { name: 'Activation energy (invented)' }) });
    await panel.waitFor();
    await panel.getByText('Edit the settings').click();
    // The schema's defaults, as the form shows them: E_a within 2 % (from the kind's settings schema).
    const tolerances = panel.locator('fieldset', { has: page.locator('legend', { hasText: 'Tolerances' }) });
    const ea = tolerances.getByLabel('Ea', { exact: true });
    expect(await ea.inputValue()).toBe('2');
    await ea.fill('-1');
    await panel.getByRole('button', { name: 'Save the settings' }).click();
    await panel.getByText('The settings were not saved: 1 field to correct.').waitFor();
    expect(await tolerances.locator('.form-error').filter({ hasText: /\S/ }).count()).toBe(1);
    await ea.fill('2');
    await panel.getByLabel('ln k against 1/T').selectOption('weighted');
    await panel.getByRole('button', { name: 'Save the settings' }).click();
    await panel.getByText(/^Settings version 2 saved/).waitFor();
    expect(pageErrors).toEqual([]);
    await page.close();
  });

  it('shows a TA of another section nothing of this one', async () => {
    const page = await browser.newPage();
    await signIn(page, s.taBToken);
    await page.getByRole('heading', { name: 'Your sections' }).waitFor();
    expect(await page.getByText('Section A', { exact: true }).count()).toBe(0);
    // Typing the address of section A's results leads back to their own sections.
    await page.goto(`${origin}/#/section/${s.sectionA.id}/assignment/${s.assignment.id}`);
    await page.getByRole('heading', { name: 'Your sections' }).waitFor();
    expect((await page.request.get(`${origin}/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/results`)).status()).toBe(404);
    await page.close();
  });
  it('draws the refit line of a run timed in seconds through its points, and the student’s line beside it', async () => {
    const [submission] = generateSection(seededRandom(21), generateAssignment(seededRandom(21), { fitModel: 'origin' }), ['S-006']).submissions;
    // The same readings timed in seconds; k stays reported per minute, the instructor's unit.
    for (const run of submission.runs) {
      run.timeUnit = 's';
      run.readings = run.readings.map(([t, x]: [number, number]) => [t * 60, x]);
    }
    // One run's k made 1.5 times too large: a finding, and a dashed line 1.5 times as steep.
    const slippedK = submission.runs[1].reported!.k!;
    slippedK.value = String(Number(slippedK.value) * 1.5);
    const stored = await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, s.taAToken, [submission], 201);
    const page = await browser.newPage();
    await signIn(page, s.taAToken);
    await page.goto(`${origin}/#/section/${s.sectionA.id}/assignment/${s.assignment.id}/submission/${stored.body.stored[0].submissionId}`);
    await page.locator('svg.plot g.group').first().waitFor();
    expect(await page.locator('svg.plot .axes text.label').first().textContent()).toBe('t / s');
    // The first plot is ln F against t, one group (colour) per run: its points (discs, or diamonds for
    // the student's own ln F column, placed by a translation) and lines.
    const runs = await page.locator('svg.plot').first().locator('g.group').evaluateAll((groups) =>
      groups.map((g) => {
        const line = (cls: string) => {
          const l = g.querySelector(`line.${cls}`);
          return l && ['x1', 'y1', 'x2', 'y2'].map((a) => Number(l.getAttribute(a)));
        };
        const centre = (p: Element) => (p.tagName === 'circle' ? [Number(p.getAttribute('cx')), Number(p.getAttribute('cy'))] : /translate\(([-\d.e]+) ([-\d.e]+)\)/.exec(p.getAttribute('transform')!)!.slice(1).map(Number));
        return { label: g.getAttribute('data-group'), points: [...g.querySelectorAll('.point')].map(centre), refit: line('refit-line'), student: line('student-line') };
      }),
    );
    expect(runs).toHaveLength(submission.runs.length);
    // Each point within 4 px (of a 236 px high data area) of the refit line, read from the SVG itself:
    // the line at the point's x, by linear interpolation between the line's ends.
    const yAt = ([x1, y1, x2, y2]: number[], x: number) => y1 + ((y2 - y1) * (x - x1)) / (x2 - x1);
    for (const run of runs) {
      expect(run.points.length).toBeGreaterThan(3);
      for (const [x, y] of run.points) expect(Math.abs(yAt(run.refit!, x) - y), `run ${run.label} at x = ${x}`).toBeLessThan(4);
    }
    // The run with the slip has the student's line, 1.5 times as steep as ours (both through the origin).
    const slipped = runs[1];
    const steepness = ([x1, y1, x2, y2]: number[]) => (y2 - y1) / (x2 - x1);
    expect(steepness(slipped.student!) / steepness(slipped.refit!)).toBeCloseTo(1.5, 2);
    // The legend lies below the data area, never over the points.
    const [legendTop, areaBottom] = await page.locator('svg.plot').first().evaluate((svg) => [
      Math.min(...[...svg.querySelectorAll('.legend text')].map((t) => (t as SVGGraphicsElement).getBBox().y)),
      Math.max(...[...svg.querySelectorAll('clipPath rect')].map((r) => Number(r.getAttribute('y')) + Number(r.getAttribute('height')))),
    ]);
    expect(legendTop).toBeGreaterThan(areaBottom);
    await page.close();
  });
});
