import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openApi, seedCourse, type Api, type Seed } from '../support/api-fixture.ts';
import { CHROMIUM_ABSENT, chromiumPresent, launchChromium } from '../support/chromium.ts';
import { PLATFORM_ROLES, TestPlatform } from '../support/lti-platform/test-platform.ts';
import { placeOnSectionA, registerPlatform } from '../support/lti-platform/tool-fixture.ts';

if (!chromiumPresent) console.warn(CHROMIUM_ABSENT);

/**
 * A launch in a real browser, the whole way: the test platform (at 127.0.0.1) initiates login by a
 * form POST, the tool (at localhost: another site) redirects to the platform, the platform form-posts
 * the id_token back across sites, and the tool's page carries the launch to a same-site step where
 * the SameSite=Strict session cookie is set. That the student's and instructor's sessions then work
 * shows the cookie reasoning of docs/lti.md holds in Chromium.
 */
describe.skipIf(!chromiumPresent)('an LTI launch in a browser', () => {
  let api: Api;
  let s: Seed;
  let browser: Browser;
  let platform: TestPlatform;
  let tool = '';

  beforeAll(async () => {
    api = await openApi();
    s = await seedCourse(api.app);
    const address = await api.app.listen({ port: 0, host: '127.0.0.1' });
    tool = address.replace('127.0.0.1', 'localhost');
    platform = await TestPlatform.start();
    await placeOnSectionA(api.app, s, platform, await registerPlatform(api.app, platform, s.course.id));
    platform.users.set('sub-browser-learner', { sub: 'sub-browser-learner', name: 'Fay Lindqvist', roles: PLATFORM_ROLES.learner });
    platform.users.set('sub-browser-instructor', { sub: 'sub-browser-instructor', name: 'Gus Hartwell', roles: PLATFORM_ROLES.instructor });
    platform.toolKeySetUrl = `${address}/v1/lti/jwks`;
    browser = await launchChromium();
  }, 60_000);
  afterAll(async () => {
    await browser?.close();
    await platform?.close();
    await api?.close();
  });

  async function launch(sub: string, landing: string) {
    const context = await browser.newContext();
    const page = await context.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(`${platform.base}/start?sub=${sub}&tool=${encodeURIComponent(tool)}`);
    await page.waitForURL(`${tool}${landing}`, { timeout: 15_000 });
    await page.waitForLoadState('load');
    const cookies = await context.cookies(tool);
    const answer = async (path: string) => page.evaluate(async (p) => (await fetch(p, { credentials: 'same-origin' })).json(), path);
    return { context, cookies, answer, errors };
  }

  it('a learner ends on the tool with a Strict session cookie, and their own pages answer', async () => {
    const { context, cookies, answer, errors } = await launch('sub-browser-learner', '/student');
    expect(cookies.map((c) => [c.name, c.sameSite, c.httpOnly])).toEqual([['rateproof_session', 'Strict', true]]);
    expect(await answer('/v1/session')).toEqual({ signedIn: true, as: 'student' });
    expect((await answer('/v1/student/me')).section.id).toBe(s.sectionA.id);
    expect(errors).toEqual([]);
    await context.close();
  });

  it('an instructor ends in the staff workspace as an instructor of the course', async () => {
    const { context, answer } = await launch('sub-browser-instructor', '/');
    expect(await answer('/v1/session')).toEqual({ signedIn: true, as: 'staff' });
    expect((await answer('/v1/me')).role).toBe('instructor');
    await context.close();
  });

  it('an instructor deep-links an assignment and section: our signed response is form-posted across sites to the platform, which verifies it (Deep Linking 2.0, 4.5)', async () => {
    platform.nextMessage = 'deep-linking';
    try {
      const context = await browser.newContext();
      const page = await context.newPage();
      await page.goto(`${platform.base}/start?sub=sub-browser-instructor&tool=${encodeURIComponent(tool)}`);
      await page.waitForSelector('select[name="sectionId"]', { timeout: 15_000 });
      // The choice page makes no session (common practice, no source: a deep linking request only places).
      expect(await context.cookies(tool)).toEqual([]);
      await page.selectOption('select[name="sectionId"]', String(s.sectionB.id));
      await page.click('button[type="submit"]');
      // The response page's own script posts the JWT to the platform's return URL; its policy allows that form target.
      await page.waitForURL(`${platform.base}/deep-link-return`, { timeout: 15_000 });
      expect(await page.textContent('body')).toContain('Activity placed.');
      expect(platform.deepLinked).toHaveLength(1);
      expect(platform.deepLinked[0].custom).toEqual({ rateproof_assignment_id: String(s.assignment.id), rateproof_section_id: String(s.sectionB.id) });
      await context.close();
    } finally {
      platform.nextMessage = 'resource-link';
    }
  });
});
