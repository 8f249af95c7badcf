import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildApp } from '../../server/app.ts';
import { runDemo } from '../../server/demo/run-demo.ts';
import { openStore } from '../../server/store/connection.ts';
import { launchChromium } from '../support/chromium.ts';

/**
 * `npm run screenshots`: the README's pictures of the workspace, taken from the demo data (an
 * invented section) at 1280 px wide, and the results at 390 px (a phone), into docs/.
 */
const out = await mkdtemp(join(tmpdir(), 'rateproof-shots-'));
let token = '';
await runDemo(out, (line) => {
  const m = /^TA token .*: (\S+)$/.exec(line);
  if (m) token = m[1];
});
const store = openStore({ dataDir: join(out, 'database') });
const app = await buildApp({ config: { dataDir: join(out, 'database'), host: '127.0.0.1', port: 0, bodyLimitBytes: 5 * 1024 * 1024, logLevel: 'silent' }, store });
const origin = await app.listen({ port: 0, host: '127.0.0.1' });
const browser = await launchChromium();
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
} finally {
  await browser.close();
  await app.close();
  await store.close();
  await rm(out, { recursive: true, force: true });
}
