import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrors, errorCatalogue, errorCodes } from '../../server/errors.ts';
import { routes } from '../../server/routes/index.ts';
import { openApi, type Api } from '../support/api-fixture.ts';

/**
 * The error codes are declared once (server/errors.ts) and the OpenAPI document lists them: every
 * route's error responses carry, at every status a code has, the enum of that status's codes; and every code
 * the server's source throws is one of the enum. The source is read as text, apart from the
 * compiler's view of it, so a code built some other way than the errors module would show here.
 */
type Schema = { properties?: Record<string, Schema>; enum?: string[]; $ref?: string };
type Operation = { responses: Record<string, { content?: Record<string, { schema: Schema }> }> };

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? sourceFiles(join(dir, e.name)) : e.name.endsWith('.ts') ? [join(dir, e.name)] : []));
}

describe('error codes, declared once and documented', () => {
  let api: Api;
  let doc: { paths: Record<string, Record<string, Operation>> };
  beforeAll(async () => {
    api = await openApi('pglite');
    doc = (await api.app.inject({ method: 'GET', url: '/openapi.json' })).json();
  }, 60_000);
  afterAll(async () => api?.close());

  it('the catalogue lists each code once, with its status and message', () => {
    expect(errorCatalogue.map((e) => e.code)).toEqual(Object.keys(apiErrors));
    expect(new Set(errorCodes).size).toBe(errorCodes.length);
    for (const e of errorCatalogue) expect(e.status, e.code).toBeGreaterThanOrEqual(400);
  });

  it('every route of the table is in the OpenAPI document, and each error response lists the codes of its status', () => {
    const statuses = [...new Set(errorCatalogue.map((e) => String(e.status)))];
    let checked = 0;
    for (const route of routes) {
      const path = route.url.replace(/:(\w+)/g, '{$1}');
      const operation = doc.paths[path]?.[route.method.toLowerCase()];
      expect(operation, `${route.method} ${route.url}`).toBeDefined();
      for (const status of statuses) {
        const schema = operation.responses[status]?.content?.['application/json']?.schema;
        const ofStatus = errorCatalogue.filter((e) => String(e.status) === status).map((e) => e.code);
        expect(schema?.properties?.error?.properties?.code?.enum, `${route.method} ${route.url} ${status}`).toEqual(ofStatus);
        checked++;
      }
    }
    expect(checked).toBe(routes.length * statuses.length);
  });

  it('every code the server throws is in the enum', () => {
    const thrown = new Set<string>();
    for (const file of sourceFiles(join(import.meta.dirname, '../../server'))) {
      for (const m of readFileSync(file, 'utf8').matchAll(/new ApiError\(\s*'([^']+)'/g)) thrown.add(m[1]);
    }
    // The usual ones at least, so that the pattern above is known to find codes.
    expect([...thrown]).toEqual(expect.arrayContaining(['not-found', 'invalid-input', 'forbidden', 'unauthenticated', 'conflict']));
    expect([...thrown].filter((code) => !(errorCodes as string[]).includes(code))).toEqual([]);
  });
});
