import type { FastifyInstance } from 'fastify';
import { buildApp } from '../../server/app.ts';
import { testConfig } from '../support/api-fixture.ts';
import { chromiumPresent, CHROMIUM_ABSENT, launchChromium } from '../support/chromium.ts';
import { openTestDatabase } from '../support/test-database.ts';
import { cleanSubmissions, ids, seed } from './bulk-submit.ts';

/**
 * The workspace's section view for 500 students (the invented bulk section), in headless Chromium on
 * the local PostgreSQL server: from opening the address to the table holding every row, five times
 * in a fresh page each. Printed, never asserted; the goal is under a second.
 */
const LOADS = 5;

export async function benchWorkspaceView(): Promise<void> {
  if (!chromiumPresent) {
    console.log(`workspace view: not measured, ${CHROMIUM_ABSENT}`);
    return;
  }
  const database = await openTestDatabase('postgres');
  let app: FastifyInstance | undefined;
  const browser = await launchChromium();
  try {
    app = await buildApp({ config: testConfig, store: database.store });
    const { url, token } = await seed(app);
    const stored = await app.inject({ method: 'POST', url, headers: { authorization: `Bearer ${token}` }, payload: cleanSubmissions() });
    if (stored.statusCode !== 201) throw new Error(`workspace bench: storing the section answered ${stored.statusCode}`);
    const origin = await app.listen({ port: 0, host: '127.0.0.1' });
    const context = await browser.newContext();
    await context.request.post(`${origin}/v1/session`, { data: { token } });
    const [, sectionId, assignmentId] = /sections\/(\d+)\/assignments\/(\d+)/.exec(url)!;
    const times: number[] = [];
    for (let i = 0; i < LOADS; i++) {
      const page = await context.newPage();
      const start = performance.now();
      await page.goto(`${origin}/#/section/${sectionId}/assignment/${assignmentId}`);
      await page.locator('table.results tbody tr').nth(ids.length - 1).waitFor();
      times.push(performance.now() - start);
      await page.close();
    }
    times.sort((a, b) => a - b);
    console.log(
      `workspace view: a ${ids.length}-student section's results ready in ${(times[Math.floor(LOADS / 2)] / 1000).toFixed(2)} s median, ` +
        `${(times[LOADS - 1] / 1000).toFixed(2)} s slowest of ${LOADS} loads (headless Chromium, page load to every row drawn; target < 1 s)`,
    );
  } finally {
    await browser.close();
    await app?.close();
    await database.close();
  }
}
