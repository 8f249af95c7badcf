import { mkdir } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { registerKindModule } from '../../kinds/registry.ts';
import { call, openApi, seedCourse, type Api, type Seed } from '../support/api-fixture.ts';
import { CHROMIUM_ABSENT, chromiumPresent, launchChromium } from '../support/chromium.ts';
import { SECTION } from '../support/decay-runs/data.ts';
import { DECAY_RUNS } from '../support/decay-runs/schemas.ts';
import { signIn, watchProblems } from '../support/workspace-page.ts';

if (!chromiumPresent) console.warn(CHROMIUM_ABSENT);

await registerKindModule(new URL('../support/decay-runs/index.ts', import.meta.url));

/** Where the pictures go, to be looked at by a person. */
const SHOTS = process.env.SCREENSHOT_DIR ?? join(tmpdir(), 'rateproof-kind-shots');

/**
 * The page with a kind it has never seen (the test kind: runs of readings without a catalyst): an
 * instructor makes an assignment of it from its form, and a student of it opens with its table and plot.
 */
describe.skipIf(!chromiumPresent)('the workspace with the test kind', () => {
  let api: Api;
  let s: Seed;
  let browser: Browser;
  let origin: string;

  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
    origin = await api.app.listen({ port: 0, host: '127.0.0.1' });
    await mkdir(SHOTS, { recursive: true });
    browser = await launchChromium();
  }, 120_000);
  afterAll(async () => {
    await browser?.close();
    await api?.close();
  });

  it('creates an assignment of it from its form and opens a student of it, at 1280 and 390 px', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
    const problems = watchProblems(page);
    await signIn(page, origin, s.instructorToken);
    await page.getByRole('link', { name: 'Manage the course: assignments, rosters, staff' }).click();
    await page.getByText('New assignment').click();
    await page.getByLabel('Kind of experiment').selectOption(DECAY_RUNS);
    await page.getByLabel('Readings a run should have').fill('5');
    await page.getByLabel('Title').fill('Decay runs (invented)');
    const created = page.waitForResponse((r) => r.request().method() === 'POST' && /\/v1\/courses\/\d+\/assignments$/.test(r.url()));
    await page.getByRole('button', { name: 'Create the assignment' }).click();
    const answer = await created;
    expect(answer.status()).toBe(201);
    const assignment = (await answer.json()) as { id: number; settings: unknown };
    expect(assignment.settings).toEqual({ kind: DECAY_RUNS, tolerance: 0.03, pointsPerRun: 2, minReadings: 5, late: { policy: 'grade', points: 0 } });

    const stored = (await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${assignment.id}/submissions`, s.instructorToken, SECTION, 201)).body.stored as Array<{ submissionId: number }>;
    await page.goto(`${origin}/#/section/${s.sectionA.id}/assignment/${assignment.id}`);
    await page.getByText('Add submissions').click();
    await page.locator('.csv-columns').getByText('readings.csv', { exact: true }).waitFor();

    // S-002: the sign kept in run A, log10 F in run B.
    await page.goto(`${origin}/#/section/${s.sectionA.id}/assignment/${assignment.id}/submission/${stored[1].submissionId}`);
    await page.locator('svg.plot').first().waitFor();
    const rows = await page.locator('table.comparison tbody tr').allInnerTexts();
    expect(rows.map((r) => r.split(/\s/)[0])).toEqual(['A', 'B']);
    await expect.poll(() => page.getByText('sign-flipped').count()).toBeGreaterThan(0);
    await page.screenshot({ path: join(SHOTS, 'test-kind-student-1280.png'), fullPage: true });
    await page.setViewportSize({ width: 390, height: 844 });
    await page.screenshot({ path: join(SHOTS, 'test-kind-student-390.png'), fullPage: true });
    expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(0);
    expect(problems).toEqual([]);
    await page.close();
  });
});
