import { mkdir, readFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { kindDemos, kindFor } from '../../kinds/registry.ts';
import type { KindDescription } from '../../schemas/api/kinds.ts';
import { generateSection } from '../../kinds/first-order-catalysis/demo/generated-section.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { generateAssignment } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';
import { call, openApi, seedCourse, type Api, type Seed } from '../support/api-fixture.ts';
import { CHROMIUM_ABSENT, chromiumPresent, launchChromium } from '../support/chromium.ts';
import { signIn, watchProblems } from '../support/workspace-page.ts';

if (!chromiumPresent) console.warn(CHROMIUM_ABSENT);

/** Where the pictures of the settings forms go, to be looked at by a person. */
const SHOTS = process.env.SCREENSHOT_DIR ?? join(tmpdir(), 'rateproof-kind-shots');
/** A phone held upright and a laptop screen (common practice, no source). */
const WIDTHS = [390, 1280];

/**
 * What a person leaves as the form first shows it, where the kind's settings schema has no default
 * (hand-written: the first option of the fit model's select).
 */
const LEFT_AS_SHOWN: Record<string, Record<string, unknown>> = { 'first-order-catalysis': { fitModel: 'origin' }, 'reaction-order': { signal: { type: 'concentration', unit: 'M' } } };

/** A batch of invented submissions of each kind, for students of the roster. */
async function batchOf(kind: string): Promise<unknown[]> {
  if (kind === 'first-order-catalysis') return generateSection(seededRandom(7), generateAssignment(seededRandom(7), { fitModel: 'origin' }), ['S-001', 'S-002']).submissions;
  if (kind === 'reaction-order') return (await kindDemos()).find((d) => d.kind === kind)!.demo.section(['S-001', 'S-002']).submissions;
  const example = JSON.parse(await readFile(new URL(`../../docs/examples/${kind}/submissions.json`, import.meta.url), 'utf8')) as Array<{ studentId: string }>;
  return example.slice(0, 2).map((x, i) => ({ ...x, studentId: `S-00${i + 1}` }));
}

/**
 * Every kind the service describes, through the page that names none: an instructor creates an
 * assignment of it with the form's defaults, which the service's settings validation takes as the
 * kind's own defaults; its section's upload panel asks for the kind's files; a student of it opens.
 */
describe.skipIf(!chromiumPresent)('every kind in the workspace', () => {
  let api: Api;
  let s: Seed;
  let browser: Browser;
  let origin: string;
  let kinds: KindDescription[];

  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
    origin = await api.app.listen({ port: 0, host: '127.0.0.1' });
    kinds = (await call(api.app, 'GET', '/v1/kinds', s.instructorToken, undefined, 200)).body as KindDescription[];
    await mkdir(SHOTS, { recursive: true });
    browser = await launchChromium();
  }, 120_000);
  afterAll(async () => {
    await browser?.close();
    await api?.close();
  });

  it('lists every kind the service knows', () => {
    expect(kinds.map((k) => k.kind)).toEqual(['first-order-catalysis', 'temperature-dependence', 'reaction-order']);
  });

  it.each(['first-order-catalysis', 'temperature-dependence', 'reaction-order'])('creates an assignment of %s from its form’s defaults, and opens a student of it', async (kind) => {
    const description = kinds.find((k) => k.kind === kind)!;
    const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
    const problems = watchProblems(page);
    await signIn(page, origin, s.instructorToken);
    await page.getByRole('link', { name: 'Manage the course: assignments, rosters, staff' }).click();
    await page.getByText('New assignment').click();
    await page.getByLabel('Kind of experiment').selectOption(kind);
    const title = `Every kind: ${kind}`;
    await page.getByLabel('Title').fill(title);
    const created = page.waitForResponse((r) => r.request().method() === 'POST' && /\/v1\/courses\/\d+\/assignments$/.test(r.url()));
    await page.getByRole('button', { name: 'Create the assignment' }).click();
    const answer = await created;
    expect(answer.status()).toBe(201);
    const assignment = (await answer.json()) as { id: number; settings: unknown };
    // The form's defaults are the schema's: the settings stored equal what the schema makes of the kind alone.
    expect(assignment.settings).toEqual(kindFor(kind)!.settingsSchema.parse({ kind, ...LEFT_AS_SHOWN[kind] }));

    const stored = (await call(api.app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${assignment.id}/submissions`, s.instructorToken, await batchOf(kind), 201)).body.stored as Array<{ submissionId: number }>;
    await page.goto(`${origin}/#/section/${s.sectionA.id}/assignment/${assignment.id}`);
    await page.getByText('Add submissions').click();
    for (const file of description.upload.csv ?? []) await page.locator('.csv-columns').getByText(`${file.name}.csv`, { exact: true }).waitFor();
    await page.locator('details.upload').screenshot({ path: join(SHOTS, `upload-${kind}.png`) });
    await page.goto(`${origin}/#/section/${s.sectionA.id}/assignment/${assignment.id}/submission/${stored[0].submissionId}`);
    await page.locator('svg.plot').first().waitFor();
    expect(await page.locator('table.comparison tbody tr').count()).toBeGreaterThan(0);
    expect(problems).toEqual([]);
    await page.close();
  });

  it.each(WIDTHS.flatMap((w) => [['first-order-catalysis', w], ['temperature-dependence', w], ['reaction-order', w]] as const))('draws the settings form of %s at %i px without sideways scroll', async (kind, width) => {
    const page = await browser.newPage({ viewport: { width, height: 900 } });
    const problems = watchProblems(page);
    await signIn(page, origin, s.instructorToken);
    await page.getByRole('link', { name: 'Manage the course: assignments, rosters, staff' }).click();
    await page.getByText('New assignment').click();
    await page.getByLabel('Kind of experiment').selectOption(kind);
    const form = page.locator('details.panel[open] form.settings');
    await form.waitFor();
    await form.screenshot({ path: join(SHOTS, `settings-${kind}-${width}.png`) });
    const wide = await page.evaluate(() => [...document.querySelectorAll('form.settings *')].filter((el) => el.getBoundingClientRect().right > document.documentElement.clientWidth).map((el) => `${el.tagName}.${el.className}#${el.id} ${Math.round(el.getBoundingClientRect().right)}`).slice(0, 8));
    expect(wide).toEqual([]);
    expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(0);
    expect(problems).toEqual([]);
    await page.close();
  });
});
