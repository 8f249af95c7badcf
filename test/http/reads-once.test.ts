import type { KyselyPlugin, OperationNode, PluginTransformQueryArgs, PluginTransformResultArgs, QueryResult, RootOperationNode, UnknownRow } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../server/app.ts';
import type { FastifyInstance } from 'fastify';
import { bearer, call, seedCourse, submissionsFor, testConfig, type Seed } from '../support/api-fixture.ts';
import { openTestDatabase, type TestDatabase } from '../support/test-database.ts';

/** The table a top-level SELECT reads from, as the query was built (an alias keeps the table's name with it). */
function fromTable(node: RootOperationNode): string | undefined {
  if (node.kind !== 'SelectQueryNode') return undefined;
  const from = node.from?.froms[0] as (OperationNode & { table?: { identifier: { name: string } }; node?: { table?: { identifier: { name: string } } }; alias?: unknown }) | undefined;
  if (!from) return undefined;
  if (from.table) return from.table.identifier.name;
  return from.node?.table ? `${from.node.table.identifier.name} (aliased)` : undefined;
}

/** Counts the SELECTs of each table while `counting` is on. */
class SelectCounter implements KyselyPlugin {
  counting = false;
  readonly counts = new Map<string, number>();
  transformQuery({ node }: PluginTransformQueryArgs): RootOperationNode {
    const table = this.counting ? fromTable(node) : undefined;
    if (table) this.counts.set(table, (this.counts.get(table) ?? 0) + 1);
    return node;
  }
  async transformResult({ result }: PluginTransformResultArgs): Promise<QueryResult<UnknownRow>> {
    return result;
  }
}

/**
 * A submission's view is made from one read of each thing it shows: the submission row the URL's
 * scope read for the access check is the one the handler shows, and its result, overrides and signal
 * choices are read once for the result and the release beside it alike (counted by hand: one each).
 */
describe('the rows a request needs are read once', () => {
  let database: TestDatabase;
  let app: FastifyInstance;
  let s: Seed;
  const counter = new SelectCounter();
  let submissionId: number;
  beforeAll(async () => {
    database = await openTestDatabase('pglite');
    app = await buildApp({ config: testConfig, store: { ...database.store, db: database.store.db.withPlugin(counter) } });
    s = await seedCourse(app);
    const [slipped] = submissionsFor(['S-001'], 7);
    slipped.runs[0].reported!.k!.value = -Number(slipped.runs[0].reported!.k!.value);
    const stored = await call(app, 'POST', `/v1/sections/${s.sectionA.id}/assignments/${s.assignment.id}/submissions`, s.taAToken, [slipped], 201);
    submissionId = stored.body.stored[0].submissionId;
    await call(app, 'POST', `/v1/submissions/${submissionId}/overrides`, s.taAToken, { findingId: 'sign-flipped@runs[0].reported.k', pointsLost: 0, reason: 'checked by hand' }, 201);
    await call(app, 'POST', `/v1/submissions/${submissionId}/release`, s.taAToken, undefined, 200);
  }, 60_000);
  afterAll(async () => {
    await app?.close();
    await database?.close();
  });

  it('GET /v1/submissions/:id reads the submission, its results, overrides and signal choices once each', async () => {
    counter.counts.clear();
    counter.counting = true;
    const res = await app.inject({ method: 'GET', url: `/v1/submissions/${submissionId}`, headers: bearer(s.taAToken) });
    counter.counting = false;
    expect(res.statusCode, res.body).toBe(200);
    // The view shows what it read: the override and the release are there.
    expect(res.json().overrides).toHaveLength(1);
    expect(res.json().release).toMatchObject({ version: 1, changedSinceRelease: false });
    const counts = Object.fromEntries(counter.counts);
    expect({ submissions: counts.submissions, results: counts.results, overrides: counts.overrides, signal_choices: counts.signal_choices }, JSON.stringify(counts)).toEqual({
      submissions: 1,
      results: 1,
      overrides: 1,
      signal_choices: 1,
    });
  });
});
