import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildApp } from '../../server/app.ts';
import { runDemo } from '../../server/demo/run-demo.ts';
import { openStore } from '../../server/store/connection.ts';
import { launchChromium } from '../support/chromium.ts';
import { exampleRowsOf } from '../support/example-csv.ts';
import { pasteCells } from '../support/workspace-page.ts';

/**
 * `npm run screenshots`: the README's pictures of the workspace, taken from the demo data (an
 * invented section) at 1280 px wide, and the results at 390 px (a phone), into docs/; then the
 * students' own pages (docs/students.md): a demo student hands in through the grid, and reads their
 * feedback once the TA releases it.
 */
const out = await mkdtemp(join(tmpdir(), 'rateproof-shots-'));
let token = '';
let instructorToken = '';
await runDemo(out, (line) => {
  const m = /^(TA|instructor) token .*: (\S+)$/.exec(line);
  if (m?.[1] === 'TA') token = m[2];
  if (m?.[1] === 'instructor') instructorToken = m[2];
});
const store = openStore({ dataDir: join(out, 'database') });
const app = await buildApp({ config: { dataDir: join(out, 'database'), host: '127.0.0.1', port: 0, bodyLimitBytes: 5 * 1024 * 1024, logLevel: 'silent' }, store });
const origin = await app.listen({ port: 0, host: '127.0.0.1' });
const browser = await launchChromium();

/** The service's answer to a staff member's request, as JSON. */
async function staffCall(origin: string, method: 'GET' | 'POST', url: string, bearer: string, body?: unknown) {
  const res = await fetch(`${origin}${url}`, { method, headers: { authorization: `Bearer ${bearer}`, ...(body === undefined ? {} : { 'content-type': 'application/json' }) }, body: body === undefined ? undefined : JSON.stringify(body) });
  if (!res.ok) throw new Error(`${method} ${url}: ${res.status} ${await res.text()}`);
  return res.json();
}

/** A demo student with a code from the instructor hands in a new version through the grid; the TA releases it; the student reads it. */
async function studentPages(origin: string) {
  const me = await staffCall(origin, 'GET', '/v1/me', instructorToken);
  const course = me.courses[0];
  const section = course.sections[0];
  const assignment = course.assignments.find((a: { title: string }) => /Acid-catalysed/.test(a.title));
  const { codes } = await staffCall(origin, 'POST', `/v1/sections/${section.id}/access-codes`, instructorToken, { studentIds: ['B-01'] });
  const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
  await page.goto(`${origin}/student`);
  await page.getByLabel('Access code').fill(codes[0].code);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('link', { name: 'Hand in a new version' }).first().click();
  await pasteCells(page, '#grid-readings input[data-row="0"][data-col="0"]', await exampleRowsOf('readings.csv', 'B-01'));
  await pasteCells(page, '#grid-reported input[data-row="0"][data-col="0"]', await exampleRowsOf('reported.csv', 'B-01'));
  await page.getByRole('button', { name: 'Hand in these values' }).click();
  await page.locator('.form-check').waitFor();
  await page.locator('.form-check').scrollIntoViewIfNeeded();
  await page.screenshot({ path: 'docs/students-hand-in.png' });
  await staffCall(origin, 'POST', `/v1/sections/${section.id}/assignments/${assignment.id}/release`, token);
  await page.goto(`${origin}/student#/assignment/${assignment.id}/feedback`);
  await page.locator('li.finding, p.score').first().waitFor();
  await page.screenshot({ path: 'docs/students-feedback.png', fullPage: true });
  await page.setViewportSize({ width: 390, height: 844 });
  await page.goto(`${origin}/student#/`);
  await page.getByText(/first read/).first().waitFor();
  await page.screenshot({ path: 'docs/students-phone.png' });
  await page.close();
}

try {
  const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
  await page.goto(origin);
  await page.getByLabel('Staff token').fill(token);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('link', { name: /Acid-catalysed/ }).click();
  await page.locator('table.results tbody tr').first().waitFor();
  await page.screenshot({ path: 'docs/workspace-section.png' });
  await page.locator('tr.has-errors a').nth(1).click();
  await page.locator('li.finding').first().waitFor();
  await page.screenshot({ path: 'docs/workspace-student.png', fullPage: true });
  // A student whose runs carry a signal for review, put on the sheet by the TA.
  await page.goBack();
  await page.getByRole('link', { name: 'B-08', exact: true }).click();
  await page.getByRole('button', { name: 'Show it on the sheet' }).click();
  await page.getByText(/put it on the sheet$/).waitFor();
  await page.locator('section.signals').screenshot({ path: 'docs/workspace-signal.png' });
  // The same results on a phone held upright: one card per student.
  await page.setViewportSize({ width: 390, height: 844 });
  await page.goBack();
  await page.locator('table.results tbody tr').first().scrollIntoViewIfNeeded();
  await page.screenshot({ path: 'docs/workspace-phone.png' });
  process.stdout.write('wrote docs/workspace-section.png, docs/workspace-student.png, docs/workspace-signal.png and docs/workspace-phone.png\n');
  await studentPages(origin);
  process.stdout.write('wrote docs/students-hand-in.png, docs/students-feedback.png and docs/students-phone.png\n');
} finally {
  await browser.close();
  await app.close();
  await store.close();
  await rm(out, { recursive: true, force: true });
}
