import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openApi, type Api } from '../support/api-fixture.ts';

/**
 * /docs (swagger-ui) is served under a Content-Security-Policy of its own: its scripts come from this
 * origin or are inline ones whose SHA-256 the policy names (CSP Level 3 hash sources), and no other
 * script may run. The hashes are computed here with node:crypto, apart from the plugin that wrote them.
 */
describe('/docs under its own Content-Security-Policy', () => {
  let api: Api;
  beforeAll(async () => {
    api = await openApi('pglite');
  }, 60_000);
  afterAll(async () => api?.close());

  const policyOf = (header: unknown) => new Map(String(header).split(';').map((d) => d.trim()).filter(Boolean).map((d) => [d.split(/\s+/)[0], d.split(/\s+/).slice(1)]));

  it('the page and each script it loads are served under a policy allowing this origin\'s scripts and nothing inline unhashed', async () => {
    // Followed as a browser would: /docs may redirect to the page itself.
    let pageUrl = '/docs';
    let page = await api.app.inject({ method: 'GET', url: pageUrl });
    for (let hops = 0; page.statusCode >= 300 && page.statusCode < 400 && hops < 3; hops++) {
      pageUrl = new URL(String(page.headers.location), new URL(pageUrl, 'http://x')).pathname;
      page = await api.app.inject({ method: 'GET', url: pageUrl });
    }
    expect(page.statusCode, page.body).toBe(200);
    const policy = policyOf(page.headers['content-security-policy']);
    expect(policy.get('script-src')).toContain("'self'");
    expect(policy.get('script-src')).not.toContain("'unsafe-inline'");
    expect(policy.get('object-src')).toEqual(["'none'"]);
    // Served over plain HTTP on a campus network as well: no upgrade to an HTTPS port it may not have.
    expect(policy.has('upgrade-insecure-requests')).toBe(false);

    const scripts = [...page.body.matchAll(/<script([^>]*)>([\s\S]*?)<\/script>/g)];
    expect(scripts.length).toBeGreaterThan(0);
    for (const [, attributes, inline] of scripts) {
      const src = /src="([^"]+)"/.exec(attributes)?.[1];
      if (src) {
        const script = await api.app.inject({ method: 'GET', url: new URL(src, new URL(pageUrl, 'http://x')).pathname });
        expect(script.statusCode, src).toBe(200);
        expect(String(script.headers['content-type']), src).toMatch(/javascript/);
      } else if (inline.trim()) {
        const hash = `'sha256-${createHash('sha256').update(inline).digest('base64')}'`;
        expect(policy.get('script-src'), 'an inline script').toContain(hash);
      }
    }
  });

  it('the workspace keeps its own, stricter policy', async () => {
    const page = await api.app.inject({ method: 'GET', url: '/' });
    expect(policyOf(page.headers['content-security-policy']).get('script-src')).toEqual(["'self'"]);
  });
});
